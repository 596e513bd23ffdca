#include "core/guard/wording_rules.hpp"

#include <algorithm>
#include <set>

#include "core/platform/shipped_data.hpp"
#include "core/reading/json_fields.hpp"
#include "core/reading/json_text.hpp"
#include "core/reading/text_file.hpp"

namespace counterpoise::guard {

namespace {

using reading::check_known_members;
using reading::find_member;
using reading::json;
using reading::read_bool;
using reading::read_string;
using reading::read_string_array;
using reading::require_member;
using validation::InvalidValue;
using validation::Location;

constexpr std::string_view kFormat = "counterpoise-wording-rules";
constexpr int kVersion = 1;

std::string required_text(const json& object, std::string_view key, const Location& where) {
  std::string value = read_string(require_member(object, key, where), where.with_field(std::string(key)));
  if (value.find_first_not_of(" \t\n") == std::string::npos)
    throw InvalidValue(where.with_field(std::string(key)), "must not be empty");
  return value;
}

void check_class_name(const std::string& name, const Location& where) {
  const bool valid = !name.empty() && std::all_of(name.begin(), name.end(), [](char c) {
    return (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '-';
  });
  if (!valid) throw InvalidValue(where, "class names use lower-case letters, digits and '-' only");
  if (is_builtin_class(name)) throw InvalidValue(where, "{" + name + "} is built in and cannot be redefined");
}

// Only [Hp], [Hd] and [N] may appear in a suggestion.
void check_placeholders(const std::string& text, const Location& where) {
  for (std::size_t open = text.find('['); open != std::string::npos; open = text.find('[', open + 1)) {
    const std::size_t close = text.find(']', open);
    if (close == std::string::npos) throw InvalidValue(where, "unclosed '[' in the suggestion");
    const std::string name = text.substr(open, close - open + 1);
    if (name != "[Hp]" && name != "[Hd]" && name != "[N]")
      throw InvalidValue(where, "unknown placeholder " + name + " (use [Hp], [Hd] or [N])");
  }
}

void collect_references(const TokenPattern& p, std::set<std::string>& out) {
  for (const auto& e : p.elements) {
    for (const auto& a : e.alternatives) {
      if (a.kind == PatternAlternative::Kind::word_class) out.insert(a.text);
      if (a.kind == PatternAlternative::Kind::phrase) collect_references(*a.phrase, out);
    }
    for (const auto& a : e.gap_forbidden)
      if (a.kind == PatternAlternative::Kind::word_class) out.insert(a.text);
  }
}

void check_no_cycle(const ClassTable& classes) {
  std::map<std::string, int> state;  // 1 visiting, 2 done
  std::function<void(const std::string&, std::vector<std::string>&)> visit = [&](const std::string& name,
                                                                              std::vector<std::string>& path) {
    if (state[name] == 2) return;
    path.push_back(name);
    if (state[name] == 1) {
      std::string chain;
      for (const auto& n : path) chain += (chain.empty() ? "{" : " -> {") + n + "}";
      throw InvalidValue({"class " + name, "members"}, "classes refer to each other in a cycle: " + chain);
    }
    state[name] = 1;
    std::set<std::string> refs;
    if (auto it = classes.find(name); it != classes.end())
      for (const auto& member : it->second.members) collect_references(member, refs);
    for (const auto& r : refs) visit(r, path);
    state[name] = 2;
    path.pop_back();
  };
  for (const auto& [name, members] : classes) {
    std::vector<std::string> path;
    visit(name, path);
  }
}

Severity read_severity(const json& object, const Location& where) {
  const std::string severity = required_text(object, "severity", where);
  if (severity == "error") return Severity::error;
  if (severity == "warning") return Severity::warning;
  if (severity == "advice") return Severity::advice;
  throw InvalidValue(where.with_field("severity"), "'" + severity + "' is not one of error, warning, advice");
}

// The optional "modes" list into the two flags (both modes when it is absent).
void read_modes(const json& object, const Location& where, bool& in_casework, bool& in_training) {
  const json* modes = find_member(object, "modes");
  if (!modes) return;
  const auto names = read_string_array(*modes, where.with_field("modes"));
  if (names.empty()) throw InvalidValue(where.with_field("modes"), "list at least one mode (casework, training)");
  in_casework = in_training = false;
  for (const auto& m : names) {
    if (m == "casework") in_casework = true;
    else if (m == "training") in_training = true;
    else throw InvalidValue(where.with_field("modes"), "'" + m + "' is not one of casework, training");
  }
}

}  // namespace

std::string_view severity_name(Severity s) {
  switch (s) {
    case Severity::advice: return "advice";
    case Severity::warning: return "warning";
    case Severity::error: return "error";
  }
  return "error";
}

std::string_view mode_name(CheckMode m) { return m == CheckMode::casework ? "casework" : "training"; }

const ClaimWording* WordingRuleSet::claim_wording(std::string_view family) const {
  const auto it = std::find_if(claims_.begin(), claims_.end(),
                               [&](const ClaimWording& c) { return c.enabled && c.family == family; });
  return it == claims_.end() ? nullptr : &*it;
}

const ErrorFamily& WordingRuleSet::family(std::string_view id) const {
  const auto it = families_.find(id);
  if (it == families_.end()) throw InvalidValue({"family " + std::string(id), ""}, "no such family");
  return it->second;
}

void WordingRuleSet::add_file(const std::filesystem::path& path) {
  add_json_text(reading::read_text_file(path, {path.string(), ""}), path.string());
}

void WordingRuleSet::add_json_text(std::string_view json_text, const std::string& origin) {
  // A rule file may come with a case from elsewhere: the bounded reader of untrusted JSON.
  const json root = reading::parse_json_text(json_text, origin);
  const Location file{origin, ""};
  reading::require_object(root, file);
  check_known_members(root, {"format", "version", "description", "families", "classes", "reporting_cues", "refuting_cues",
                       "endorsing_cues", "claims", "rules"},
                      file);
  const json* format = find_member(root, "format");
  if (!format || !format->is_string() || format->get<std::string>() != kFormat)
    throw validation::UnsupportedFormat(file.with_field("format"),
                                        "expected \"" + std::string(kFormat) + "\" (is this a wording rule file?)");
  const json* version = find_member(root, "version");
  if (!version || !version->is_number_integer() || version->get<int>() != kVersion)
    throw validation::UnsupportedFormat(file.with_field("version"),
                                        "this program reads version " + std::to_string(kVersion));

  WordingRuleSet next = *this;  // changes are made on a copy so a failed file leaves no trace

  if (const json* families = find_member(root, "families")) {
    if (!families->is_array()) throw InvalidValue(file.with_field("families"), "expected an array");
    for (std::size_t i = 0; i < families->size(); ++i) {
      const json& f = (*families)[i];
      Location where{"families[" + std::to_string(i) + "]", ""};
      check_known_members(f, {"id", "name", "published_name", "source"}, where);
      ErrorFamily family;
      family.id = required_text(f, "id", where);
      where.item = "family " + family.id;
      family.name = required_text(f, "name", where);
      family.published_name = reading::read_string_or(f, "published_name", where);
      family.source = reading::read_string_or(f, "source", where);
      next.families_[family.id] = family;
    }
  }

  if (const json* classes = find_member(root, "classes")) {
    reading::require_object(*classes, file.with_field("classes"));
    for (auto it = classes->begin(); it != classes->end(); ++it) {
      const Location where{"class " + it.key(), ""};
      check_class_name(it.key(), where);
      ClassDefinition& definition = next.classes_[it.key()];
      if (it->is_object()) {
        check_known_members(*it, {"add"}, where);
        for (auto& m : read_string_array(require_member(*it, "add", where), where.with_field("add")))
          definition.members.push_back(std::move(m));
      } else {
        definition.members = read_string_array(*it, where.with_field("members"));
      }
      if (definition.members.empty()) throw InvalidValue(where.with_field("members"), "a class needs at least one member");
    }
  }
  const auto known_class = [&next](std::string_view name) { return next.classes_.find(name) != next.classes_.end(); };
  next.compiled_classes_.clear();
  for (const auto& [name, definition] : next.classes_) {
    auto& compiled = next.compiled_classes_[name].members;
    for (std::size_t m = 0; m < definition.members.size(); ++m)
      compiled.push_back(compile_pattern(definition.members[m], known_class,
                                         {"class " + name, "members[" + std::to_string(m) + "]"}));
  }
  check_no_cycle(next.compiled_classes_);
  index_first_words(next.compiled_classes_);
  const ClassTable& classes = next.compiled_classes_;
  // A pattern compiled and indexed by the words it can start with.
  const auto compile = [&](std::string_view source, const Location& where) {
    TokenPattern p = compile_pattern(source, known_class, where);
    p.first_words = first_words_of(p, classes);
    return p;
  };

  for (auto* cues : {&next.cues_, &next.trailing_cues_, &next.endorsing_cues_})  // the classes may have changed under them
    for (TokenPattern& cue : *cues) cue.first_words = first_words_of(cue, classes);
  for (const char* key : {"reporting_cues", "refuting_cues", "endorsing_cues"}) {
    const json* cues = find_member(root, key);
    if (!cues) continue;
    const std::string_view name(key);
    auto& target = name == "reporting_cues" ? next.cues_ : name == "refuting_cues" ? next.trailing_cues_ : next.endorsing_cues_;
    const auto texts = read_string_array(*cues, {key, ""});
    for (std::size_t i = 0; i < texts.size(); ++i)
      target.push_back(compile(texts[i], {key, "[" + std::to_string(i) + "]"}));
  }
  // Patterns already loaded were compiled against the old classes; recompile them so a class
  // removed or changed by this file is noticed now, naming the rule.
  for (WordingRule& rule : next.rules_) {
    const Location where{"rule " + rule.id, ""};
    rule.pattern = compile(rule.pattern.source, where.with_field("pattern"));
    for (auto* list : {&rule.requires_patterns, &rule.unless_patterns})
      for (auto& p : *list) p = compile(p.source, where.with_field(list == &rule.requires_patterns ? "requires" : "unless"));
  }

  if (const json* claims = find_member(root, "claims")) {
    if (!claims->is_array()) throw InvalidValue(file.with_field("claims"), "expected an array");
    std::set<std::string> seen;
    for (std::size_t i = 0; i < claims->size(); ++i) {
      const json& c = (*claims)[i];
      Location where{"claims[" + std::to_string(i) + "]", ""};
      ClaimWording claim;
      claim.id = required_text(c, "id", where);
      where.item = "claim " + claim.id;
      check_known_members(c, {"id", "family", "severity", "modes", "explanation", "suggestion", "enabled", "note"}, where);
      if (!seen.insert(claim.id).second) throw InvalidValue(where.with_field("id"), "the id is used twice in " + origin);
      auto existing = std::find_if(next.claims_.begin(), next.claims_.end(),
                                   [&](const ClaimWording& w) { return w.id == claim.id; });
      if (existing != next.claims_.end() && c.size() == 2 && c.contains("enabled")) {
        existing->enabled = read_bool(c["enabled"], where.with_field("enabled"));
        continue;
      }
      claim.origin = origin;
      claim.family = required_text(c, "family", where);
      if (next.families_.find(claim.family) == next.families_.end())
        throw InvalidValue(where.with_field("family"), "unknown family '" + claim.family + "'");
      claim.severity = read_severity(c, where);
      read_modes(c, where, claim.in_casework, claim.in_training);
      claim.explanation = required_text(c, "explanation", where);
      claim.suggestion = required_text(c, "suggestion", where);
      check_placeholders(claim.suggestion, where.with_field("suggestion"));
      if (const json* enabled = find_member(c, "enabled")) claim.enabled = read_bool(*enabled, where.with_field("enabled"));
      if (existing != next.claims_.end()) *existing = std::move(claim);
      else next.claims_.push_back(std::move(claim));
    }
  }

  if (const json* rules = find_member(root, "rules")) {
    if (!rules->is_array()) throw InvalidValue(file.with_field("rules"), "expected an array");
    std::set<std::string> seen;
    for (std::size_t i = 0; i < rules->size(); ++i) {
      const json& r = (*rules)[i];
      Location where{"rules[" + std::to_string(i) + "]", ""};
      const std::string id = required_text(r, "id", where);
      where.item = "rule " + id;
      check_known_members(r, {"id", "family", "severity", "modes", "pattern", "requires", "unless", "explanation",
                              "suggestion", "enabled", "note"},
                          where);
      if (!seen.insert(id).second) throw InvalidValue(where.with_field("id"), "the id is used twice in " + origin);
      auto existing = std::find_if(next.rules_.begin(), next.rules_.end(), [&](const WordingRule& w) { return w.id == id; });
      // {"id", "enabled"} alone switches a loaded rule on or off.
      if (existing != next.rules_.end() && r.size() == 2 && r.contains("enabled")) {
        existing->enabled = read_bool(r["enabled"], where.with_field("enabled"));
        continue;
      }
      WordingRule rule;
      rule.id = id;
      rule.origin = origin;
      rule.family = required_text(r, "family", where);
      if (next.families_.find(rule.family) == next.families_.end())
        throw InvalidValue(where.with_field("family"), "unknown family '" + rule.family + "'");
      rule.severity = read_severity(r, where);
      read_modes(r, where, rule.in_casework, rule.in_training);
      rule.pattern = compile(required_text(r, "pattern", where), where.with_field("pattern"));
      for (const char* key : {"requires", "unless"}) {
        const json* list = find_member(r, key);
        if (!list) continue;
        const auto texts = read_string_array(*list, where.with_field(key));
        for (std::size_t k = 0; k < texts.size(); ++k) {
          auto compiled = compile(texts[k], where.with_field(std::string(key) + "[" + std::to_string(k) + "]"));
          (std::string_view(key) == "requires" ? rule.requires_patterns : rule.unless_patterns).push_back(std::move(compiled));
        }
      }
      rule.explanation = required_text(r, "explanation", where);
      rule.suggestion = required_text(r, "suggestion", where);
      check_placeholders(rule.suggestion, where.with_field("suggestion"));
      if (const json* enabled = find_member(r, "enabled")) rule.enabled = read_bool(*enabled, where.with_field("enabled"));
      if (existing != next.rules_.end()) *existing = std::move(rule);
      else next.rules_.push_back(std::move(rule));
    }
  }
  *this = std::move(next);
}

std::filesystem::path default_wording_rules_path() {
  return platform::shipped_data_dir() / "guard" / "wording-rules.json";
}

}  // namespace counterpoise::guard
