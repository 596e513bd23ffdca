#include "core/store/json_text.hpp"

#include <cmath>
#include <fstream>
#include <iterator>
#include <set>
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

// Counts and bounds the structure without building it. Returning false stops the parser.
class BoundsCheck final : public nlohmann::json_sax<nlohmann::json> {
 public:
  BoundsCheck(const JsonLimits& limits) : limits_(limits) {}

  std::string problem;  // empty when all went well or the parser reported the error

  bool null() override { return value(); }
  bool boolean(bool) override { return value(); }
  bool number_integer(number_integer_t) override { return value(); }
  bool number_unsigned(number_unsigned_t) override { return value(); }
  bool number_float(number_float_t x, const string_t&) override {
    if (!std::isfinite(x)) return stop("number is too large to represent (overflows to infinity)");
    return value();
  }
  bool string(string_t&) override { return value(); }
  bool binary(binary_t&) override { return stop("binary values are not JSON"); }
  bool start_object(std::size_t) override {
    keys_.emplace_back();
    return open();
  }
  bool key(string_t& name) override {
    if (!keys_.back().insert(name).second)
      return stop("member \"" + name + "\" appears twice in one object");
    return true;
  }
  bool end_object() override {
    keys_.pop_back();
    --depth_;
    return true;
  }
  bool start_array(std::size_t) override {
    keys_.emplace_back();
    return open();
  }
  bool end_array() override {
    keys_.pop_back();
    --depth_;
    return true;
  }
  bool parse_error(std::size_t position, const std::string&,
                   const nlohmann::detail::exception& e) override {
    error_position = position;
    // 406: a number the parser could not hold (overflow to infinity).
    parser_message =
        e.id == 406 ? "number is too large to represent (overflows to infinity)" : e.what();
    return false;
  }

  std::size_t error_position = 0;
  std::string parser_message;

 private:
  bool value() {
    if (++values_ > limits_.max_values)
      return stop("more than " + std::to_string(limits_.max_values) +
                  " values (the limit for a case file)");
    return true;
  }
  bool open() {
    if (++depth_ > limits_.max_depth)
      return stop("nested more than " + std::to_string(limits_.max_depth) +
                  " levels deep (the limit for a case file)");
    return value();
  }
  bool stop(std::string why) {
    problem = std::move(why);
    return false;
  }

  const JsonLimits& limits_;
  std::size_t depth_ = 0;
  std::size_t values_ = 0;
  std::vector<std::set<std::string>> keys_;
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
  BoundsCheck check(limits);
  // The parser reports a position only with its own errors; the counting iterator tells where
  // the reader was when the bounds check stopped it.
  std::size_t consumed = 0;
  const bool ok =
      nlohmann::json::sax_parse(CountingIterator{text.data(), &consumed},
                                CountingIterator{text.data() + text.size(), nullptr}, &check,
                                nlohmann::json::input_format_t::json, /*strict=*/true);
  if (!ok) {
    if (!check.parser_message.empty())
      throw InvalidValue(
          where, source + ": JSON syntax error at " +
                     position_text(text, check.error_position > 0 ? check.error_position - 1 : 0) +
                     ": " + parser_reason(check.parser_message));
    throw InvalidValue(where, source + ": " + check.problem + " (at " +
                                  position_text(text, consumed > 0 ? consumed - 1 : 0) + ")");
  }
  // The pre-pass accepted the text, so this parse is bounded and cannot fail.
  return nlohmann::json::parse(text.begin(), text.end());
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
