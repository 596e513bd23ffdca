#include "core/comparison/item_attribution.hpp"

#include <cmath>
#include <limits>
#include <map>

#include "core/comparison/shapley_values.hpp"
#include "core/interchange/case_json.hpp"
#include "core/models/model_registry.hpp"
#include "core/reading/text_file.hpp"

namespace counterpoise::comparison {

using nlohmann::json;

namespace {

constexpr double kUnreadable = std::numeric_limits<double>::quiet_NaN();

// The item's JSON as written, with each data file's name made absolute against the version's
// folder, so that a mixture of two versions in different folders reads each file from its own.
json item_json_with_absolute_files(const CaseVersion& version, const casefile::Item& item) {
  json written = interchange::write_item(item);
  for (const auto& use : item.model->data_files()) {
    // The field "frequencies.file" or "nodes[2].file" as a JSON pointer "/frequencies/file".
    std::string pointer = "/";
    for (char c : use.field)
      if (c == '.' || c == '[') pointer += '/';
      else if (c != ']') pointer += c;
    const json::json_pointer at(pointer);
    if (written.contains(at) && written.at(at).is_string())
      written[at] = reading::resolve_path(version.base_dir, use.name).string();
  }
  return written;
}

std::optional<Log10Change> known_change(double from, double to) {
  if (std::isnan(from) || std::isnan(to)) return std::nullopt;
  return Log10Change::between(from, to);
}

// One game's shares and how they were found.
struct GameShares {
  Log10Change total;
  std::vector<Log10Change> shares;
  AttributionMethod method = AttributionMethod::single;
  std::string note;
};

GameShares share_out(int players, const CoalitionValue& value) {
  const std::uint64_t all = players == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << players) - 1;
  const double start = value(0), end = value(all);
  GameShares out;
  out.total = Log10Change::between(start, end);
  out.shares.assign(static_cast<std::size_t>(players), Log10Change{});
  if (std::isfinite(start) && std::isfinite(end)) {
    if (players == 1) {
      out.shares[0] = out.total;
      return out;
    }
    const ShapleyValues shapley = shapley_values(players, value);
    bool finite = true;
    for (double v : shapley.values) finite = finite && std::isfinite(v);
    if (finite) {
      for (int i = 0; i < players; ++i) out.shares[static_cast<std::size_t>(i)] = Log10Change::finite_change(shapley.values[static_cast<std::size_t>(i)]);
      out.method = shapley.exact ? AttributionMethod::exact : AttributionMethod::sampled;
      if (!shapley.exact)
        out.note = "Shapley share estimated from " + std::to_string(2 * shapley.orders) + " seeded orders of the changes";
      return out;
    }
    // Some mixture of the two versions has no finite LR, or cannot be read: the changes act
    // only together, and the Shapley value of that (unanimity) game is an equal split.
    for (auto& share : out.shares) share = Log10Change::finite_change(out.total.log10 / players);
    out.method = AttributionMethod::joint;
    out.note =
        "the item cannot be evaluated with only some of these changes (a value outside its own interval, or no "
        "finite LR); they act together and share the change equally";
    return out;
  }
  out.method = AttributionMethod::infinite;
  if (out.total.is_finite()) {
    out.note = std::isinf(start) && start < 0 ? "the LR is zero in both versions" : "the LR is infinite in both versions";
    return out;
  }
  bool any = false;
  for (int i = 0; i < players; ++i) {
    const std::uint64_t bit = std::uint64_t{1} << i;
    const auto alone = known_change(start, value(bit));
    const auto back = known_change(value(all & ~bit), end);
    if ((alone && alone->state == out.total.state) || (back && back->state == out.total.state)) {
      out.shares[static_cast<std::size_t>(i)] = out.total;
      any = true;
    }
  }
  if (!any) {
    for (auto& share : out.shares) share = out.total;
    out.note = "the LR becomes zero or infinite only through these changes together";
  } else {
    out.note = "the change is infinite: it is given to the changes that make the LR zero or infinite by themselves";
  }
  return out;
}

// The players of one item: groups of difference indexes.
struct Players {
  std::vector<std::vector<std::size_t>> model;  // model inputs and data files
  std::optional<std::size_t> inclusion;         // the combination member, when inclusion changed
};

Players players_of(const std::vector<Difference>& differences, const std::vector<std::size_t>& indexes) {
  Players players;
  bool model_changed = false;
  for (std::size_t k : indexes)
    model_changed = model_changed || (differences[k].kind == DifferenceKind::input_value && differences[k].path.field == "model");
  std::vector<std::size_t> together;
  for (std::size_t k : indexes) {
    const auto kind = differences[k].kind;
    if (kind == DifferenceKind::item_included || kind == DifferenceKind::item_excluded) {
      players.inclusion = k;
    } else if (kind == DifferenceKind::input_value || kind == DifferenceKind::data_file) {
      if (model_changed) together.push_back(k);
      else players.model.push_back({k});
    }
  }
  if (!together.empty()) players.model.push_back(std::move(together));
  return players;
}

// The item's point log10 LR for each mixture of model players (bit i: player i from the
// second version), NaN for a mixture the model reader refuses.
class MixedItem {
 public:
  MixedItem(const CaseVersion& a, const casefile::Item& item_a, const CaseVersion& b, const casefile::Item& item_b,
            const std::vector<Difference>& differences, const Players& players)
      : a_(a), json_a_(item_json_with_absolute_files(a, item_a)), json_b_(item_json_with_absolute_files(b, item_b)),
        differences_(differences), players_(players) {
    const int n = static_cast<int>(players.model.size());
    all_ = n == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << n) - 1;
    cache_[0] = item_a.model->evaluate().lr.log10();
    cache_[all_] = item_b.model->evaluate().lr.log10();
  }

