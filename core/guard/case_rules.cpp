#include "core/guard/case_rules.hpp"

#include <set>

#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::guard {

using validation::InvalidValue;
using validation::Location;

std::vector<models::DataFile> read_guard_section(const nlohmann::json& section, const std::filesystem::path& base_dir) {
  const Location where{"guard", ""};
  reading::require_object(section, where);
  reading::check_known_members(section, {"rules"}, where);
  std::vector<models::DataFile> files;
  const nlohmann::json* rules = reading::find_member(section, "rules");
  if (!rules) return files;
  const Location at = where.with_field("rules");
  const nlohmann::json list = rules->is_string() ? nlohmann::json::array({*rules}) : *rules;
  if (!list.is_array())
    throw InvalidValue(at, "expected a rule file name or a list of them, found " + reading::json_type_name(*rules));
  std::set<std::string> seen;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const Location file_at{"guard", "rules[" + std::to_string(i) + "]"};
    const std::string name = reading::read_string(list[i], file_at);
    if (name.empty()) throw InvalidValue(file_at, "the file name is empty");
    if (!seen.insert(name).second) throw InvalidValue(file_at, "rule file " + name + " is listed twice");
    files.push_back(models::read_data_file(base_dir, name, file_at));
  }
  return files;
}

WordingChecker checker_with_rule_files(const std::vector<models::DataFile>& files) {
  WordingChecker checker = WordingChecker::load_default();
  for (std::size_t i = 0; i < files.size(); ++i) {
    try {
      checker.add_rules_from_json_text(files[i].text, files[i].use.name);
    } catch (const validation::Error& error) {
      throw InvalidValue(Location{"guard", "rules[" + std::to_string(i) + "]"},
                         files[i].use.name + " is not a valid rule file: " + error.what());
    }
  }
  return checker;
}

WordingChecker checker_for_case(const casefile::Case& value) { return checker_with_rule_files(value.guard_rule_files); }

std::string rule_files_key(const std::vector<models::DataFile>& files) {
  std::string key;
  for (const auto& f : files) key += f.use.name + '\n' + f.use.sha256 + '\n';
  return key;
}

std::string rules_description(const WordingChecker& checker, const std::vector<models::DataFile>& files) {
  std::string text = "the reasoning guard's shipped rules";
  if (!files.empty()) {
    text += files.size() == 1 ? " and the laboratory's rule file " : " and the laboratory's rule files ";
    for (std::size_t i = 0; i < files.size(); ++i)
      text += (i ? ", " : "") + files[i].use.name + " (SHA-256 " + files[i].use.sha256 + ")";
  }
  text += " (" + std::to_string(checker.rules().rules().size()) + " rules)";
  if (const WordingModel* model = checker.model())
    text += ", and the texts taken from the case also with its learned reading (a statistical model trained on "
            "labelled wording, " +
            numbers::count_for_readers(static_cast<std::int64_t>(model->weights().size())) + " features" +
            (model->file_sha256().empty() ? std::string() : ", SHA-256 " + model->file_sha256()) +
            "; its warnings carry rule ids beginning LW-)";
  return text;
}

}  // namespace counterpoise::guard
