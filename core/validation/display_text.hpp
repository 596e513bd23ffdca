#pragma once
// Text from a file or an argument, made safe to show a person. A case, a data file or a file name
// comes from someone else and may carry terminal control sequences (ESC ] 0;…BEL retitles the
// window, ESC [ 2J clears the screen), Unicode direction overrides that reorder what is shown, or
// bytes that are not UTF-8. Every such character is written as a visible escape instead:
//   bytes that are not part of valid UTF-8, C0 controls and DEL  ->  \xNN   (e.g. \x1b)
//   C1 controls (U+0080..U+009F) and direction controls           ->  \u{NN} (e.g. \u{9b}, \u{202e})
// A backslash is left as it is, so the escaping is idempotent (escaping twice changes nothing) and
// any layer may apply it again without showing "\\x1b".

#include <cstddef>
#include <string>
#include <string_view>

namespace counterpoise::validation {

// `text` with every control character (line breaks and tabs included), every direction control
// and every byte that is not valid UTF-8 escaped visibly. For one-line fields: titles, ids, names.
std::string display_text(std::string_view text);

// As display_text, but line feeds and tabs are kept: for messages and free text laid out in lines.
std::string display_lines(std::string_view text);

// display_text of at most `max_code_points` of `text`, followed by "…" when it was cut: for a value
// quoted in a message, so that a damaged file of megabytes does not become a message of megabytes.
std::string display_excerpt(std::string_view text, std::size_t max_code_points = 40);

// The number of code points of already displayable text (what a fixed-width table pads by).
std::size_t display_width(std::string_view displayable);

// JSON text (as nlohmann::json::dump writes it) with DEL, C1 and direction controls inside strings
// written as \u00XX / \u202E escapes, which JSON allows: still valid JSON, and safe on a terminal.
// Bytes that are not valid UTF-8 are escaped as display_text does (a valid dump has none).
std::string display_json(std::string_view json_text);

}  // namespace counterpoise::validation