  double log10_lr(std::uint64_t mask) {
    mask &= all_;
    const auto found = cache_.find(mask);
    if (found != cache_.end()) return found->second;
    const double value = read_mixture(mask);
    cache_.emplace(mask, value);
    return value;
  }

 private:
  double read_mixture(std::uint64_t mask) const {
    json mixed = json_a_;
    for (std::size_t p = 0; p < players_.model.size(); ++p) {
      if (!(mask & (std::uint64_t{1} << p))) continue;
      for (std::size_t k : players_.model[p]) {
        const std::string& field = differences_[k].path.field;
        if (json_b_.contains(field)) mixed[field] = json_b_.at(field);
        else mixed.erase(field);
      }
    }
    try {
      const auto* entry = models::find_model(mixed.at("model").get<std::string>());
      if (!entry) return kUnreadable;
      const auto model = entry->read(mixed, models::ReadContext{a_.base_dir, {json_a_.at("id").get<std::string>(), ""}});
      return model->evaluate().lr.log10();
    } catch (const std::exception&) {
      return kUnreadable;  // inputs that only make sense together
    }
  }

  const CaseVersion& a_;
  json json_a_, json_b_;
  const std::vector<Difference>& differences_;
  const Players& players_;
  std::uint64_t all_ = 0;
  std::map<std::uint64_t, double> cache_;
};

void record_presence(const std::optional<double>& log10_lr, bool included, bool added, std::size_t index,
                     ItemAttribution& result, std::vector<DifferenceEffect>& effects) {
  const double term = included ? *log10_lr : 0.0;
  result.combined_change = added ? Log10Change::between(0.0, term) : Log10Change::between(term, 0.0);
  result.method = AttributionMethod::presence;
  result.players = 1;
  auto& effect = effects[index];
  effect.combined_alone = result.combined_change;
  effect.combined_share = result.combined_change;
  if (!included) effect.note = "left out of the combined LR in the version that has it";
}

}  // namespace

