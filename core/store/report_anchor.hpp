#pragma once
// The seal anchor a report PDF carries in its XMP metadata, so `verify STORE --against
// REPORT.pdf` reads it back without reading the page text (docs/file-formats.md, "The seal
// anchor in a report"): the element <cpseal:anchor> of the namespace kAnchorNamespace holds
// the lower-case hex of the canonical JSON text of SealAnchor::to_json(). Hex, because it needs
// no XML escaping and survives any XMP writer unchanged.
//
// Reading treats the PDF as untrusted: only its bytes are searched (no PDF parser runs), the
// anchor must occur exactly once, and its text is bounded and read by the bounded JSON reader.

#include <string>
#include <string_view>

#include "core/store/seal_statement.hpp"

namespace counterpoise::store {

inline constexpr const char* kAnchorNamespace = "http://counterpoise.invalid/ns/seal/1/";
inline constexpr const char* kAnchorPrefix = "cpseal";
inline constexpr const char* kAnchorProperty = "anchor";
// The largest anchor text read (hex digits); a real one is under 3 000.
inline constexpr std::size_t kMaxAnchorHexDigits = 64 * 1024;

// The text of the <cpseal:anchor> element for `anchor`.
std::string anchor_element_text(const SealAnchor& anchor);

// The anchor in `pdf` (the bytes of a file named `where`). Throws validation::UnsupportedFormat
// when the bytes are not a PDF, or a PDF without an anchor ("not a report sealed by this
// program"), and validation::InvalidValue when the anchor is there but damaged, repeated or too
// long. Never reads beyond `pdf`.
SealAnchor read_report_anchor(std::string_view pdf, const std::string& where);

}  // namespace counterpoise::store
