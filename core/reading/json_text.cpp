#include "core/reading/json_text.hpp"

#include <fstream>
#include <iterator>
#include <variant>
#include <vector>

#include "core/validation/display_text.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

using nlohmann::json;
using validation::InvalidValue;
using validation::Location;

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

// Ends the parse at once with a reason; `where` names the item and field when the reason concerns
// one value.
struct Stop {
  std::string why;
  Location where;
};

// A reason the parser itself gave (syntax, UTF-8, overflow), at a byte position.
struct ParserFailure {
  std::size_t byte;
  int id;
  std::string what;
};

// True when the text of a number has a non-zero digit before its exponent: the value it writes is
// not zero, whatever the double it was read into.
bool writes_non_zero(std::string_view number) {
  for (char c : number) {
    if (c == 'e' || c == 'E') break;
    if (c >= '1' && c <= '9') return true;
  }
  return false;
}

// Builds the document from nlohmann::json's SAX events, checking every bound as it goes. Each
// event costs constant time plus its own size (a member name is looked up once in its object),
// so reading is linear in the text: the DOM parser's callback form scans the enclosing container
// at every object end, which is quadratic in the number of objects.
class BoundedBuilder {
 public:
  explicit BoundedBuilder(const JsonLimits& limits) : limits_(limits) {}

  json take() { return std::move(root_); }

  bool null() { return add(json(nullptr)); }
  bool boolean(bool value) { return add(json(value)); }
  bool number_integer(json::number_integer_t value) { return add(json(value)); }
  bool number_unsigned(json::number_unsigned_t value) { return add(json(value)); }
  bool number_float(json::number_float_t value, const std::string& text) {
    // strtod reads 1e-400 as 0: refuse it rather than let a probability become an exclusion.
    if (value == 0.0 && writes_non_zero(text))
      throw Stop{"number " + validation::display_excerpt(text) +
                     " is smaller than the smallest number this program represents (about 4.9e-324) and "
                     "would be read as 0; write the value on the log10 scale where the field allows it",
                 value_location()};
    return add(json(value));
  }
  bool string(std::string& value) {
    check_length(value);
    return add(json(std::move(value)));
  }
  // JSON text has no binary values (only the binary formats nlohmann also reads do).
  bool binary(json::binary_t&) { throw Stop{"a binary value, which JSON text cannot hold", {}}; }

  bool start_object(std::size_t) {
    open(json::object());
    return true;
  }
  bool key(std::string& name) {
    check_length(name);
    if (open_.back()->contains(name)) throw Stop{"a member name appears twice in one object", {}};
    path_.back() = std::move(name);
    return true;
  }
  bool end_object() { return close(); }
  bool start_array(std::size_t) {
    open(json::array());
    return true;
  }
  bool end_array() { return close(); }

  bool parse_error(std::size_t byte, const std::string&, const json::exception& error) {
    throw ParserFailure{byte, error.id, error.what()};
  }

 private:
  void count() {
    if (++values_ > limits_.max_values)
      throw Stop{"more than " + std::to_string(limits_.max_values) + " values (the limit for a case file)", {}};
  }

  void check_length(const std::string& text) const {
    if (text.size() > limits_.max_string_bytes)
      throw Stop{"a text of " + std::to_string(text.size()) + " bytes, more than the limit of " +
                     std::to_string(limits_.max_string_bytes) + " for one text",
                 value_location()};
  }

  // Places `value` in the open container (or as the root) and returns where it now lives.
  json* place(json&& value) {
    if (open_.empty()) {
      root_ = std::move(value);
      return &root_;
    }
    json& container = *open_.back();
    if (container.is_array()) {
      container.push_back(std::move(value));
      ++std::get<std::size_t>(path_.back());
      return &container.back();
    }
    return &(container[std::get<std::string>(path_.back())] = std::move(value));
  }

  bool add(json&& value) {
    count();
    place(std::move(value));
    return true;
  }

  void open(json&& container) {
    if (open_.size() >= limits_.max_depth)
      throw Stop{"nested more than " + std::to_string(limits_.max_depth) + " levels deep (the limit for a case file)",
                 {}};
    count();
    const bool is_array = container.is_array();
    // An array element is pushed, so a pointer to an open container stays valid: nothing is
    // added to its parent while it is open.
    open_.push_back(place(std::move(container)));
    if (is_array) path_.emplace_back(std::size_t{0});
    else path_.emplace_back(std::string());
  }

