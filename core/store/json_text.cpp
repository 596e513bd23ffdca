#include "core/store/json_text.hpp"

#include <cmath>
#include <fstream>
#include <iterator>
#include <vector>

#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using validation::InvalidValue;

namespace {

// "line L, column C" of byte offset `offset` (1-based, columns count bytes).
std::string position_text(std::string_view text, std::size_t offset) {
  offset = std::min(offset, text.size());
  std::size_t line = 1, column = 1;
  for (std::size_t i = 0; i < offset; ++i) {
    if (text[i] == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
  }
  return "line " + std::to_string(line) + ", column " + std::to_string(column);
}

// Bounds the structure while nlohmann::json builds it (its parser callback sees every event with
// the nesting depth); throwing Stop ends the parse at once, so memory stays within the limits.
struct Stop {
  std::string why;
};

class BoundsCheck {
 public:
  explicit BoundsCheck(const JsonLimits& limits) : limits_(limits) {}

  bool operator()(int depth, nlohmann::json::parse_event_t event, nlohmann::json& parsed) {
    using Event = nlohmann::json::parse_event_t;
    switch (event) {
      case Event::object_start:
      case Event::array_start:
        if (static_cast<std::size_t>(depth) >= limits_.max_depth)
          throw Stop{"nested more than " + std::to_string(limits_.max_depth) +
                     " levels deep (the limit for a case file)"};
        if (event == Event::object_start) keys_.push_back(0);
        count();
        break;
      case Event::object_end:
        // nlohmann::json keeps one member per name: fewer members than names read means a repeat.
        if (parsed.size() != keys_.back()) throw Stop{"a member name appears twice in one object"};
        keys_.pop_back();
        break;
      case Event::key:
        ++keys_.back();
        break;
      case Event::value:
        // Containers report their end as a value too; count scalars only (containers counted at
        // start).
        if (!parsed.is_structured()) count();
        break;
      case Event::array_end:
        break;
    }
    return true;
  }

 private:
  void count() {
    if (++values_ > limits_.max_values)
      throw Stop{"more than " + std::to_string(limits_.max_values) +
                 " values (the limit for a case file)"};
  }

  const JsonLimits& limits_;
  std::size_t values_ = 0;
  std::vector<std::size_t> keys_;  // member names read in each open object
};

// nlohmann's messages start with "[json.exception.parse_error.101] parse error at line 1,
// column 2: "; keep only the explanation after the position.
std::string parser_reason(const std::string& message) {
  const auto colon = message.find(": ");
  return colon == std::string::npos ? message : message.substr(colon + 2);
}

// A character iterator that records how far the parser has read.
struct CountingIterator {
  using iterator_category = std::forward_iterator_tag;
  using value_type = char;
  using difference_type = std::ptrdiff_t;
  using pointer = const char*;
  using reference = const char&;

  const char* at;
  std::size_t* consumed;

  reference operator*() const { return *at; }
  CountingIterator& operator++() {
    ++at;
    if (consumed) ++*consumed;
    return *this;
  }
  CountingIterator operator++(int) {
    CountingIterator old = *this;
    ++*this;
    return old;
  }
  bool operator==(const CountingIterator& other) const { return at == other.at; }
  bool operator!=(const CountingIterator& other) const { return at != other.at; }
};

}  // namespace

nlohmann::json parse_json_text(std::string_view text, const std::string& source,
                               const JsonLimits& limits) {
  const validation::Location where{};
  if (text.size() > limits.max_bytes)
    throw InvalidValue(where, source + ": " + "file is " + std::to_string(text.size()) +
                                  " bytes, more than the limit of " +
                                  std::to_string(limits.max_bytes));
  // The counting iterator tells where the reader was when a limit stopped it.
  std::size_t consumed = 0;
  try {
    return nlohmann::json::parse(CountingIterator{text.data(), &consumed},
                                 CountingIterator{text.data() + text.size(), nullptr},
                                 BoundsCheck(limits),
                                 /*allow_exceptions=*/true, /*ignore_comments=*/false);
  } catch (const Stop& stop) {
    throw InvalidValue(where, source + ": " + stop.why + " (at " +
                                  position_text(text, consumed > 0 ? consumed - 1 : 0) + ")");
  } catch (const nlohmann::json::parse_error& e) {
    throw InvalidValue(where, source + ": JSON syntax error at " +
                                  position_text(text, e.byte > 0 ? e.byte - 1 : 0) + ": " +
                                  parser_reason(e.what()));
  } catch (const nlohmann::json::out_of_range& e) {
    // 406: a number the parser cannot hold (it would overflow to infinity).
    throw InvalidValue(where, source +
                                  ": number is too large to represent (overflows to infinity, at " +
                                  position_text(text, consumed > 0 ? consumed - 1 : 0) + ")");
  }
}

nlohmann::json read_json_file(const std::filesystem::path& path, const JsonLimits& limits) {
  const validation::Location where{};
  std::error_code ec;
  const auto size = std::filesystem::file_size(path, ec);
  if (ec) throw validation::FileError(where, path.string() + ": cannot read: " + ec.message());
  if (size > limits.max_bytes)
    throw validation::FileError(where, path.string() + ": file is " + std::to_string(size) +
                                           " bytes, more than the limit of " +
                                           std::to_string(limits.max_bytes));
  std::ifstream in(path, std::ios::binary);
  if (!in) throw validation::FileError(where, path.string() + ": cannot open");
  std::string text(static_cast<std::size_t>(size), '\0');
  in.read(text.data(), static_cast<std::streamsize>(size));
  if (static_cast<std::size_t>(in.gcount()) != size || in.bad())
    throw validation::FileError(where, path.string() + ": read error");
  return parse_json_text(text, path.string(), limits);
}

}  // namespace counterpoise::store
