#include "core/validation/display_text.hpp"

#include <cstdint>
#include <cstdio>
#include <optional>

namespace counterpoise::validation {

namespace {

struct Decoded {
  char32_t code_point;
  std::size_t length;
};

// The code point at `at`, or nullopt when the bytes there are not valid UTF-8 (RFC 3629 section 4:
// no overlong forms, no surrogates, nothing above U+10FFFF).
std::optional<Decoded> decode_at(std::string_view text, std::size_t at) {
  const auto byte = [&](std::size_t i) { return static_cast<unsigned char>(text[i]); };
  const unsigned char lead = byte(at);
  if (lead < 0x80) return Decoded{lead, 1};
  std::size_t length = 0;
  char32_t value = 0, minimum = 0;
  if (lead >= 0xC2 && lead <= 0xDF) length = 2, value = lead & 0x1F, minimum = 0x80;
  else if (lead >= 0xE0 && lead <= 0xEF) length = 3, value = lead & 0x0F, minimum = 0x800;
  else if (lead >= 0xF0 && lead <= 0xF4) length = 4, value = lead & 0x07, minimum = 0x10000;
  else return std::nullopt;
  if (at + length > text.size()) return std::nullopt;
  for (std::size_t i = 1; i < length; ++i) {
    if ((byte(at + i) & 0xC0) != 0x80) return std::nullopt;
    value = (value << 6) | (byte(at + i) & 0x3F);
  }
  if (value < minimum || value > 0x10FFFF || (value >= 0xD800 && value <= 0xDFFF)) return std::nullopt;
  return Decoded{value, length};
}

// Unicode's explicit direction controls (UAX #9, section 2): embeddings, overrides, isolates and
// the marks; they reorder how the text around them is shown.
bool is_direction_control(char32_t c) {
  return c == 0x061C || c == 0x200E || c == 0x200F || (c >= 0x202A && c <= 0x202E) ||
         (c >= 0x2066 && c <= 0x2069);
}

bool needs_escape(char32_t c, bool keep_lines) {
  if (keep_lines && (c == '\n' || c == '\t')) return false;
  return c < 0x20 || c == 0x7F || (c >= 0x80 && c <= 0x9F) || is_direction_control(c);
}

void append_byte_escape(std::string& out, unsigned char byte) {
  char buffer[8];
  std::snprintf(buffer, sizeof buffer, "\\x%02x", byte);
  out += buffer;
}

void append_code_point_escape(std::string& out, char32_t c) {
  char buffer[16];
  std::snprintf(buffer, sizeof buffer, "\\u{%x}", static_cast<unsigned>(c));
  out += buffer;
}

// The controls a caller keeps as they are: display_lines keeps line feeds and tabs, display_json
// line feeds only (a valid dump has no raw tab), display_text neither.
struct KeptControls {
  bool line_feed, tab;
};

// Whether `byte` is printable ASCII or a kept control: one byte, one code point, shown as it is.
bool is_plain_ascii(unsigned char byte, KeptControls kept) {
  return (byte >= 0x20 && byte < 0x7F) || (byte == '\n' && kept.line_feed) || (byte == '\t' && kept.tab);
}

// The end of the run of plain ASCII bytes from `at`, at most `limit` bytes long. Copying such a
// run in one append instead of decoding byte by byte is what keeps a document of megabytes
// (evaluate --json of a large case) from costing more to escape than to write.
std::size_t plain_run_end(std::string_view text, std::size_t at, KeptControls kept, std::size_t limit) {
  const std::size_t last = text.size() - at > limit ? at + limit : text.size();
  std::size_t end = at;
  while (end < last && is_plain_ascii(static_cast<unsigned char>(text[end]), kept)) ++end;
  return end;
}

// Escapes `text`; stops after `max_code_points` code points when given and reports whether it cut.
std::string escape(std::string_view text, bool keep_lines, std::size_t max_code_points, bool* cut) {
  std::string out;
  out.reserve(text.size());
  std::size_t at = 0, shown = 0;
  while (at < text.size()) {
    if (shown == max_code_points) {
      if (cut) *cut = true;
      break;
    }
    if (const std::size_t end = plain_run_end(text, at, {keep_lines, keep_lines}, max_code_points - shown); end > at) {
      out.append(text.substr(at, end - at));
      shown += end - at;
      at = end;
      continue;
    }
    ++shown;
    const auto decoded = decode_at(text, at);
    if (!decoded) {
      append_byte_escape(out, static_cast<unsigned char>(text[at]));
      ++at;
      continue;
    }
    const char32_t c = decoded->code_point;
    if (!needs_escape(c, keep_lines)) out.append(text.substr(at, decoded->length));
    else if (c < 0x80) append_byte_escape(out, static_cast<unsigned char>(c));
    else append_code_point_escape(out, c);
    at += decoded->length;
  }
  return out;
}

constexpr std::size_t kUnlimited = static_cast<std::size_t>(-1);

}  // namespace

std::string display_text(std::string_view text) { return escape(text, false, kUnlimited, nullptr); }

std::string display_lines(std::string_view text) { return escape(text, true, kUnlimited, nullptr); }

std::string display_excerpt(std::string_view text, std::size_t max_code_points) {
  bool cut = false;
  std::string out = escape(text, false, max_code_points, &cut);
  return cut ? out + "…" : out;
}

std::size_t display_width(std::string_view displayable) {
  std::size_t width = 0;
  for (unsigned char c : displayable) width += (c & 0xC0) != 0x80;
  return width;
}

std::string display_json(std::string_view json_text) {
  std::string out;
  out.reserve(json_text.size());
  std::size_t at = 0;
  while (at < json_text.size()) {
    if (const std::size_t end = plain_run_end(json_text, at, {true, false}, kUnlimited); end > at) {
      out.append(json_text.substr(at, end - at));
      at = end;
      continue;
    }
    const auto decoded = decode_at(json_text, at);
    if (!decoded) {
      append_byte_escape(out, static_cast<unsigned char>(json_text[at]));
      ++at;
      continue;
    }
    const char32_t c = decoded->code_point;
    // A valid dump holds raw line feeds only between values (indentation) and no other C0 control.
    if (c == '\n' || !needs_escape(c, false)) {
      out.append(json_text.substr(at, decoded->length));
    } else {
      char buffer[8];
      std::snprintf(buffer, sizeof buffer, "\\u%04x", static_cast<unsigned>(c));
      out += buffer;
    }
    at += decoded->length;
  }
  return out;
}

}  // namespace counterpoise::validation
