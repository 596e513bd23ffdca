#pragma once
// What a signed seal signs, and what a report carries to anchor its store (docs/case-store.md,
// "Signed seals").
//
// The seal statement is the canonical JSON text (canonical_json.hpp) of
//   {"case": case reference, "chain_head": {"hash": …, "seq": …}, "program": "Counterpoise X.Y.Z",
//    "public_key": hex, "report_examiner": …, "revision": n, "sealed_at": …, "sealer": …,
//    "sealer_role": …, "state_sha256": …, "statement": "counterpoise-seal-1"}
// where chain_head is the audit row just before the seal row (its seq and hash): everything the
// report prints about its seal, so the report can carry the signature. The report's own bytes
// cannot be in it (the PDF holds the signature, and cannot hold a digest of itself), so a second
// signature, over the sealed-report statement
//   {"report_sha256": …, "seal_signature": hex, "statement": "counterpoise-sealed-report-1"},
// is made after the PDF is rendered and kept in the seal row with the report's digest.

#include <cstdint>
#include <optional>
#include <string>

#include <nlohmann/json.hpp>

#include "core/platform/ed25519.hpp"
#include "core/store/audit_log.hpp"
#include "core/store/case_state.hpp"

namespace counterpoise::store {

inline constexpr const char* kSealStatementKind = "counterpoise-seal-1";
inline constexpr const char* kSealedReportStatementKind = "counterpoise-sealed-report-1";
inline constexpr const char* kProgramName = "Counterpoise " COUNTERPOISE_VERSION;

struct SealStatement {
  std::string case_reference;  // the case section's "reference" ("" when the case has none)
  std::int64_t revision = 0;
  std::string state_sha256;
  std::int64_t chain_head_seq = 0;  // the audit row before the seal
  std::string chain_head_hash;
  std::string sealer, sealer_role, report_examiner;
  std::string sealed_at;  // the seal row's time
  std::string program;
  std::string public_key;  // hex of the 32 raw bytes; "" for an unsigned seal

  // The bytes signed (see above).
  std::string signed_bytes() const;
  nlohmann::json to_json() const;
  friend bool operator==(const SealStatement&, const SealStatement&) = default;
};

// The bytes of the second signature.
std::string sealed_report_bytes_to_sign(const std::string& seal_signature_hex, const std::string& report_sha256);

// What the report carries: the statement and its signature (hex; "" when unsigned).
struct SealAnchor {
  SealStatement statement;
  std::string signature;
  bool is_signed() const { return !signature.empty(); }

  // {"anchor": "counterpoise-report-anchor-1", "signature": …, "statement": {…}}
  nlohmann::json to_json() const;
  // Throws validation::InvalidValue naming the member that is missing or of the wrong type.
  static SealAnchor from_json(const nlohmann::json& value);
  friend bool operator==(const SealAnchor&, const SealAnchor&) = default;
};

// The case reference of a state: the case section's "reference" member, or "".
std::string case_reference(const CaseState& state);

// The members a signed seal row adds to the seal value (audit_log.hpp, action::seal).
inline constexpr const char* kSealProgramMember = "program";
inline constexpr const char* kSealPublicKeyMember = "public_key";
inline constexpr const char* kSealSignatureMember = "seal_signature";
inline constexpr const char* kSealReportSignatureMember = "report_signature";

// The statement a seal row makes, rebuilt from the row and the state it seals (replayed up to
// it): what its signature must verify against.
SealStatement statement_of_seal_row(const AuditRow& row, const nlohmann::json& seal_value, const CaseState& state);

// For a seal value with a signature: checks that both signatures verify with the public key it
// records, and returns that key. nullopt for an unsigned seal (no signature member, as every
// seal written before signing existed). Throws validation::InvalidValue saying what does not
// verify, or what is malformed.
std::optional<platform::Ed25519PublicKey> check_seal_signatures(const AuditRow& row, const nlohmann::json& seal_value,
                                                                 const CaseState& state);

}  // namespace counterpoise::store
