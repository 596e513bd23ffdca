#include "core/comparison/comparison_text.hpp"

#include <algorithm>

#include "core/numbers/number_text.hpp"
#include "core/validation/display_text.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::comparison {

namespace {

using validation::display_text;

// Values quoted in the list of effects are cut; the section list shows them whole.
constexpr std::size_t kQuotedValueLength = 80;

std::string lr_words(const numbers::LikelihoodRatio& lr) {
  if (!lr.is_finite()) return numbers::lr_for_readers(lr);
  return numbers::lr_for_readers(lr) + " (log10 " + numbers::log10_for_readers(lr.log10()) + ")";
}

std::string section_title(const Difference& d) {
  if (d.path.section == "items") return d.path.item_id.empty() ? "Items" : "Item " + display_text(d.path.item_id);
  if (d.path.section == "case") return "Case details";
  if (d.path.section == "propositions") return "Propositions, conditioning information and assumptions";
  return "Settings (" + display_text(d.path.section) + ")";
}

// The differences that alone would change a verbal expression, and whose: listed before the effects.
void add_movers(const CaseComparison& c, std::vector<std::string>& lines) {
  lines.push_back("Changes that alone change a verbal expression (each changed by itself from A):");
  bool any = false;
  for (std::size_t k : c.movers_first()) {
    if (!c.moves_any_conclusion(k)) break;
    any = true;
    const Difference& d = c.differences[k];
    lines.push_back("  " + display_text(d.place) + ": " + change_summary(d) + "; changes the verbal expression of " +
                    conclusions_moved_words(c, k));
  }
  if (!any) lines.push_back("  none");
}

void add_effects(const CaseComparison& c, std::vector<std::string>& lines) {
  lines.push_back("Effects on the combined log10 LR, those that alone change a verbal expression first, then largest "
                  "first (each difference's share; alone: changed by itself from A):");
  bool any = false;
  for (std::size_t k : c.movers_first()) {
    const Difference& d = c.differences[k];
    if (!d.enters_lr()) continue;
    any = true;
    const DifferenceEffect& e = c.effects[k];
    std::string line = "  " + change_for_readers(e.combined_share) + "  " + display_text(d.place) + ": " + change_summary(d);
    if (e.combined_alone && d.kind != DifferenceKind::item_added && d.kind != DifferenceKind::item_removed)
      line += "  (alone " + change_for_readers(*e.combined_alone) + ")";
    if (c.moves_any_conclusion(k)) line += "  [alone, it changes the verbal expression of " + conclusions_moved_words(c, k) + "]";
    lines.push_back(line);
    if (!e.note.empty()) lines.push_back("        " + e.note);
  }
  if (!any) lines.push_back("  none: no difference enters an LR");
  else if (c.total_change.is_finite())
    lines.push_back("  The shares add up to " + change_for_readers(Log10Change::finite_change(c.sum_of_shares())) +
                    " (Shapley values over the changed inputs of each item; independent items add).");
}

void add_items(const CaseComparison& c, std::vector<std::string>& lines) {
  if (c.items.empty()) return;
  lines.push_back("Items whose LR or inclusion changed (log10 LR, A → B):");
  for (const auto& item : c.items) {
    const auto side = [](const std::optional<double>& log10, bool included) -> std::string {
      if (!log10) return "absent";
      return numbers::log10_for_readers(*log10) + (included ? "" : " (left out)");
    };
    lines.push_back("  " + display_text(item.item_id) + ": " + side(item.log10_lr_a, item.included_a) + " → " +
                    side(item.log10_lr_b, item.included_b) + "; its term in the combined log10 LR changes by " +
                    change_for_readers(item.combined_change));
  }
}

std::string log10_side(const std::optional<double>& log10) {
  return log10 ? numbers::log10_for_readers(*log10) : std::string("absent");
}

// One alternative (or the weighted set): its combined log10 LR in each version, the change and
// the differences' shares of it, largest first.
void add_alternative(const CaseComparison& c, const AlternativeAttribution& against, const std::string& name,
                     const std::string& band_name, std::vector<std::string>& lines) {
  std::string head = "  " + name + ": log10 LR " + log10_side(against.log10_lr_a) + " → " + log10_side(against.log10_lr_b);
  if (against.in_a() && against.in_b()) head += ", change " + change_for_readers(against.total_change);
  lines.push_back(head);
  lines.push_back("    " + alternative_band_sentence(against, band_name));
  if (!against.attributed) {
    lines.push_back("    " + against.note);
    return;
  }
  bool any = false;
  for (std::size_t k : against.movers_first()) {
    const Difference& d = c.differences[k];
    const DifferenceEffect& e = against.effects[k];
    // A member changed only for other alternatives (p_given with only Hd2 changed) does not move
    // this LR at all: left out here, listed with its 0 in the JSON.
    if (moves_nothing(e)) continue;
    any = true;
    std::string line = "    " + change_for_readers(e.combined_share) + "  " + display_text(d.place) + ": " + change_summary(d);
    if (e.combined_alone && d.kind != DifferenceKind::item_added && d.kind != DifferenceKind::item_removed)
      line += "  (alone " + change_for_readers(*e.combined_alone) + ")";
    if (against.moves_conclusion.at(k)) line += "  [alone, it changes this LR's verbal expression]";
    lines.push_back(line);
  }
  if (!any) lines.push_back("    no difference moves this LR");
  else if (against.total_change.is_finite())
    lines.push_back("    The shares add up to " + change_for_readers(Log10Change::finite_change(against.sum_of_shares())) + ".");
  if (!against.note.empty()) lines.push_back("    " + against.note);
}

void add_alternatives(const CaseComparison& c, std::vector<std::string>& lines) {
  const auto& alternatives = c.alternatives;
  if (alternatives.by_alternative.empty()) return;
  lines.push_back("Against each alternative (combined log10 LR of Hp against it, A → B; each difference's share):");
  for (const auto& against : alternatives.by_alternative)
    add_alternative(c, against, display_text(against.id), display_text(against.id), lines);
  if (alternatives.compound)
    add_alternative(c, *alternatives.compound, "Against the weighted set of alternatives (compound LR)",
                    kWeightedSetWords, lines);
  lines.push_back("");
}

// The entries of a list of sentences (the assumptions) that one side has and the other not.
std::vector<std::string> list_changes(const Difference& d) {
  std::vector<std::string> lines;
  const auto entries = [](const std::optional<nlohmann::json>& v) {
    std::vector<std::string> out;
    if (v && v->is_array())
      for (const auto& e : *v) out.push_back(e.is_string() ? e.get<std::string>() : e.dump());
    return out;
  };
  const auto old_entries = entries(d.old_value), new_entries = entries(d.new_value);
  const auto has = [](const std::vector<std::string>& list, const std::string& e) {
    return std::find(list.begin(), list.end(), e) != list.end();
  };
  for (const auto& e : old_entries)
    if (!has(new_entries, e)) lines.push_back("      only in A: " + display_text(e));
  for (const auto& e : new_entries)
    if (!has(old_entries, e)) lines.push_back("      only in B: " + display_text(e));
  if (lines.empty()) lines.push_back("      the same entries in another order");
  return lines;
}

std::string flags_words(const std::vector<WordingFlag>& flags) {
  if (flags.empty()) return "nothing flagged";
  std::string text;
  for (const auto& f : flags) {
    if (!text.empty()) text += "; ";
    text += f.severity + " [" + display_text(f.rule_id) + "] " + display_text(f.family_name) + ": “" +
            display_text(f.matched_text) + "”" + (f.assertion == "asserted" ? "" : " (" + f.assertion + ")");
  }
  return text;
}

void add_wording_summary(const CaseComparison& c, std::vector<std::string>& lines) {
  std::size_t texts = 0, flagged_a = 0, flagged_b = 0;
  for (const auto& review : c.wording.by_difference) {
    if (!review) continue;
    ++texts;
    flagged_a += flagged_count(review->a);
    flagged_b += flagged_count(review->b);
  }
  if (!c.wording.not_checked.empty()) {
    lines.push_back("Wording: not checked by the reasoning guard (" + validation::display_lines(c.wording.not_checked) + ").");
    return;
  }
  if (texts == 0) return;
  lines.push_back("Wording: " + numbers::count_for_readers(static_cast<std::int64_t>(texts)) +
                  " changed text(s); the reasoning guard flags " + numbers::count_for_readers(static_cast<std::int64_t>(flagged_a)) +
                  " statement(s) in A's and " + numbers::count_for_readers(static_cast<std::int64_t>(flagged_b)) + " in B's.");
  lines.push_back("");
}

void add_guard_lines(const CaseComparison& c, const Difference& d, std::vector<std::string>& lines) {
  const auto index = static_cast<std::size_t>(&d - c.differences.data());
  const auto& review = c.wording.by_difference.at(index);
  if (!review) return;
  lines.push_back("      reasoning guard, A: " + flags_words(review->a));
  lines.push_back("      reasoning guard, B: " + flags_words(review->b));
}

void add_sections(const CaseComparison& c, std::vector<std::string>& lines) {
  lines.push_back("Differences by section:");
  if (c.differences.empty()) {
    lines.push_back("  none: the two versions are the same case");
    return;
  }
  std::string current;
  for (const auto& d : c.differences) {
    const std::string title = section_title(d);
    if (title != current) lines.push_back("  " + title), current = title;
    lines.push_back("    " + kind_words(d.kind) + ": " + display_text(d.place));
    if (d.kind == DifferenceKind::data_file) {
      lines.push_back("      " + change_words(d));
      continue;
    }
    if (d.kind == DifferenceKind::item_added || d.kind == DifferenceKind::item_removed) {
      lines.push_back("      " + display_text(item_words(d.kind == DifferenceKind::item_added ? d.new_value : d.old_value)));
      continue;
    }
    const bool both_lists = d.old_value && d.new_value && d.old_value->is_array() && d.new_value->is_array();
    if (d.kind == DifferenceKind::assumptions && both_lists) {
      for (auto& line : list_changes(d)) lines.push_back(std::move(line));
      add_guard_lines(c, d, lines);
      continue;
    }
    lines.push_back("      A: " + display_text(value_words(d.old_value)));
    lines.push_back("      B: " + display_text(value_words(d.new_value)));
    add_guard_lines(c, d, lines);
  }
}

}  // namespace

