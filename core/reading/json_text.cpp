#include "core/reading/json_text.hpp"

#include <cmath>
#include <fstream>
#include <iterator>
#include <utility>
#include <vector>

#include "core/validation/display_text.hpp"
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

// Ends the parse at once with a reason.
struct Stop {
  std::string why;
  validation::Location where;  // the item and field, when the reason concerns one value
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

// Builds the document from nlohmann::json's parse events (its SAX interface), bounding the
// structure as it grows; throwing Stop ends the parse at once, so memory stays within the limits.
// The parser's own callback form does the same checks through one callback, but after each
// object it scans the whole enclosing container for discarded values, which made a case of
// 10 000 items cost the square of that to read.
class BoundedBuilder {
 public:
  using json = nlohmann::json;

  BoundedBuilder(const JsonLimits& limits, json& root) : limits_(limits), root_(root) {}

  bool null() { return put(nullptr); }
  bool boolean(bool value) { return put(value); }
  bool number_integer(json::number_integer_t value) { return put(value); }
  bool number_unsigned(json::number_unsigned_t value) { return put(value); }
  bool number_float(json::number_float_t value, const std::string& text) {
    // strtod reads 1e-400 as 0: refuse it rather than let a probability become an exclusion.
    if (value == 0.0 && writes_non_zero(text))
      throw Stop{"number " + validation::display_excerpt(text) +
                     " is smaller than the smallest number this program represents (about 4.9e-324) and "
                     "would be read as 0; write the value on the log10 scale where the field allows it",
                 value_location(nullptr)};
    return put(value);
  }
  bool string(std::string& value) {
    check_length(value, nullptr);
    return put(std::move(value));
  }
  bool binary(json::binary_t& value) { return put(std::move(value)); }
  bool start_object(std::size_t) { return open(json::value_t::object); }
  bool start_array(std::size_t) { return open(json::value_t::array); }
  bool end_object() { return close(); }
  bool end_array() { return close(); }

  bool key(std::string& name) {
    check_length(name, &name);
    // nlohmann::json keeps one member per name: a repeated name would silently replace the first.
    auto [member, added] = open_.back()->get_ref<json::object_t&>().emplace(std::move(name), nullptr);
    if (!added) throw Stop{"a member name appears twice in one object", {}};
    keys_.back() = &member->first;  // a map's keys stay where they are
    member_ = &member->second;
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
      throw Stop{"nested more than " + std::to_string(limits_.max_depth) + " levels deep (the limit for a case file)",
                 {}};
    count();
    json& made = slot();
    made = json(type);
    open_.push_back(&made);  // stays valid: nothing is added to a container while a child is open
    keys_.push_back(nullptr);
    return true;
  }

  bool close() {
    open_.pop_back();
    keys_.pop_back();
    return true;
  }

  void count() {
    if (++values_ > limits_.max_values)
      throw Stop{"more than " + std::to_string(limits_.max_values) + " values (the limit for a case file)", {}};
  }

  // A string or member name longer than the limit: refused before it is copied into the document.
  void check_length(const std::string& text, const std::string* pending_key) const {
    if (text.size() > limits_.max_string_bytes)
      throw Stop{"a text of " + std::to_string(text.size()) + " bytes, more than the limit of " +
                     std::to_string(limits_.max_string_bytes) + " bytes for one text",
                 value_location(pending_key)};
  }

  // The item and field of the value being read (or of the member `pending_key` about to be named),
  // for messages about one value. In a case file "items[2].p_given_hp" is item E3 (its id when read
  // already, else "#3", as the case reader names it), field p_given_hp; elsewhere the path from the
  // root is the field. Computed only when a value is refused.
  validation::Location value_location(const std::string* pending_key) const {
    // The step below open container `level`: a member name, or the index in an array (the
    // element already placed when a deeper container is open, else the one about to be placed).
    const auto index_below = [&](std::size_t level) {
      const std::size_t size = open_[level]->size();
      return level + 1 < open_.size() ? size - 1 : size;
    };
    validation::Location where;
    std::size_t first = 0;
    const bool in_items = open_.size() >= 2 && open_[0]->is_object() && keys_[0] && *keys_[0] == "items" &&
                          open_[1]->is_array();
    if (in_items) {
      const std::size_t index = index_below(1);
      const json* item = open_.size() >= 3 && open_[2]->is_object() ? open_[2] : nullptr;
      const auto id = item ? item->find("id") : json::const_iterator{};
      where.item = item && id != item->end() && id->is_string() ? id->get<std::string>()
                                                                 : "#" + std::to_string(index + 1);
      first = 2;
    }
    std::string field;
    for (std::size_t level = first; level < open_.size(); ++level) {
      if (open_[level]->is_array()) {
        field += "[" + std::to_string(index_below(level)) + "]";
        continue;
      }
      const std::string* name = level + 1 == open_.size() && pending_key ? pending_key : keys_[level];
      if (name) field += (field.empty() ? "" : ".") + *name;
    }
    where.field = field;
    return where;
  }

  const JsonLimits& limits_;
  json& root_;
  std::vector<json*> open_;               // the open arrays and objects, innermost last
  std::vector<const std::string*> keys_;  // for each open object, the member being read
  json* member_ = nullptr;                // the member named by the last key
  std::size_t values_ = 0;
};

// nlohmann's messages start with "[json.exception.parse_error.101] parse error at line 1,
// column 2: "; keep only the explanation after the position.
// nlohmann also quotes the token it last read ("; last read: '...'"), which can be a whole
// string of the file: only its first few characters are kept, escaped, so a message never carries
// a file's content.
std::string parser_reason(const std::string& message) {
  const auto colon = message.find(": ");
  std::string reason = colon == std::string::npos ? message : message.substr(colon + 2);
  static constexpr std::string_view kLastRead = "; last read: '";
  if (const auto quoted = reason.find(kLastRead); quoted != std::string::npos) {
    // The token ends at the quote before "; expected …" when the parser says what it expected,
    // else at the last quote.
    const std::size_t start = quoted + kLastRead.size();
    std::size_t end = reason.rfind("'; expected ");
    if (end == std::string::npos || end < start) end = reason.rfind('\'');
    if (end == std::string::npos || end < start) end = reason.size();
    const std::string after = end < reason.size() ? reason.substr(end + 1) : "";
    reason = reason.substr(0, quoted) + "; last read: '" +
             validation::display_excerpt(std::string_view(reason).substr(start, end - start), 20) + "'" + after;
  }
  return reason;
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
    throw InvalidValue(where, source + ": the JSON text is " + std::to_string(text.size()) +
                                  " bytes, more than the limit of " + std::to_string(limits.max_bytes));
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
    throw InvalidValue(stop.where, source + ": " + stop.why + " (at " +
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
