#pragma once
// The inputs of one item as its model used them, and the formula with its intermediate values, so
// that a second scientist can recompute the item's likelihood ratio with a calculator
// (docs/report.md, "Inputs as used" and "Recomputation"). Built from the model's fields as read
// (EvidenceModel::to_json) and its point detail (PointResult::detail), never from the model's
// internals, so every model is described by what it reports about itself. Numbers go through
// core/numbers/number_text: a quantity printed here has the same text as anywhere else in the
// report.

#include <string>
#include <string_view>
#include <vector>

#include "core/casefile/case_model.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports {

// The id of the appendix that holds every network's probability tables, which a network item's
// inputs cite with its page.
inline constexpr const char* kNetworkTablesAppendix = "network-tables";

// The model's name in words for a reader ("Probabilities assigned by the scientist"); the case
// file's own name for a model this function does not know.
std::string model_title(std::string_view kind);

// What one item contributes to the report: a few lines in the body with the findings, long tables
// for the inputs appendix (empty when everything fits in the body), and the recomputation.
struct ItemInputs {
  std::vector<Block> body;
  std::vector<Block> appendix;
  std::vector<Block> recomputation;
};

// The inputs, appendix tables and recomputation of `item`, evaluated as `evaluation`.
// `appendix_id` is the id of the section the appendix tables go to (for page references).
// Never throws for a case the reader accepted (except std::bad_alloc).
ItemInputs item_inputs(const casefile::Item& item, const evaluation::ItemEvaluation& evaluation,
                       const std::string& appendix_id);

// In a case with several alternatives to Hp: the inputs, appendix tables and recomputation of
// `item` against each alternative of `propositions` in turn (its model against that alternative,
// evaluated on its own), each part headed "Hp against <id>" and naming the alternative wherever
// the two-proposition text says Hd. `item_inputs` alone in a two-proposition case.
ItemInputs item_inputs_by_alternative(const casefile::Item& item, const evaluation::ItemEvaluation& evaluation,
                                      const casefile::Propositions& propositions, const std::string& appendix_id);

// A sentence about Hp against Hd, written about Hp against `alternative` instead ("P(E|Hd)" becomes
// "P(E|Hd2)"; "Hd1" is left alone).
std::string naming_alternative(const std::string& sentence, const std::string& alternative);

}  // namespace counterpoise::reports