// An item added or removed, in a line: its title and model.
std::string item_words(const std::optional<nlohmann::json>& item) {
  if (!item || !item->is_object()) return value_words(item);
  std::string text = item->value("title", std::string{});
  const std::string model = item->value("model", std::string{});
  return (text.empty() ? std::string("(no title)") : text) + " (model " + model + ")";
}

std::vector<MovedConclusion> conclusions_moved(const CaseComparison& c, std::size_t k) {
  std::vector<MovedConclusion> moved;
  if (c.moves_conclusion.at(k)) moved.push_back({"combined LR", "the combined LR", c.effects[k].combined_alone});
  for (const auto& against : c.alternatives.by_alternative)
    if (against.moves_conclusion.at(k))
      moved.push_back({against.id, "the LR against " + display_text(against.id), against.effects[k].combined_alone});
  if (c.alternatives.compound && c.alternatives.compound->moves_conclusion.at(k))
    moved.push_back({kCompoundId, "the compound LR", c.alternatives.compound->effects[k].combined_alone});
  return moved;
}

std::string conclusions_moved_words(const CaseComparison& c, std::size_t k) {
  std::vector<std::string> names;
  for (const auto& m : conclusions_moved(c, k)) names.push_back(m.name);
  return validation::list_in_words(names);
}

