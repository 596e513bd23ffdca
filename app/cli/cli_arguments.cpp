#include <algorithm>

#include "app/cli/cli_command.hpp"

namespace counterpoise::cli {

bool ParsedArguments::has_flag(std::string_view name) const {
  return std::any_of(options.begin(), options.end(), [&](const auto& o) { return o.first == name; });
}

std::string ParsedArguments::option_or(std::string_view name, std::string fallback) const {
  for (const auto& [key, value] : options)
    if (key == name) return value;
  return fallback;
}

ParsedArguments parse_arguments(const std::vector<std::string>& args,
                                std::initializer_list<std::string_view> flags,
                                std::initializer_list<std::string_view> valued) {
  ParsedArguments parsed;
  for (std::size_t i = 0; i < args.size(); ++i) {
    const std::string& arg = args[i];
    if (arg.size() < 2 || arg[0] != '-' || arg == "-") {
      parsed.positional.push_back(arg);
      continue;
    }
    std::string name = arg, value;
    if (auto eq = arg.find('='); eq != std::string::npos) name = arg.substr(0, eq), value = arg.substr(eq + 1);
    const bool is_flag = std::find(flags.begin(), flags.end(), name) != flags.end();
    const bool is_valued = std::find(valued.begin(), valued.end(), name) != valued.end();
    if (is_flag) {
      parsed.options.emplace_back(name, "");
    } else if (is_valued) {
      if (arg.find('=') == std::string::npos) {
        if (i + 1 >= args.size()) throw UsageError{"option " + name + " needs a value"};
        value = args[++i];
      }
      parsed.options.emplace_back(name, value);
    } else {
      throw UsageError{"unknown option " + name};
    }
  }
  return parsed;
}

}  // namespace counterpoise::cli
