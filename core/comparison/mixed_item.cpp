#include "core/comparison/mixed_item.hpp"

#include <limits>

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
  std::vector<models::DataFileUse> uses = item.model->data_files();
  for (std::size_t i = 1; i < item.alternative_models.size(); ++i)
    for (auto& use : item.alternative_models[i]->data_files()) uses.push_back(std::move(use));
  for (const auto& use : uses) {
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

// The models of an item read as version `form` reads it: one per alternative, or the one model.
std::vector<models::EvidenceModelPtr> read_as(const models::ModelEntry& entry, const json& item, const CaseVersion& form,
                                              const models::ReadContext& context) {
  if (!form.value.propositions.has_alternatives()) return {entry.read(item, context)};
  const auto ids = form.value.propositions.alternative_ids();
  return entry.read_alternatives(item, ids, context);
}

}  // namespace

std::vector<std::size_t> ItemPlayers::members(int p) const {
  if (p < model_count()) return model[static_cast<std::size_t>(p)];
  return {*inclusion};
}

ItemPlayers players_of(const std::vector<Difference>& differences, const std::vector<std::size_t>& indexes) {
  ItemPlayers players;
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

MixedItem::MixedItem(const CaseVersion& a, const CaseVersion& b, const std::string& item_id,
                     const std::vector<Difference>& differences, const std::vector<std::size_t>& indexes)
    : a_(a), b_(b), differences_(differences), players_(players_of(differences, indexes)) {
  const casefile::Item& item_a = *a.value.find_item(item_id);
  const casefile::Item& item_b = *b.value.find_item(item_id);
  json_a_ = item_json_with_absolute_files(a, item_a);
  json_b_ = item_json_with_absolute_files(b, item_b);
  included_a_ = item_a.included();
  included_b_ = item_b.included();
  const int n = players_.model_count();
  all_ = n == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << n) - 1;
  // The two ends are the versions' own items, exactly as evaluating each version gives them.
  const auto own = [](const CaseVersion& version, const casefile::Item& item) {
    // Each model evaluated once: the item's model is its model against the first alternative.
    Values v;
    const auto ids = version.value.propositions.alternative_ids();
    for (std::size_t i = 0; i < ids.size(); ++i) v.by_id[ids[i]] = item.model_against(i).evaluate().lr.log10();
    v.model = v.by_id.at(ids.front());
    return v;
  };
  cache_[0] = own(a, item_a);
  cache_[all_] = own(b, item_b);
}

const MixedItem::Values& MixedItem::values(std::uint64_t mask) {
  mask &= all_;
  const auto found = cache_.find(mask);
  if (found != cache_.end()) return found->second;
  return cache_.emplace(mask, read_mixture(mask)).first->second;
}

double MixedItem::log10_lr(std::uint64_t model_mask, const LrTarget& target) {
  const Values& v = values(model_mask);
  if (!target) return v.model;
  const auto found = v.by_id.find(*target);
  return found == v.by_id.end() ? kUnreadable : found->second;
}

double MixedItem::term(std::uint64_t mask, const LrTarget& target) {
  const std::uint64_t inclusion_bit = std::uint64_t{1} << players_.model_count();
  const bool included = players_.inclusion && (mask & inclusion_bit) ? included_b_ : included_a_;
  return included ? log10_lr(mask, target) : 0.0;
}

MixedItem::Values MixedItem::read_mixture(std::uint64_t mask) const {
  json mixed = json_a_;
  for (std::size_t p = 0; p < players_.model.size(); ++p) {
    if (!(mask & (std::uint64_t{1} << p))) continue;
    for (std::size_t k : players_.model[p]) {
      const std::string& field = differences_[k].path.field;
      if (json_b_.contains(field)) mixed[field] = json_b_.at(field);
      else mixed.erase(field);
    }
  }
  Values values{kUnreadable, {}};
  const auto* entry = mixed.contains("model") && mixed.at("model").is_string()
                          ? models::find_model(mixed.at("model").get<std::string>())
                          : nullptr;
  if (!entry) return values;
  const models::ReadContext context{a_.base_dir, {json_a_.at("id").get<std::string>(), ""}};
  // The first version's form of the propositions, else the second's: a member naming the
  // alternatives reads only with the list of alternatives it was written for.
  for (const CaseVersion* form : {&a_, &b_}) {
    try {
      const auto read = read_as(*entry, mixed, *form, context);
      if (read.empty()) continue;
      const auto ids = form->value.propositions.alternative_ids();
      for (std::size_t i = 0; i < ids.size() && i < read.size(); ++i) values.by_id[ids[i]] = read[i]->evaluate().lr.log10();
      values.model = values.by_id.at(ids.front());
      return values;
    } catch (const std::exception&) {
      // inputs that only make sense together, or with the other version's alternatives
    }
  }
  return values;
}

std::size_t ChangedItem::presence_index(const std::vector<Difference>& differences) const {
  for (std::size_t k : indexes)
    if (differences[k].kind == DifferenceKind::item_added || differences[k].kind == DifferenceKind::item_removed) return k;
  return indexes.front();
}

std::vector<ChangedItem> changed_items(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences) {
  std::vector<ChangedItem> items;
  std::map<std::string, std::size_t> position;
  for (std::size_t k = 0; k < differences.size(); ++k) {
    const Difference& d = differences[k];
    if (!d.enters_lr()) continue;
    const auto [at, added] = position.emplace(d.path.item_id, items.size());
    if (added) items.push_back(ChangedItem{d.path.item_id, {}, nullptr});
    items[at->second].indexes.push_back(k);
  }
  for (auto& item : items)
    if (a.value.find_item(item.id) && b.value.find_item(item.id))
      item.mixed = std::make_unique<MixedItem>(a, b, item.id, differences, item.indexes);
  return items;
}

}  // namespace counterpoise::comparison
