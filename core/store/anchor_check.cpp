#include "core/store/anchor_check.hpp"

#include "core/platform/sha256.hpp"
#include "core/reading/json_text.hpp"

namespace counterpoise::store {

using nlohmann::json;

namespace {

std::string short_hash(const std::string& hash) { return hash.substr(0, 16) + "…"; }

// The first member of the statement that differs, as "member: report X, store Y".
std::string first_difference(const SealStatement& report, const SealStatement& store) {
  const json a = report.to_json(), b = store.to_json();
  for (const auto& [name, value] : a.items())
    if (b.value(name, json()) != value)
      return name + " (the report: " + value.dump() + "; the store: " + b.value(name, json()).dump() + ")";
  return "";
}

}  // namespace

AnchorCheck check_against_report(const CaseStore& store, const SealAnchor& anchor, std::string_view report_bytes) {
  AnchorCheck check;
  const SealStatement& printed = anchor.statement;
  const std::string revision = "revision " + std::to_string(printed.revision);
  const auto fail = [&](std::string why) {
    check.problem = std::move(why);
    return check;
  };

  if (anchor.is_signed()) {
    bool good = false;
    std::string fingerprint;
    try {
      const auto key = platform::Ed25519PublicKey::from_hex(printed.public_key, "public key");
      fingerprint = key.fingerprint();
      good = key.verifies(printed.signed_bytes(), platform::bytes_of_hex(anchor.signature, "signature"));
    } catch (const validation::Error&) {
      good = false;
    }
    if (!good)
      return fail("the report's seal signature does not verify with the public key the report prints: the "
                  "report's seal was altered, or was never signed by that key");
    check.holds.push_back("the report's seal signature verifies with the public key it prints (fingerprint " +
                          platform::grouped_hex(fingerprint) + ")");
  }

  const VerifyReport verified = store.verify();
  if (!verified.ok())
    return fail("the store fails verification at audit row " + std::to_string(verified.problem->seq) + ": " +
                verified.problem->reason);
  check.holds.push_back("the store verifies on its own (" + std::to_string(verified.rows_checked) +
                        " audit rows: hash chain, replay, signed seals, tables)");

  std::optional<RevisionInfo> sealed;
  for (RevisionInfo& info : store.revisions())
    if (info.revision == printed.revision && info.sealed()) sealed = std::move(info);
  if (!sealed)
    return fail("the store holds no sealed " + revision +
                ": the sealed revision the report was issued from is not there (removed, or this is not the "
                "report's case)");

  std::optional<AuditRow> seal_row;
  for (AuditRow& row : store.audit_rows())
    if (row.seq == *sealed->sealed_seq) seal_row = std::move(row);
  if (!seal_row) return fail("the seal row of " + revision + " is missing");
  if (seal_row->seq != printed.chain_head_seq + 1 || seal_row->prev_hash != printed.chain_head_hash)
    return fail("the audit chain before the seal of " + revision + " differs from the one the report printed (the "
                "report: row " + std::to_string(printed.chain_head_seq) + ", hash " +
                short_hash(printed.chain_head_hash) + "; the store: row " + std::to_string(seal_row->seq - 1) +
                ", hash " + short_hash(seal_row->prev_hash) +
                "): the store's history before the seal was rewritten or rows were removed");
  check.holds.push_back("the seal of " + revision + " follows audit row " + std::to_string(printed.chain_head_seq) +
                        " with the chain head the report printed");

  const std::string state = store.sealed_state_text(printed.revision);
  // Verify has read this row (with the bounds of any stored value) and accepted it.
  const json value = reading::parse_json_text(seal_row->new_value.value_or("{}"), "seal value");
  const SealStatement recorded = statement_of_seal_row(
      *seal_row, value, CaseState::from_document(reading::parse_json_text(state, "sealed state")));
  if (recorded != printed)
    return fail("the store's seal of " + revision + " states something else than the report: " +
                first_difference(printed, recorded));
  if (value.value(kSealSignatureMember, "") != anchor.signature)
    return fail("the store's seal of " + revision + " carries another signature than the report");
  check.holds.push_back("the store's seal states what the report prints (case, revision, sealer, time, program, "
                        "key" + std::string(anchor.is_signed() ? ", signature" : "") + ")");

  if (platform::sha256_hex(state) != printed.state_sha256)
    return fail("the sealed state of " + revision + " does not have the digest the report printed");
  check.holds.push_back("the sealed case state has the digest the report printed (" +
                        short_hash(printed.state_sha256) + ")");

  if (platform::sha256_hex(report_bytes) != sealed->report_sha256)
    return fail("the report file is not the report sealed with " + revision + " (its SHA-256 is " +
                short_hash(platform::sha256_hex(report_bytes)) + ", the sealed report's " +
                short_hash(sealed->report_sha256) + "): it was changed after it was issued, or another copy was "
                "sealed");
  check.holds.push_back("the report file is byte for byte the report sealed with " + revision);
  return check;
}

}  // namespace counterpoise::store
