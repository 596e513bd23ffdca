#include "core/casefile/item_templates.hpp"

namespace counterpoise::casefile {

using nlohmann::json;

json starting_fields(const std::string& model) {
  if (model == "assigned") return json{{"p_given_hp", 0.5}, {"p_given_hd", 0.5}};
  if (model == "reported-lr") return json{{"lr", 1}};
  if (model == "transfer")
    return json{{"t0", 0.1}, {"tn", 0.05}, {"p0", 0.6}, {"p1", 0.3}, {"sn", 0.1}, {"gamma", 0.02}};
  if (model == "continuous-two-level")
    return json{{"control", json::array({1.51844, 1.51846})},
                {"recovered", json::array({1.51848})},
                {"within_sd", 4e-5},
                {"population", {{"normal", {{"mean", 1.5186}, {"sd", 0.004}}}}}};
  if (model == "dna-single-source")
    return json{{"theta", 0.01},
                {"relationship", "unrelated"},
                {"profile", {{"D8S1179", json::array({"13", "14"})}}},
                // The person of interest's profile: without it nothing is compared and there is no LR.
                {"reference_profile", {{"D8S1179", json::array({"13", "14"})}}},
                {"frequencies", {{"table", {{"D8S1179", {{"13", 0.30}, {"14", 0.21}}}}}}}};
  if (model == "dna-mixture")
    // A two-person mixture at one locus, the victim named under both propositions: the shape
    // every mixture starts from, to be replaced by the case's loci and people.
    return json{{"theta", 0.01},
                {"observed", {{"D8S1179", json::array({"12", "13", "15"})}}},
                {"references", {{"suspect", {{"D8S1179", json::array({"12", "15"})}}},
                                {"victim", {{"D8S1179", json::array({"13", "13"})}}}}},
                {"hp", {{"contributors", json::array({"suspect", "victim"})}, {"unknowns", 0}}},
                {"hd", {{"contributors", json::array({"victim"})}, {"unknowns", 1}}},
                {"dropout", 0.1},
                {"dropin", 0.05},
                {"frequencies", {{"table", {{"D8S1179", {{"12", 0.15}, {"13", 0.30}, {"15", 0.16}}}}}}}};
  return json::object();
}

bool holds_starting_fields(const Item& item) {
  if (!item.model) return false;
  const json start = starting_fields(item.model_name);
  if (start.empty()) return false;
  // Numbers compare by value (1 and 1.0 are the same starting LR).
  return item.model->to_json() == start;
}

}  // namespace counterpoise::casefile
