// counterpoise-cli: weigh findings under Hp and one or more alternatives from the command line.
#include <algorithm>
#include <iostream>
#include <string>
#include <vector>

#include "app/cli/cli_command.hpp"
#include "app/cli/display_stream.hpp"
#include "core/reading/data_access.hpp"

namespace {

void print_help(std::ostream& out) {
  out << "counterpoise-cli " COUNTERPOISE_VERSION " — weigh forensic findings under Hp and one or more alternatives\n\n"
         "Usage: counterpoise-cli COMMAND [ARGUMENTS]\n\nCommands:\n";
  for (const auto& command : counterpoise::cli::all_commands())
    out << "  " << command.usage << "\n      " << command.summary << "\n";
  out << "\nOptions: --help, --version; with any command, --allow-data-outside lets a case read data,\n"
         "scale and rule files outside its own folder and the laboratory data folders\n"
         "(COUNTERPOISE_DATA_FOLDERS) for this run.\n"
         "Exit codes: 0 ok, 1 invalid input (validate: also a statement the report's wording check\n"
         "would refuse), 2 usage error, 3 wording flagged (check-wording)"
#ifdef COUNTERPOISE_HAVE_REPORTS
         " or report refused by its wording\n"
         "check (report)"
#endif
         ".\n"
         "The scientist evaluates the findings; the prior odds, and so any posterior, belong to the\n"
         "fact-finder. Follow your accredited laboratory's procedures and the law where the report is used.\n";
}

}  // namespace

int main(int argc, char** argv) {
  using namespace counterpoise::cli;
  // Everything printed passes the terminal filter (text from files and arguments is escaped).
  const DisplayStream shown_out(std::cout);
  const DisplayStream shown_err(std::cerr);
  std::vector<std::string> args(argv + 1, argv + argc);
  if (args.empty()) {
    print_help(std::cerr);
    return kExitUsage;
  }
  if (args[0] == "--help" || args[0] == "-h" || args[0] == "help") {
    print_help(std::cout);
    return kExitOk;
  }
  if (args[0] == "--version") {
    std::cout << "counterpoise-cli " COUNTERPOISE_VERSION "\n";
    return kExitOk;
  }
  for (const auto& command : all_commands()) {
    if (command.name != args[0]) continue;
    std::vector<std::string> rest(args.begin() + 1, args.end());
    // The user's explicit permission for this run: a case from elsewhere may name any file.
    if (const auto flag = std::find(rest.begin(), rest.end(), "--allow-data-outside"); flag != rest.end()) {
      rest.erase(flag);
      counterpoise::reading::allow_data_outside_for_this_run();
    }
    try {
      return command.run(rest, std::cout, std::cerr);
    } catch (const UsageError& e) {
      std::cerr << "counterpoise-cli " << command.name << ": " << e.message << "\nUsage: counterpoise-cli "
                << command.usage << "\n";
      return kExitUsage;
    } catch (const std::exception& e) {
      std::cerr << "counterpoise-cli " << command.name << ": " << e.what() << "\n";
      return kExitInvalidInput;
    }
  }
  std::cerr << "counterpoise-cli: unknown command '" << args[0] << "' (see --help)\n";
  return kExitUsage;
}
