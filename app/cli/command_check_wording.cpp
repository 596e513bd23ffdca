// check-wording: runs the reasoning guard's wording checker over a text file (or standard input)
// and prints each finding with its place, rule, explanation and suggested rewrite.
#include <fstream>
#include <iostream>
#include <optional>

#include <nlohmann/json.hpp>

#include "app/cli/cli_command.hpp"
#include "app/cli/json_output.hpp"
#include "core/guard/wording_stream.hpp"
#include "core/validation/display_text.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::cli {

namespace {

nlohmann::json span_json(const guard::TextSpan& s) {
  return {{"byte_begin", s.byte_begin},
          {"byte_end", s.byte_end},
          {"code_point_begin", s.code_point_begin},
          {"code_point_end", s.code_point_end},
          {"utf16_begin", s.utf16_begin},
          {"utf16_end", s.utf16_end}};
}

nlohmann::json finding_json(const guard::WordingFinding& f, const guard::TextPlace& place) {
  return {{"rule_id", f.rule_id},
          {"family", f.family},
          {"family_name", f.family_name},
          {"severity", std::string(guard::severity_name(f.severity))},
          {"assertion", std::string(guard::assertion_name(f.assertion))},
          {"text", f.matched_text},
          {"line", place.line},
          {"column", place.column},
          {"span", span_json(f.span)},
          {"sentence", span_json(f.sentence)},
          {"explanation", f.explanation},
          {"suggestion", f.suggestion}};
}

// `text` with every line after the first indented by `indent` spaces (a nested JSON value).
std::string indented(const std::string& text, std::size_t indent) {
  std::string out;
  for (char c : text) {
    out += c;
    if (c == '\n') out.append(indent, ' ');
  }
  return out;
}

}  // namespace

// The text is read and checked sentence by sentence (guard::check_stream), and each finding is
// printed as it is found, so memory stays bounded however long the text is. In --json mode the
// document is written as it goes and is completed (with "error" set) when the input turns out
// to be unreadable part way.
int run_check_wording(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const ParsedArguments parsed = parse_arguments(args, {"--json", "--rules-only"}, {"--mode", "--rules", "--hp", "--hd"});
  if (parsed.positional.size() != 1) throw UsageError{"give one FILE, or - for standard input"};
  guard::CheckOptions options;
  const std::string mode = parsed.option_or("--mode", "casework");
  if (mode == "casework") options.mode = guard::CheckMode::casework;
  else if (mode == "training") options.mode = guard::CheckMode::training;
  else throw UsageError{"--mode must be casework or training, not '" + mode + "'"};
  options.hp = parsed.option_or("--hp", "");
  options.hd = parsed.option_or("--hd", "");
  options.learned_reading = !parsed.has_flag("--rules-only");
  const std::string& name = parsed.positional.front();
  const std::string shown = name == "-" ? "<stdin>" : name;
  const std::string shown_text = validation::display_text(shown);
  const bool as_json = parsed.has_flag("--json");

  std::ifstream file;
  if (name != "-") {
    file.open(name, std::ios::binary);
    if (!file) {
      err << "counterpoise-cli check-wording: cannot read '" << name << "'\n";
      return kExitInvalidInput;
    }
  }
  std::istream& in = name == "-" ? std::cin : file;

  std::optional<guard::WordingChecker> checker;
  try {
    checker = guard::WordingChecker::load_default();
    if (parsed.has_flag("--rules")) checker->add_rules_from_file(parsed.option_or("--rules", ""));
  } catch (const validation::Error& e) {
    err << "counterpoise-cli check-wording: " << e.what() << "\n";
    return kExitInvalidInput;
  }

  std::size_t flagged = 0, advice = 0;
  if (as_json) out << "{\n  \"file\": " << json_text(shown) << ",\n  \"mode\": " << json_text(mode)
                   << ",\n  \"findings\": [";
  const auto print = [&](const guard::WordingFinding& f, const guard::TextPlace& place) {
    if (as_json) {
      out << (flagged + advice == 0 ? "\n    " : ",\n    ") << indented(json_text(finding_json(f, place), 2), 4);
    } else {
      out << shown_text << ":" << place.line << ":" << place.column << ": " << guard::severity_name(f.severity) << " ["
          << f.rule_id << "] " << f.family_name << "\n"
          << "  wording:    \"" << validation::display_text(f.matched_text) << "\"\n"
          << "  why:        " << f.explanation << "\n"
          << "  instead:    " << f.suggestion << "\n";
    }
    ++(f.severity == guard::Severity::advice ? advice : flagged);
  };
  std::optional<std::string> failure;
  try {
    guard::check_stream(*checker, in, options, print);
  } catch (const validation::Error& e) {
    failure = std::string(e.what());
  }
  if (!in.eof() && in.bad() && !failure) failure = "reading stopped part way (input error)";

  if (as_json) {
    out << (flagged + advice == 0 ? "],\n" : "\n  ],\n") << "  \"flagged\": " << (flagged > 0 ? "true" : "false");
    if (failure) out << ",\n  \"error\": " << json_text(*failure);
    out << "\n}\n";
  } else {
    out << shown_text << ": " << flagged << " statement(s) to correct, " << advice << " note(s) of advice (" << mode
        << " mode)" << (failure ? ", checking stopped at an error" : "") << "\n";
  }
  if (failure) {
    err << "counterpoise-cli check-wording: " << (name == "-" ? "standard input" : name) << ": " << *failure << "\n";
    return kExitInvalidInput;
  }
  return flagged > 0 ? kExitFlagged : kExitOk;
}

}  // namespace counterpoise::cli
