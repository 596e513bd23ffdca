#pragma once
// The command-line front end: a table of sub-commands, each a thin function that reads its
// arguments, calls core and prints. Messages go to `err`, results to `out`.

#include <iosfwd>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace counterpoise::cli {

// Exit codes shared by every command (documented in docs/user-guide.md).
inline constexpr int kExitOk = 0;
inline constexpr int kExitInvalidInput = 1;  // the case or file has problems
inline constexpr int kExitUsage = 2;         // wrong arguments
inline constexpr int kExitFlagged = 3;       // check-wording found statements to correct

struct Command {
  std::string_view name;
  std::string_view usage;    // e.g. "evaluate CASE [--json]"
  std::string_view summary;  // one line for --help
  int (*run)(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);
};

// All commands in the order --help lists them.
std::span<const Command> all_commands();

// Thrown by argument parsing inside a command; main prints it with the usage, exit 2.
struct UsageError {
  std::string message;
};

// Small argument helpers used by the commands.
struct ParsedArguments {
  std::vector<std::string> positional;
  std::vector<std::pair<std::string, std::string>> options;  // "--out", "file"; flags have ""
  bool has_flag(std::string_view name) const;
  std::string option_or(std::string_view name, std::string fallback) const;
};
// `flags` take no value; `valued` take one (as "--name value" or "--name=value"); anything else
// starting with "--" is a UsageError.
ParsedArguments parse_arguments(const std::vector<std::string>& args,
                                std::initializer_list<std::string_view> flags,
                                std::initializer_list<std::string_view> valued);

}  // namespace counterpoise::cli
