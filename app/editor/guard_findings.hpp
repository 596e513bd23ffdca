#pragma once
// The reasoning guard's wording findings for every text field of a case, with spans in UTF-16
// units (QString positions), so text fields can highlight them and the guard panel list them.
// The checking is the core's (core/guard); this only says which fields are checked.

#include <QString>

#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/guard/case_guard.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/models/data_file.hpp"
#include "core/store/case_state.hpp"

namespace counterpoise::editor {

// One checked text field: a field of a section or an item. Arrays of strings (assumptions) are
// checked as their lines joined by "\n", the way their text field shows them.
struct TextFieldRef {
  store::EntityRef entity;
  std::string field;
  bool operator==(const TextFieldRef& other) const {
    return entity.kind == other.entity.kind && entity.key == other.entity.key && field == other.field;
  }
};

struct TextFinding {
  TextFieldRef where;
  QString text;                 // the field's text as checked
  guard::WordingFinding finding;
  int begin() const { return static_cast<int>(finding.span.utf16_begin); }
  int end() const { return static_cast<int>(finding.span.utf16_end); }
  // The field's text with the finding's sentence replaced by the suggested rewrite.
  QString rewritten() const;
};

struct GuardFindings {
  bool available = false;   // false when the rule file could not be loaded
  QString problem;          // why not
  QString rules_note;       // a laboratory rule file of the case that could not be used, and why
  std::vector<TextFinding> findings;
  // The checks on how the case is set up (core/guard/case_guard.hpp, check_case_setup): the
  // numbers, propositions, levels, same findings, priors and the alternatives a text weighs against.
  std::vector<guard::CaseWarning> case_checks;
  std::vector<const TextFinding*> at(const TextFieldRef& where) const;
};

// The text of a field as its text widget shows it: a string as is, an array of strings joined by
// "\n", anything else empty.
QString field_text(const std::optional<nlohmann::json>& value);

class GuardService {
 public:
  GuardService();
  // The findings for every checked field of `document`. Texts checked before (with the same mode
  // and propositions) are not checked again, so an edit costs the check of the edited text only.
  GuardFindings check(const nlohmann::json& document);
  // Checks with the case's laboratory rule files after the shipped rules (rebuilt only when the
  // files' digests change). A file that is not a valid rule file leaves the shipped rules in use
  // and is named in every GuardFindings::rules_note until it is corrected.
  void useRuleFiles(const std::vector<models::DataFile>& files);
  // The fields checked in `document`: case purpose and title, the propositions and their
  // conditioning information and assumptions, and each item's title, description and notes.
  static std::vector<TextFieldRef> checked_fields(const nlohmann::json& document);

 private:
  std::shared_ptr<const guard::WordingChecker> checker_;
  QString problem_;
  QString rules_note_;
  std::string rules_key_;  // the digests of the rule files in use
  std::string cache_options_;  // mode and propositions the cache was filled with
  std::map<std::string, std::vector<guard::WordingFinding>> cache_;
};

}  // namespace counterpoise::editor
