// Reading the seal anchor back from a report PDF: the file is untrusted, so anything but one
// well-formed anchor is refused with a message, never a crash or an unbounded read.
#include "core/store/report_anchor.hpp"

#include <random>

#include <catch2/catch.hpp>

#include "core/platform/ed25519.hpp"
#include "core/store/canonical_json.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise;
using Catch::Matchers::Contains;

namespace {

store::SealAnchor sample_anchor() {
  store::SealAnchor anchor;
  auto& s = anchor.statement;
  s.case_reference = "HV-2026-0117";  // invented (Harwick Vale)
  s.revision = 2;
  s.state_sha256 = std::string(64, 'a');
  s.chain_head_seq = 5;
  s.chain_head_hash = std::string(64, 'b');
  s.sealer = s.report_examiner = "Dr Imogen Thwaite";
  s.sealer_role = "examiner";
  s.sealed_at = "2026-12-03T20:00:00.000Z";
  s.program = "Counterpoise 0.1.0";
  s.public_key = std::string(64, 'c');
  anchor.signature = std::string(128, 'd');
  return anchor;
}

std::string pdf_with(const std::string& element_text) {
  return "%PDF-1.4\n1 0 obj\n<< /Type /Metadata >>\nstream\n<cpseal:anchor>" + element_text +
         "</cpseal:anchor>\nendstream\nendobj\n%%EOF\n";
}

}  // namespace

TEST_CASE("the anchor written into a report's metadata reads back unchanged", "[store][anchor]") {
  const auto anchor = sample_anchor();
  CHECK(store::read_report_anchor(pdf_with(store::anchor_element_text(anchor)), "r.pdf") == anchor);
}

TEST_CASE("a file that is not a sealed report is refused with a clear message", "[store][anchor]") {
  using validation::InvalidValue;
  using validation::UnsupportedFormat;
  CHECK_THROWS_WITH(store::read_report_anchor("", "x.pdf"), Contains("not a PDF file"));
  CHECK_THROWS_AS(store::read_report_anchor("{\"format\": \"counterpoise.case\"}", "x.pdf"), UnsupportedFormat);
  CHECK_THROWS_WITH(store::read_report_anchor("%PDF-1.4\n%%EOF\n", "x.pdf"),
                    Contains("carries no seal anchor") && Contains("not a report sealed by this program"));
  const std::string good = store::anchor_element_text(sample_anchor());
  CHECK_THROWS_WITH(store::read_report_anchor(pdf_with(good) + pdf_with(good), "x.pdf"),
                    Contains("more than one seal anchor"));
  CHECK_THROWS_AS(store::read_report_anchor("%PDF-1.4 <cpseal:anchor>" + good, "x.pdf"), InvalidValue);
  CHECK_THROWS_WITH(store::read_report_anchor(pdf_with("zz" + good), "x.pdf"), Contains("not hex text"));
  CHECK_THROWS_WITH(store::read_report_anchor(pdf_with(good.substr(1)), "x.pdf"), Contains("damaged"));
  CHECK_THROWS_WITH(store::read_report_anchor(pdf_with(platform::hex_text("[1, 2")), "x.pdf"), Contains("damaged"));
  // An anchor longer than the bound is refused before it is decoded.
  CHECK_THROWS_WITH(store::read_report_anchor(pdf_with(std::string(store::kMaxAnchorHexDigits + 2, '0')), "x.pdf"),
                    Contains("not closed within"));
  // Each member missing or of the wrong type is named.
  const nlohmann::json whole = sample_anchor().to_json();
  for (const char* name : {"case", "chain_head", "program", "public_key", "revision", "sealed_at", "sealer",
                           "sealer_role", "state_sha256", "statement", "report_examiner"}) {
    INFO(name);
    nlohmann::json missing = whole;
    missing["statement"].erase(name);
    CHECK_THROWS_AS(store::read_report_anchor(pdf_with(platform::hex_text(missing.dump())), "x.pdf"), InvalidValue);
    nlohmann::json wrong = whole;
    wrong["statement"][name] = nlohmann::json::array();
    CHECK_THROWS_AS(store::read_report_anchor(pdf_with(platform::hex_text(wrong.dump())), "x.pdf"), InvalidValue);
  }
}

TEST_CASE("random and mutated bytes never crash the anchor reader", "[store][anchor]") {
  std::mt19937 random(20261203);  // fixed seed: a failure reproduces
  const std::string good = pdf_with(store::anchor_element_text(sample_anchor()));
  for (int round = 0; round < 2000; ++round) {
    std::string bytes = good;
    const int flips = 1 + static_cast<int>(random() % 8);
    for (int i = 0; i < flips; ++i) bytes[random() % bytes.size()] = static_cast<char>(random() & 0xff);
    if (round % 3 == 0) bytes.resize(random() % bytes.size());
    try {
      store::read_report_anchor(bytes, "fuzz.pdf");
    } catch (const validation::Error&) {
      // a clean refusal is the expected outcome for damaged bytes
    }
  }
  SUCCEED("no crash, no exception other than a validation error");
}
