#pragma once
// Who is writing: the examiner's declared name for commands that change a case store.

#include "app/cli/cli_command.hpp"
#include "core/store/examiner.hpp"

namespace counterpoise::cli {

// --examiner NAME, else the configured name (store::configured_examiner_name: the
// COUNTERPOISE_EXAMINER variable, else the settings file). Throws validation::InvalidValue
// naming all three ways when none gives a name, or when the name given is not valid: a command
// never writes a change without knowing who made it.
store::ExaminerName examiner_of(const ParsedArguments& parsed);

}  // namespace counterpoise::cli
