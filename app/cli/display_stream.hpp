#pragma once
// The last line of defence for the terminal: while a DisplayStream is alive, everything written to
// its stream passes through validation::display_lines, so a text that reached a print path without
// being escaped (a new message, a file name) still cannot send control sequences to the terminal.
// The print paths escape their fields themselves (validation::display_text) — this only catches
// what they miss; escaping is idempotent, so text escaped twice reads the same.

#include <ostream>
#include <streambuf>
#include <string>

namespace counterpoise::cli {

class DisplayStream : private std::streambuf {
 public:
  // Routes `stream` through the filter until destruction, which flushes and restores it.
  explicit DisplayStream(std::ostream& stream);
  ~DisplayStream() override;
  DisplayStream(const DisplayStream&) = delete;
  DisplayStream& operator=(const DisplayStream&) = delete;

 private:
  int_type overflow(int_type c) override;
  std::streamsize xsputn(const char* s, std::streamsize n) override;
  int sync() override;
  void write_complete_lines();

  std::ostream& stream_;
  std::streambuf* target_;
  std::string pending_;  // text not yet written: held until a line ends or the stream is flushed
};

}  // namespace counterpoise::cli
