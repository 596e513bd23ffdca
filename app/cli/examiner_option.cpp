#include "app/cli/examiner_option.hpp"

#include "core/validation/input_error.hpp"

namespace counterpoise::cli {

store::ExaminerName examiner_of(const ParsedArguments& parsed) {
  if (parsed.has_flag("--examiner")) return store::ExaminerName(parsed.option_or("--examiner", ""));
  if (auto configured = store::configured_examiner_name()) return *std::move(configured);
  const auto settings = store::examiner_settings_file();
  throw validation::InvalidValue(
      {"examiner", "name"},
      "no examiner's name: every change to a case file records who made it. Give --examiner "
      "NAME, set COUNTERPOISE_EXAMINER, or write the name on the first line of " +
          (settings.empty() ? std::string("the settings file") : settings.string()));
}

}  // namespace counterpoise::cli
