// libFuzzer harness for the seal anchor reader (core/store/report_anchor): the bytes of a report
// PDF are untrusted (`verify STORE --against REPORT.pdf`). Any input must give a clean refusal
// (validation::Error) or an anchor that, written back as an anchor element, reads back equal.
//
// The first byte chooses what the rest is: odd, the bytes of a whole file; even, the anchor's
// JSON text, which the harness wraps as a PDF carrying it as hex (so mutations reach the JSON
// reader and SealAnchor::from_json instead of breaking the hex).
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>
#include <string_view>

#include "core/platform/ed25519.hpp"
#include "core/store/report_anchor.hpp"
#include "core/validation/input_error.hpp"

namespace {

std::string pdf_carrying(const std::string& element_text) {
  return "%PDF-1.7\n1 0 obj\n<< /Type /Metadata /Subtype /XML >>\nstream\n<cpseal:anchor>" + element_text +
         "</cpseal:anchor>\nendstream\nendobj\n%%EOF\n";
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace counterpoise;
  if (size == 0) return 0;
  const std::string_view rest(reinterpret_cast<const char*>(data) + 1, size - 1);
  const std::string pdf = (data[0] & 1) ? std::string(rest) : pdf_carrying(platform::hex_text(rest));
  try {
    const store::SealAnchor anchor = store::read_report_anchor(pdf, "fuzz.pdf");
    // What was read is written and read again unchanged.
    if (!(store::read_report_anchor(pdf_carrying(store::anchor_element_text(anchor)), "again.pdf") == anchor))
      std::abort();
  } catch (const validation::Error&) {
    // A clean refusal.
  }
  return 0;
}
