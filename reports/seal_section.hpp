#pragma once
// The appendix "Seal of this report" of a report issued from a case store: the signed seal
// statement (core/store/seal_statement.hpp) printed for a reader — case, revision, time, sealer,
// state digest, audit chain head, program, the sealer's public key with its fingerprint, and the
// signature — with what it shows and what it does not, and how to check a store against it.

#include "core/store/seal_statement.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

Section seal_section(const store::SealAnchor& anchor);

}  // namespace counterpoise::reports
