#include "app/cli/display_stream.hpp"

#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

DisplayStream::DisplayStream(std::ostream& stream) : stream_(stream), target_(stream.rdbuf(this)) {}

DisplayStream::~DisplayStream() {
  sync();
  stream_.rdbuf(target_);
}

DisplayStream::int_type DisplayStream::overflow(int_type c) {
  if (traits_type::eq_int_type(c, traits_type::eof())) return traits_type::not_eof(c);
  pending_ += traits_type::to_char_type(c);
  if (c == '\n') write_complete_lines();
  return c;
}

std::streamsize DisplayStream::xsputn(const char* s, std::streamsize n) {
  pending_.append(s, static_cast<std::size_t>(n));
  write_complete_lines();
  return n;
}

int DisplayStream::sync() {
  // Whole lines are escaped together so a UTF-8 sequence is never split between two writes.
  const std::string shown = validation::display_lines(pending_);
  pending_.clear();
  target_->sputn(shown.data(), static_cast<std::streamsize>(shown.size()));
  return target_->pubsync();
}

void DisplayStream::write_complete_lines() {
  const auto end = pending_.rfind('\n');
  if (end == std::string::npos) return;
  const std::string shown = validation::display_lines(std::string_view(pending_).substr(0, end + 1));
  pending_.erase(0, end + 1);
  target_->sputn(shown.data(), static_cast<std::streamsize>(shown.size()));
}

}  // namespace counterpoise::cli
