// The hostile-files corpus (tests/data/hostile): files made to attack the person who opens them.
// Each must be refused with a clean message — exit 1, not a crash; a message naming the item and
// field; nothing printed that a terminal would act on (validation::display_lines leaves the
// message unchanged); no content of a private file echoed; a short message. The rules are those
// of docs/file-formats.md ("Trust model", "Limits"); the terminal sequences are ECMA-48's
// (ECMA-48, 5th edition 1991: OSC 8.3.89, CSI 5.4, ED 8.3.39). The smallest positive double is
// 2^-1074 (IEEE 754-2008, section 3.6).
#include <catch2/catch.hpp>

#include <string>
#include <tuple>

#include "core/validation/display_text.hpp"
#include "tests/app/cli_run.hpp"

namespace {

std::string corpus(const std::string& name) {
  return std::string("'") + COUNTERPOISE_TEST_DATA_DIR + "/hostile/" + name + "'";
}

}  // namespace

TEST_CASE("every file of the hostile corpus is refused with a clean message") {
  // file, what the message must say
  const auto [file, expected] = GENERATE(table<std::string, std::string>({
      {"absolute-path.json", "item D1, field frequencies.file: '/etc/passwd' lies outside the case's folder"},
      {"climbs-out.json", "item D1, field frequencies.file: '../../../../../../../../etc/hostname' (which leads to"},
      {"process-environment.json", "item G1, field population.kde.file: '/proc/self/environ' (which leads to"},
      {"link-out.json", "item D1, field frequencies.file: 'link-out.csv' (which leads to '/etc/passwd') lies outside"},
      {"scale-outside.json", "item verbal_scale, field file: '/etc/passwd' lies outside"},
      {"rules-outside.json", "item guard, field rules[0]: '../../../../../../etc/passwd' (which leads to"},
      {"nul-table.json", "item D1, field frequencies.file: nul-table.csv: not a text table (a NUL byte at byte 19)"},
      {"folder-as-table.json", "is not a regular file"},
      {"underflow.json", "item E2, field p_given_hd: "},
      {"null-log10-lr.json", "item E1, field log10_lr: is null"},
      {"terminal-sequences.json", "unknown model \"\\x1b]0;owned\\x07\\x1b[2J\\u{9b}31m\""},
      {"invalid-utf8.json", "JSON syntax error at line 1"},
      {"truncated.json", "JSON syntax error"},
      {"deep-nesting.json", "nested more than 64 levels"},
      {"duplicate-member.json", "a member name appears twice"},
      {"overflow.json", "too large to represent"},
  }));
  for (const char* command : {"validate ", "evaluate "}) {
    CAPTURE(file, command);
    const auto run = cli_run::run_cli(command + corpus(file));
    CHECK(run.exit_code == 1);
    CHECK(run.out.empty());
    CHECK_THAT(run.err, Catch::Contains(expected));
    CHECK(counterpoise::validation::display_lines(run.err) == run.err);
    CHECK(run.err.size() < 2000);
    // Nothing of the private files reaches the message.
    CHECK(run.err.find("root:") == std::string::npos);
    CHECK(run.err.find("PATH=") == std::string::npos);
  }
}

TEST_CASE("a file outside the case's folder is read when the user allows it for the run") {
  // The same case, allowed: the link's target is read — and, being no frequency table, refused
  // for its content, without quoting it.
  const auto run = cli_run::run_cli("validate --allow-data-outside " + corpus("link-out.json"));
  CHECK(run.exit_code == 1);
  CHECK(run.err.find("lies outside") == std::string::npos);
  CHECK_THAT(run.err, Catch::Contains("item D1, field frequencies.file: link-out.csv line"));
  CHECK(run.err.find("root") == std::string::npos);
  CHECK(run.err.find("daemon") == std::string::npos);
  CHECK(counterpoise::validation::display_lines(run.err) == run.err);
}
