// The table of sub-commands. A new command: write command_<name>.cpp with a run function and
// add one row here.
#include <iosfwd>

#include "app/cli/cli_command.hpp"

namespace counterpoise::cli {

int run_evaluate(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_validate(const std::vector<std::string>&, std::ostream&, std::ostream&);
int run_check_wording(const std::vector<std::string>&, std::ostream&, std::ostream&);

namespace {
const Command kCommands[] = {
    {"evaluate", "evaluate CASE [--json] [--cross-check]",
     "LR of each item, the combined LR, its uncertainty, verbal expression and prior sensitivity", run_evaluate},
    {"validate", "validate CASE", "list every problem in a case file (exit 1 if any)", run_validate},
    {"check-wording", "check-wording FILE|- [--json] [--mode casework|training] [--rules FILE] [--hp TEXT] [--hd TEXT]",
     "flag statements that transpose the conditional and related errors (exit 3 if any)", run_check_wording},
};
}  // namespace

std::span<const Command> all_commands() { return kCommands; }

}  // namespace counterpoise::cli