  bool close() {
    open_.pop_back();
    path_.pop_back();
    return true;
  }

  // The item and field of the value being read, for messages about one value: in a case file
  // "items[2].p_given_hp" is item E3 (its id when read already, else "#3"), field p_given_hp;
  // elsewhere the path from the root.
  Location value_location() const {
    std::string field;
    std::size_t first = 0;
    Location where;
    if (path_.size() >= 2 && std::holds_alternative<std::string>(path_[0]) &&
        std::get<std::string>(path_[0]) == "items" && std::holds_alternative<std::size_t>(path_[1]) &&
        open_.size() >= 2 && open_[1]->is_array()) {
      // path_[1] counts the elements placed so far: an open item is the last one placed, a value
      // about to be placed in the array is the next.
      const std::size_t number = std::get<std::size_t>(path_[1]) + (path_.size() == 2 ? 1 : 0);
      const json* item = open_.size() >= 3 ? open_[2] : nullptr;
      const auto id = item && item->is_object() ? item->find("id") : json::const_iterator{};
      where.item = item && item->is_object() && id != item->end() && id->is_string() ? id->get<std::string>()
                                                                                       : "#" + std::to_string(number);
      first = 2;
    }
    for (std::size_t i = first; i < path_.size(); ++i) {
      if (const auto* name = std::get_if<std::string>(&path_[i]))
        field += (field.empty() ? "" : ".") + *name;
      else
        field += "[" + std::to_string(std::get<std::size_t>(path_[i]) - (i + 1 == path_.size() ? 0 : 1)) + "]";
    }
    where.field = field;
    return where;
  }

  const JsonLimits& limits_;
  json root_;
  std::vector<json*> open_;  // the containers being built, outermost first
  // For each open container: the member name being read, or the number of elements placed.
  std::vector<std::variant<std::string, std::size_t>> path_;
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

json parse_json_text(std::string_view text, const std::string& source, const JsonLimits& limits) {
  const Location where{};
  if (text.size() > limits.max_bytes)
    throw InvalidValue(where, source + ": " + "file is " + std::to_string(text.size()) +
                                  " bytes, more than the limit of " + std::to_string(limits.max_bytes));
  // The counting iterator tells where the reader was when a limit stopped it.
  std::size_t consumed = 0;
  BoundedBuilder builder(limits);
  try {
    json::sax_parse(CountingIterator{text.data(), &consumed}, CountingIterator{text.data() + text.size(), nullptr},
                    &builder, json::input_format_t::json, /*strict=*/true, /*ignore_comments=*/false);
    return builder.take();
  } catch (const Stop& stop) {
    throw InvalidValue(stop.where, source + ": " + stop.why + " (at " +
                                       position_text(text, consumed > 0 ? consumed - 1 : 0) + ")");
  } catch (const ParserFailure& failure) {
    const std::string at = position_text(text, failure.byte > 0 ? failure.byte - 1 : 0);
    // 406: a number the parser cannot hold (it would overflow to infinity).
    if (failure.id == 406)
      throw InvalidValue(where, source + ": number is too large to represent (overflows to infinity, at " + at + ")");
    throw InvalidValue(where, source + ": JSON syntax error at " + at + ": " + parser_reason(failure.what));
  }
}

json read_json_file(const std::filesystem::path& path, const JsonLimits& limits) {
  const Location where{};
  std::error_code ec;
  const auto size = std::filesystem::file_size(path, ec);
  if (ec) throw validation::FileError(where, path.string() + ": cannot read: " + ec.message());
  if (size > limits.max_bytes)
    throw validation::FileError(where, path.string() + ": file is " + std::to_string(size) +
                                           " bytes, more than the limit of " + std::to_string(limits.max_bytes));
  std::ifstream in(path, std::ios::binary);
  if (!in) throw validation::FileError(where, path.string() + ": cannot open");
  std::string text(static_cast<std::size_t>(size), '\0');
  in.read(text.data(), static_cast<std::streamsize>(size));
  if (static_cast<std::size_t>(in.gcount()) != size || in.bad())
    throw validation::FileError(where, path.string() + ": read error");
  return parse_json_text(text, path.string(), limits);
}

}  // namespace counterpoise::reading
