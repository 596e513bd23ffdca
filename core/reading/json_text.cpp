#include "core/reading/json_text.hpp"

#include <cmath>
#include <fstream>
#include <iterator>
#include <utility>
#include <vector>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

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

// Builds the document from nlohmann::json's parse events (its SAX interface), bounding the
// structure as it grows; throwing Stop ends the parse at once, so memory stays within the limits.
// The parser's own callback form does the same checks through one callback, but after each
// object it scans the whole enclosing container for discarded values, which made a case of
// 10 000 items cost the square of that to read.
struct Stop {
  std::string why;
};

class BoundedBuilder {
 public:
  using json = nlohmann::json;

  BoundedBuilder(const JsonLimits& limits, json& root) : limits_(limits), root_(root) {}

  bool null() { return put(nullptr); }
  bool boolean(bool value) { return put(value); }
  bool number_integer(json::number_integer_t value) { return put(value); }
  bool number_unsigned(json::number_unsigned_t value) { return put(value); }
  bool number_float(json::number_float_t value, const std::string&) { return put(value); }
  bool string(std::string& value) { return put(std::move(value)); }
  bool binary(json::binary_t& value) { return put(std::move(value)); }
  bool start_object(std::size_t) { return open(json::value_t::object); }
  bool start_array(std::size_t) { return open(json::value_t::array); }
  bool end_object() { return close(); }
  bool end_array() { return close(); }

  bool key(std::string& name) {
    json& object = *open_.back();
    // nlohmann::json keeps one member per name: a repeated name would silently replace the first.
    if (object.contains(name)) throw Stop{"a member name appears twice in one object"};
    member_ = &object[std::move(name)];
    return true;
  }

  // A syntax error, invalid UTF-8 or a number that overflows: the parser's own exception.
  template <class Exception>
  bool parse_error(std::size_t, const std::string&, const Exception& error) {
    throw error;
  }

 private:
  // Where the next value goes: the root, the end of the open array, or the member just named.
  json& slot() {
    if (open_.empty()) return root_;
    json& parent = *open_.back();
    if (parent.is_array()) {
      parent.push_back(nullptr);
      return parent.back();
    }
    return *member_;
  }

  template <class Value>
  bool put(Value&& value) {
    count();
    slot() = json(std::forward<Value>(value));
    return true;
  }

  bool open(json::value_t type) {
    if (open_.size() >= limits_.max_depth)
      throw Stop{"nested more than " + std::to_string(limits_.max_depth) + " levels deep (the limit for a case file)"};
    count();
    json& made = slot();
    made = json(type);
    open_.push_back(&made);  // stays valid: nothing is added to a container while a child is open
    return true;
  }

  bool close() {
    open_.pop_back();
    return true;
  }

  void count() {
    if (++values_ > limits_.max_values)
      throw Stop{"more than " + std::to_string(limits_.max_values) + " values (the limit for a case file)"};
  }

  const JsonLimits& limits_;
  json& root_;
  std::vector<json*> open_;  // the open arrays and objects, innermost last
  json* member_ = nullptr;   // the member named by the last key
  std::size_t values_ = 0;
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
    nlohmann::json document;
    BoundedBuilder builder(limits, document);
    nlohmann::json::sax_parse(CountingIterator{text.data(), &consumed}, CountingIterator{text.data() + text.size(), nullptr},
                              &builder, nlohmann::json::input_format_t::json, /*strict=*/true,
                              /*ignore_comments=*/false);
    return document;
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

}  // namespace counterpoise::reading
