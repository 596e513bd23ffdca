#include "core/store/seal_statement.hpp"

#include "core/store/canonical_json.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using nlohmann::json;
using validation::InvalidValue;

namespace {

constexpr const char* kAnchorKind = "counterpoise-report-anchor-1";

const json& member(const json& object, const char* name, const char* where) {
  if (!object.is_object()) throw InvalidValue({where, {}}, "is not a JSON object");
  const auto it = object.find(name);
  if (it == object.end()) throw InvalidValue({where, name}, "is missing");
  return *it;
}

std::string string_member(const json& object, const char* name, const char* where) {
  const json& value = member(object, name, where);
  if (!value.is_string()) throw InvalidValue({where, name}, "must be a string");
  return value.get<std::string>();
}

std::int64_t count_member(const json& object, const char* name, const char* where) {
  const json& value = member(object, name, where);
  if (!value.is_number_unsigned()) throw InvalidValue({where, name}, "must be a whole number");
  return value.get<std::int64_t>();
}

}  // namespace

json SealStatement::to_json() const {
  return json{{"case", case_reference},
              {"chain_head", {{"hash", chain_head_hash}, {"seq", chain_head_seq}}},
              {"program", program},
              {"public_key", public_key},
              {"report_examiner", report_examiner},
              {"revision", revision},
              {"sealed_at", sealed_at},
              {"sealer", sealer},
              {"sealer_role", sealer_role},
              {"state_sha256", state_sha256},
              {"statement", kSealStatementKind}};
}

std::string SealStatement::signed_bytes() const { return canonical_text(to_json()); }

std::string sealed_report_bytes_to_sign(const std::string& seal_signature_hex, const std::string& report_sha256) {
  return canonical_text(json{{"report_sha256", report_sha256},
                             {"seal_signature", seal_signature_hex},
                             {"statement", kSealedReportStatementKind}});
}

json SealAnchor::to_json() const {
  return json{{"anchor", kAnchorKind}, {"signature", signature}, {"statement", statement.to_json()}};
}

SealAnchor SealAnchor::from_json(const json& value) {
  if (string_member(value, "anchor", "anchor") != kAnchorKind)
    throw InvalidValue({"anchor", "anchor"}, "is not a seal anchor of this program's kind");
  const json& s = member(value, "statement", "anchor");
  if (string_member(s, "statement", "statement") != kSealStatementKind)
    throw InvalidValue({"statement", "statement"}, "is not a seal statement of this program's kind");
  SealAnchor anchor;
  anchor.signature = string_member(value, "signature", "anchor");
  SealStatement& t = anchor.statement;
  t.case_reference = string_member(s, "case", "statement");
  const json& head = member(s, "chain_head", "statement");
  t.chain_head_hash = string_member(head, "hash", "chain_head");
  t.chain_head_seq = count_member(head, "seq", "chain_head");
  t.program = string_member(s, "program", "statement");
  t.public_key = string_member(s, "public_key", "statement");
  t.report_examiner = string_member(s, "report_examiner", "statement");
  t.revision = count_member(s, "revision", "statement");
  t.sealed_at = string_member(s, "sealed_at", "statement");
  t.sealer = string_member(s, "sealer", "statement");
  t.sealer_role = string_member(s, "sealer_role", "statement");
  t.state_sha256 = string_member(s, "state_sha256", "statement");
  return anchor;
}

std::string case_reference(const CaseState& state) {
  const auto section = state.sections().find("case");
  if (section == state.sections().end() || !section->second.is_object()) return "";
  const auto reference = section->second.find("reference");
  return reference != section->second.end() && reference->is_string() ? reference->get<std::string>() : "";
}

SealStatement statement_of_seal_row(const AuditRow& row, const json& seal_value, const CaseState& state) {
  SealStatement s;
  s.case_reference = case_reference(state);
  s.revision = row.revision;
  s.state_sha256 = seal_value.value("state_sha256", "");
  s.chain_head_seq = row.seq - 1;
  s.chain_head_hash = row.prev_hash;
  s.sealer = row.examiner;
  s.sealer_role = seal_value.value("sealer_role", "");
  s.report_examiner = seal_value.value("report_examiner", "");
  s.sealed_at = row.at;
  s.program = seal_value.value(kSealProgramMember, "");
  s.public_key = seal_value.value(kSealPublicKeyMember, "");
  return s;
}

std::optional<platform::Ed25519PublicKey> check_seal_signatures(const AuditRow& row, const json& seal_value,
                                                                 const CaseState& state) {
  const bool has_signature = seal_value.contains(kSealSignatureMember);
  if (!has_signature) {
    if (seal_value.contains(kSealPublicKeyMember) || seal_value.contains(kSealReportSignatureMember))
      throw InvalidValue({}, "the seal records a public key or report signature but no seal signature");
    return std::nullopt;
  }
  const char* where = "seal";
  const std::string signature_hex = string_member(seal_value, kSealSignatureMember, where);
  const std::string report_signature_hex = string_member(seal_value, kSealReportSignatureMember, where);
  string_member(seal_value, kSealProgramMember, where);
  const auto key =
      platform::Ed25519PublicKey::from_hex(string_member(seal_value, kSealPublicKeyMember, where), "seal public_key");
  const std::string signature = platform::bytes_of_hex(signature_hex, "seal signature");
  if (!key.verifies(statement_of_seal_row(row, seal_value, state).signed_bytes(), signature))
    throw InvalidValue({}, "the seal's signature does not verify with the public key it records (fingerprint " +
                               key.fingerprint() + "): the seal or what it seals was changed, or it was not "
                               "signed by that key");
  const std::string report_sha256 = string_member(seal_value, "report_sha256", where);
  if (!key.verifies(sealed_report_bytes_to_sign(signature_hex, report_sha256),
                    platform::bytes_of_hex(report_signature_hex, "seal report_signature")))
    throw InvalidValue({}, "the signature over the sealed report's digest does not verify with the public key the "
                           "seal records (fingerprint " + key.fingerprint() + ")");
  return key;
}

}  // namespace counterpoise::store
