// check-wording: runs the reasoning guard's wording checker over a text file (or standard input)
// and prints each finding with its place, rule, explanation and suggested rewrite.
#include <fstream>
#include <iostream>
#include <iterator>
#include <sstream>

#include <nlohmann/json.hpp>

#include "app/cli/cli_command.hpp"
#include "app/cli/json_output.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::cli {

namespace {

// 1-based line and column (in code points) of a byte offset, for editor-style locations.
std::pair<std::size_t, std::size_t> line_and_column(std::string_view text, std::size_t byte) {
  std::size_t line = 1, column = 1;
  for (std::size_t i = 0; i < byte && i < text.size(); ++i) {
    if (text[i] == '\n') {
      ++line;
      column = 1;
    } else if ((static_cast<unsigned char>(text[i]) & 0xC0) != 0x80) {
      ++column;
    }
  }
  return {line, column};
}

nlohmann::json span_json(const guard::TextSpan& s) {
  return {{"byte_begin", s.byte_begin},
          {"byte_end", s.byte_end},
          {"code_point_begin", s.code_point_begin},
          {"code_point_end", s.code_point_end},
          {"utf16_begin", s.utf16_begin},
          {"utf16_end", s.utf16_end}};
}

}  // namespace

int run_check_wording(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const ParsedArguments parsed = parse_arguments(args, {"--json"}, {"--mode", "--rules", "--hp", "--hd"});
  if (parsed.positional.size() != 1) throw UsageError{"give one FILE, or - for standard input"};
  guard::CheckOptions options;
  const std::string mode = parsed.option_or("--mode", "casework");
  if (mode == "casework") options.mode = guard::CheckMode::casework;
  else if (mode == "training") options.mode = guard::CheckMode::training;
  else throw UsageError{"--mode must be casework or training, not '" + mode + "'"};
  options.hp = parsed.option_or("--hp", "");
  options.hd = parsed.option_or("--hd", "");
  const std::string& name = parsed.positional.front();

  std::string text;
  if (name == "-") {
    text.assign(std::istreambuf_iterator<char>(std::cin), std::istreambuf_iterator<char>());
  } else {
    std::ifstream in(name, std::ios::binary);
    if (!in) {
      err << "counterpoise-cli check-wording: cannot read '" << name << "'\n";
      return kExitInvalidInput;
    }
    text.assign(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  }

  std::vector<guard::WordingFinding> findings;
  try {
    guard::WordingChecker checker = guard::WordingChecker::load_default();
    if (parsed.has_flag("--rules")) checker.add_rules_from_file(parsed.option_or("--rules", ""));
    findings = checker.check(text, options);
  } catch (const validation::Error& e) {
    err << "counterpoise-cli check-wording: " << (name == "-" ? "standard input" : name) << ": " << e.what() << "\n";
    return kExitInvalidInput;
  }

  const std::string shown = name == "-" ? "<stdin>" : name;
  if (parsed.has_flag("--json")) {
    nlohmann::json list = nlohmann::json::array();
    for (const auto& f : findings) {
      const auto [line, column] = line_and_column(text, f.span.byte_begin);
      list.push_back({{"rule_id", f.rule_id},
                      {"family", f.family},
                      {"family_name", f.family_name},
                      {"severity", std::string(guard::severity_name(f.severity))},
                      {"assertion", std::string(guard::assertion_name(f.assertion))},
                      {"text", f.matched_text},
                      {"line", line},
                      {"column", column},
                      {"span", span_json(f.span)},
                      {"sentence", span_json(f.sentence)},
                      {"explanation", f.explanation},
                      {"suggestion", f.suggestion}});
    }
    print_json(out, nlohmann::json{{"file", shown},
                                   {"mode", mode},
                                   {"flagged", guard::has_flagged(findings)},
                                   {"findings", list}});
  } else {
    for (const auto& f : findings) {
      const auto [line, column] = line_and_column(text, f.span.byte_begin);
      out << shown << ":" << line << ":" << column << ": " << guard::severity_name(f.severity) << " [" << f.rule_id
          << "] " << f.family_name << "\n"
          << "  wording:    \"" << f.matched_text << "\"\n"
          << "  why:        " << f.explanation << "\n"
          << "  instead:    " << f.suggestion << "\n";
    }
    std::size_t flagged = 0;
    for (const auto& f : findings) flagged += f.severity == guard::Severity::advice ? 0 : 1;
    out << shown << ": " << flagged << " statement(s) to correct, " << findings.size() - flagged
        << " note(s) of advice (" << mode << " mode)\n";
  }
  return guard::has_flagged(findings) ? kExitFlagged : kExitOk;
}

}  // namespace counterpoise::cli