std::string method_name(AttributionMethod method) {
  switch (method) {
    case AttributionMethod::single: return "single";
    case AttributionMethod::exact: return "shapley-exact";
    case AttributionMethod::sampled: return "shapley-sampled";
    case AttributionMethod::joint: return "joint";
    case AttributionMethod::infinite: return "infinite";
    case AttributionMethod::presence: return "presence";
  }
  return "unknown";
}

ItemAttribution attribute_item(const CaseVersion& a, const CaseVersion& b, const std::string& item_id,
                               const std::vector<Difference>& differences, const std::vector<std::size_t>& indexes,
                               std::vector<DifferenceEffect>& effects) {
  ItemAttribution result;
  result.item_id = item_id;
  const casefile::Item* item_a = a.value.find_item(item_id);
  const casefile::Item* item_b = b.value.find_item(item_id);
  if (item_a) result.log10_lr_a = item_a->model->evaluate().lr.log10(), result.included_a = item_a->included();
  if (item_b) result.log10_lr_b = item_b->model->evaluate().lr.log10(), result.included_b = item_b->included();
  if (!item_a || !item_b) {
    for (std::size_t k : indexes)
      if (differences[k].kind == DifferenceKind::item_added || differences[k].kind == DifferenceKind::item_removed)
        record_presence(item_a ? result.log10_lr_a : result.log10_lr_b, item_a ? result.included_a : result.included_b,
                        item_b != nullptr, k, result, effects);
    return result;
  }

  const Players players = players_of(differences, indexes);
  MixedItem mixed(a, *item_a, b, *item_b, differences, players);
  const int model_players = static_cast<int>(players.model.size());
  const int all_players = model_players + (players.inclusion ? 1 : 0);
  result.players = all_players;
  result.item_change = Log10Change::between(*result.log10_lr_a, *result.log10_lr_b);

  // The item's own LR: the model players only.
  const CoalitionValue item_value = [&](std::uint64_t mask) { return mixed.log10_lr(mask); };
  // Its term in the combined LR: the inclusion player is the last bit.
  const std::uint64_t inclusion_bit = std::uint64_t{1} << model_players;
  const CoalitionValue term_value = [&](std::uint64_t mask) {
    const bool included = players.inclusion && (mask & inclusion_bit) ? result.included_b : result.included_a;
    return included ? mixed.log10_lr(mask) : 0.0;
  };

  const GameShares item_shares = share_out(model_players, item_value);
  const GameShares term_shares = share_out(all_players, term_value);
  result.combined_change = term_shares.total;
  result.method = all_players == 1 ? AttributionMethod::single : term_shares.method;

  for (int p = 0; p < all_players; ++p) {
    const std::uint64_t bit = std::uint64_t{1} << p;
    const bool is_model = p < model_players;
    const std::vector<std::size_t> members =
        is_model ? players.model[static_cast<std::size_t>(p)] : std::vector<std::size_t>{*players.inclusion};
    const auto item_alone = is_model ? known_change(item_value(0), item_value(bit)) : std::nullopt;
    const auto term_alone = known_change(term_value(0), term_value(bit));
    // A player of several differences (a changed model with its inputs) shares equally among
    // them: the differences act as one.
    const double parts = static_cast<double>(members.size());
    for (std::size_t k : members) {
      DifferenceEffect& effect = effects[k];
      const auto part = [&](const Log10Change& change) {
        return change.is_finite() ? Log10Change::finite_change(change.log10 / parts) : change;
      };
      if (is_model) {
        effect.item_alone = item_alone;
        effect.item_share = part(item_shares.shares[static_cast<std::size_t>(p)]);
      }
      effect.combined_alone = term_alone;
      effect.combined_share = part(term_shares.shares[static_cast<std::size_t>(p)]);
      effect.note = term_shares.note.empty() && is_model ? item_shares.note : term_shares.note;
      if (members.size() > 1)
        effect.note = "the model changed: its inputs are counted together and share the effect equally";
      if (!is_model && !item_alone && !term_alone)
        effect.note = "cannot be evaluated alone";
    }
  }
  return result;
}

}  // namespace counterpoise::comparison
