#include "reports/seal_section.hpp"

#include "core/platform/ed25519.hpp"

namespace counterpoise::reports {

namespace {

Paragraph generated(std::string text, Paragraph::Style style = Paragraph::Style::body) {
  return Paragraph{std::move(text), style, {}, TextSource{}, {}};
}

// Hex in groups of eight, so long values break between groups and are read a group at a time.
std::string readable_hex(const std::string& hex) { return platform::grouped_hex(hex, 8); }

}  // namespace

Section seal_section(const store::SealAnchor& anchor) {
  const store::SealStatement& s = anchor.statement;
  Section section{"seal", "Seal of this report", true, {}};
  section.blocks.push_back(generated(
      "Issuing this report sealed revision " + std::to_string(s.revision) +
      " of the case store: the store keeps that state of the case, this report's file and an audit trail in "
      "which every change is chained to the one before it by SHA-256. The values below fix the trail as it stood "
      "when the report was sealed. They are also carried in this file's metadata, so a store can be checked "
      "against this report with: counterpoise-cli verify STORE --against REPORT.pdf"));
  Table table;
  table.header = {"Sealed", "Value"};
  table.widths = {1.0, 2.6};
  table.no_wrap = {false, false};
  table.rows.push_back({"Case reference", s.case_reference.empty() ? "not recorded" : s.case_reference});
  table.rows.push_back({"Revision", std::to_string(s.revision)});
  table.rows.push_back({"Sealed at (UTC)", s.sealed_at});
  table.rows.push_back({"Sealed by", s.sealer + " (" + s.sealer_role + ")"});
  table.rows.push_back({"Report's examiner", s.report_examiner});
  table.rows.push_back({"Case state (SHA-256)", readable_hex(s.state_sha256)});
  table.rows.push_back({"Audit chain head", "row " + std::to_string(s.chain_head_seq) + ", hash " +
                                                readable_hex(s.chain_head_hash)});
  table.rows.push_back({"Program", s.program});
  if (anchor.is_signed()) {
    std::string fingerprint = "(not a valid key)";
    try {
      fingerprint = platform::grouped_hex(platform::Ed25519PublicKey::from_hex(s.public_key, "key").fingerprint());
    } catch (const validation::Error&) {
    }
    table.rows.push_back({"Sealer's key fingerprint (SHA-256 of the public key)", fingerprint});
    table.rows.push_back({"Sealer's public key (Ed25519)", readable_hex(s.public_key)});
    table.rows.push_back({"Signature (Ed25519)", readable_hex(anchor.signature)});
  } else {
    table.rows.push_back({"Signature", "none: unsigned seal"});
  }
  section.blocks.push_back(std::move(table));
  if (anchor.is_signed()) {
    section.blocks.push_back(generated(
        "The signature was made with the private key of the public key printed above, over these values (as "
        "canonical JSON, docs/case-store.md). It shows that whoever held that key sealed them; it does not by "
        "itself show who holds the key: compare the fingerprint with the one the laboratory lists for the sealer. "
        "A file cannot print its own digest, so the store keeps this file's SHA-256 with the seal, under a second "
        "signature by the same key.",
        Paragraph::Style::note));
  } else {
    section.blocks.push_back(generated(
        "This seal is unsigned: it was made without an examiner's key. The chain head and case state digest still "
        "let a store be checked against this report, but nothing beyond the name recorded in the store shows who "
        "sealed it.",
        Paragraph::Style::note));
  }
  section.blocks.push_back(generated(
      "Changes made to the store after this seal are not covered by it; a later sealed report covers them.",
      Paragraph::Style::note));
  return section;
}

}  // namespace counterpoise::reports