std::string conclusions_moved_cell(const CaseComparison& c, std::size_t k) {
  const auto moved = conclusions_moved(c, k);
  if (moved.empty()) return {};
  if (c.alternatives.by_alternative.empty()) return "yes";
  std::string text;
  for (const auto& conclusion : moved) text += (text.empty() ? "" : ", ") + display_text(conclusion.id);
  return text;
}

bool moves_nothing(const DifferenceEffect& e) {
  return e.combined_share.is_finite() && e.combined_share.log10 == 0.0 &&
         (!e.combined_alone || (e.combined_alone->is_finite() && e.combined_alone->log10 == 0.0));
}

namespace {

// The weights of a list of alternatives, "Hd1 6, Hd2 3, Hd3 1"; empty unless every entry has an id.
std::string weights_words(const nlohmann::json& alternatives) {
  std::string text;
  for (const auto& a : alternatives) {
    if (!a.is_object() || !a.contains("id") || !a.at("id").is_string()) return {};
    text += (text.empty() ? "" : ", ") + a.at("id").get<std::string>() + " " +
            (a.contains("weight") ? value_words(a.at("weight")) : std::string("(no weight)"));
  }
  return text;
}

// Whether two lists of alternatives differ only in their weights.
bool only_weights_differ(const nlohmann::json& old_list, const nlohmann::json& new_list) {
  if (!old_list.is_array() || !new_list.is_array() || old_list.size() != new_list.size()) return false;
  for (std::size_t i = 0; i < old_list.size(); ++i) {
    if (!old_list[i].is_object() || !new_list[i].is_object()) return false;
    nlohmann::json x = old_list[i], y = new_list[i];
    x.erase("weight"), y.erase("weight");
    if (x != y) return false;
  }
  return true;
}

}  // namespace

