#include "core/store/report_anchor.hpp"

#include "core/platform/ed25519.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using validation::InvalidValue;
using validation::UnsupportedFormat;

namespace {

std::string open_tag() { return std::string("<") + kAnchorPrefix + ":" + kAnchorProperty + ">"; }
std::string close_tag() { return std::string("</") + kAnchorPrefix + ":" + kAnchorProperty + ">"; }

}  // namespace

std::string anchor_element_text(const SealAnchor& anchor) {
  return platform::hex_text(canonical_text(anchor.to_json()));
}

SealAnchor read_report_anchor(std::string_view pdf, const std::string& where) {
  if (pdf.substr(0, 5) != "%PDF-")
    throw UnsupportedFormat({}, where + ": not a PDF file (it does not start with %PDF-)");
  const std::string open = open_tag(), close = close_tag();
  const std::size_t at = pdf.find(open);
  if (at == std::string_view::npos)
    throw UnsupportedFormat({}, where + ": the PDF carries no seal anchor: it is not a report sealed by this "
                                        "program (a report printed from a working copy, re-saved by another "
                                        "program, or another document)");
  if (pdf.find(open, at + open.size()) != std::string_view::npos)
    throw InvalidValue({}, where + ": the PDF carries more than one seal anchor; a sealed report carries one");
  const std::size_t start = at + open.size();
  const std::size_t end = pdf.find(close, start);
  if (end == std::string_view::npos || end - start > kMaxAnchorHexDigits)
    throw InvalidValue({}, where + ": the seal anchor in the PDF is not closed within " +
                               std::to_string(kMaxAnchorHexDigits) + " characters (damaged)");
  std::string text;
  try {
    text = platform::bytes_of_hex(pdf.substr(start, end - start), "anchor");
  } catch (const validation::Error&) {
    throw InvalidValue({}, where + ": the seal anchor in the PDF is damaged (not hex text)");
  }
  try {
    return SealAnchor::from_json(reading::parse_json_text(text, "seal anchor"));
  } catch (const validation::Error& e) {
    throw InvalidValue({}, where + ": the seal anchor in the PDF is damaged: " + std::string(e.what()));
  }
}

}  // namespace counterpoise::store
