#pragma once
// Checking a case store against a sealed report (`verify STORE --against REPORT.pdf`): the
// report's seal anchor (report_anchor.hpp) names the revision, the audit chain head before the
// seal, the state digest and the sealer's public key and signature. A store that was rewritten
// as a whole (every hash recomputed), lost rows before the seal or lost the sealed revision no
// longer matches what the report printed, even though its own chain may verify.
// docs/case-store.md, "Checking a store against a report".

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/store/case_store.hpp"
#include "core/store/seal_statement.hpp"

namespace counterpoise::store {

struct AnchorCheck {
  std::vector<std::string> holds;      // each check that passed, in order, as a sentence
  std::optional<std::string> problem;  // the first that did not
  bool ok() const { return !problem.has_value(); }
};

// Checks, in order: the report's signature with the public key it prints; the store's verify
// (chain, replay, signed seals, tables); the sealed revision exists; its seal row follows the
// chain head the report printed; the statement rebuilt from the store equals the report's
// (case, revision, state digest, sealer, time, program, key) and the signatures are the same;
// the sealed state has the printed digest; `report_bytes` are the bytes sealed. Stops at the
// first failure. Throws validation::FileError only when the store cannot be read.
AnchorCheck check_against_report(const CaseStore& store, const SealAnchor& anchor, std::string_view report_bytes);

}  // namespace counterpoise::store