std::string change_summary(const Difference& d) {
  if (d.path.section == "propositions" && d.path.field == "alternatives" && d.old_value && d.new_value &&
      only_weights_differ(*d.old_value, *d.new_value))
    return "weights " + display_text(weights_words(*d.old_value)) + " → " + display_text(weights_words(*d.new_value));
  if (d.kind == DifferenceKind::item_added) return "added, " + display_text(item_words(d.new_value));
  if (d.kind == DifferenceKind::item_removed) return "removed, " + display_text(item_words(d.old_value));
  if (d.kind == DifferenceKind::item_included) return "left out → included";
  if (d.kind == DifferenceKind::item_excluded) return "included → left out";
  if (d.kind == DifferenceKind::data_file) return change_words(d);
  return validation::display_excerpt(value_words(d.old_value), kQuotedValueLength) + " → " +
         validation::display_excerpt(value_words(d.new_value), kQuotedValueLength);
}

std::string version_line(const std::string& tag, const VersionSummary& version) {
  return tag + ": LR " + lr_words(version.combined_lr) + ". " + version.verbal.sentence;
}

std::string band_words(const verbal::VerbalExpression& verbal) { return band_words(verbal, "Hd"); }

std::string band_words(const verbal::VerbalExpression& verbal, const std::string& alternative) {
  switch (verbal.favours) {
    case verbal::Favours::hp: return verbal.label + " for Hp";
    case verbal::Favours::hd: return verbal.label + " for " + alternative;
    case verbal::Favours::neither: break;
  }
  return verbal.label;
}

std::string alternative_band_sentence(const AlternativeAttribution& against, const std::string& alternative) {
  if (against.verbal_a && against.verbal_b) {
    const std::string b = band_words(*against.verbal_b, alternative);
    return against.band_changes()
               ? "The verbal expression changes: " + band_words(*against.verbal_a, alternative) + " → " + b + "."
               : "The verbal expression is the same in both versions: " + b + ".";
  }
  const bool in_a = against.verbal_a.has_value();
  if (!in_a && !against.verbal_b) return "No verbal expression: neither version has this LR.";
  return std::string("Verbal expression in ") + (in_a ? "A" : "B") + " only: " +
         band_words(in_a ? *against.verbal_a : *against.verbal_b, alternative) + ".";
}

std::string change_words(const Difference& d) {
  if (d.kind != DifferenceKind::data_file) return value_words(d.old_value) + " → " + value_words(d.new_value);
  std::string text;
  for (const auto& f : d.files) {
    if (!text.empty()) text += "; ";
    text += display_text(f.field) + ": " + display_text(data_file_words(f.old_use)) + " → " +
            display_text(data_file_words(f.new_use));
  }
  return text;
}

std::vector<std::string> comparison_cautions(const CaseComparison& c) {
  std::vector<std::string> cautions;
  if (c.propositions_differ())
    cautions.push_back(
        "The two versions state different propositions (or levels): their LRs weigh the findings for different "
        "questions, so the change in the LR is not a change of opinion on one question.");
  cautions.push_back(
      "A share is the average of what a change adds over every order in which the changes could be made (Shapley "
      "values); changed alone from A it may add more or less when the changes interact.");
  cautions.push_back(
      "The scientist evaluates the findings, not guilt; the prior odds, and so any posterior, belong to the "
      "fact-finder. Verbal scales are conventions. Follow your accredited laboratory's procedures and the law.");
  return cautions;
}

std::vector<std::string> comparison_lines(const CaseComparison& c) {
  std::vector<std::string> lines;
  lines.push_back("Comparison of two versions of a case");
  lines.push_back("  A: " + display_text(c.a.label) + " (SHA-256 " + c.a.sha256 + ")");
  lines.push_back("  B: " + display_text(c.b.label) + " (SHA-256 " + c.b.sha256 + ")");
  lines.push_back("");
  const auto& alternatives = c.alternatives.by_alternative;
  lines.push_back(alternatives.empty() || !alternatives.front().in_a()
                      ? std::string("Combined LR of the included items:")
                      : "Combined LR of the included items (Hp against the first alternative, " +
                            display_text(alternatives.front().id) + "):");
  lines.push_back("  " + version_line("A", c.a));
  lines.push_back("  " + version_line("B", c.b));
  lines.push_back("  Change of the combined log10 LR from A to B: " + change_for_readers(c.total_change));
  lines.push_back(c.band_changes() ? "  The verbal expression changes: " + band_words(c.a.verbal) + " → " + band_words(c.b.verbal)
                                   : "  The verbal expression is the same in both versions.");
  lines.push_back("");
  add_movers(c, lines);
  lines.push_back("");
  add_effects(c, lines);
  lines.push_back("");
  if (!c.items.empty()) {
    add_items(c, lines);
    lines.push_back("");
  }
  add_alternatives(c, lines);
  add_wording_summary(c, lines);
  add_sections(c, lines);
  lines.push_back("");
  for (const auto& caution : comparison_cautions(c)) lines.push_back(caution);
  return lines;
}

}  // namespace counterpoise::comparison
