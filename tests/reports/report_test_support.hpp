#pragma once
// Helpers for the report tests: demo cases, cases from JSON text, a headless QGuiApplication,
// temporary folders and running poppler-utils.

#include <QByteArray>
#include <QGuiApplication>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <memory>
#include <sstream>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "reports/report_model.hpp"

namespace counterpoise::reports::testing {

inline std::filesystem::path demo_dir() { return COUNTERPOISE_DEMO_DIR; }

inline std::vector<std::filesystem::path> demo_cases() {
  std::vector<std::filesystem::path> cases;
  for (const auto& entry : std::filesystem::directory_iterator(demo_dir()))
    if (entry.path().extension() == ".json") cases.push_back(entry.path());
  std::sort(cases.begin(), cases.end());
  return cases;
}

inline casefile::Case load_case(const std::filesystem::path& path) {
  auto read = interchange::read_case_file(path);
  if (!read.value) FAIL("demo case " << path << " does not read: " << read.diagnostics.problems().front().text());
  return std::move(*read.value);
}

inline casefile::Case case_from_json(const std::string& text) {
  auto read = interchange::read_case(nlohmann::json::parse(text), ".");
  if (!read.value) FAIL("case does not read: " << read.diagnostics.problems().front().text());
  return std::move(*read.value);
}

// A one-item case around `item` (a JSON object text) with optional extra top-level members.
inline std::string case_text(const std::string& items, const std::string& extra = "") {
  return R"json({"format": "counterpoise.case", "version": 1,
    "case": {"reference": "HV-TEST-1", "title": "Test case", "laboratory": "Vale Forensic Laboratory (fictional)",
             "examiner": "Dr Ada Penhallow", "date": "2026-05-04",
             "purpose": "To help address whether the glass on the coat came from the window of 3 Tanner Row."},
    "propositions": {"level": "source", "hp": "The glass came from the window of 3 Tanner Row",
                     "hd": "The glass came from another source"},
    "items": [)json" + items + "]" + extra + "}";
}

inline std::string all_text(const ReportModel& model) {
  std::string text;
  for (const auto& s : model.sections) {
    text += s.heading + "\n";
    for (const auto& b : s.blocks) {
      if (const auto* p = std::get_if<Paragraph>(&b)) text += p->label + " " + p->text + "\n";
      if (const auto* t = std::get_if<Table>(&b))
        for (const auto& row : t->rows)
          for (const auto& cell : row) text += cell + "\n";
    }
  }
  return text;
}

inline std::string section_text(const ReportModel& model, const std::string& id) {
  ReportModel one;
  if (const auto* s = model.find(id)) one.sections.push_back(*s);
  return all_text(one);
}

// The Qt application every PDF test needs; offscreen unless the environment says otherwise.
// It is never destroyed: tearing Qt down during static destruction at exit can crash.
inline void ensure_gui() {
  if (QCoreApplication::instance()) return;
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", QByteArray("offscreen"));
  static int argc = 1;
  static char name[] = "test_reports";
  static char* argv[] = {name, nullptr};
  new QGuiApplication(argc, argv);  // deliberately kept until the process ends
}

inline std::filesystem::path temp_dir(const std::string& name) {
  auto dir = std::filesystem::temp_directory_path() / ("counterpoise-report-tests-" + std::to_string(::getpid())) / name;
  std::filesystem::remove_all(dir);
  std::filesystem::create_directories(dir);
  return dir;
}

struct RunResult {
  int exit_code = -1;
  std::string output;  // stdout and stderr together
};

// Runs a shell command and collects what it prints.
inline RunResult run(const std::string& command) {
  RunResult result;
  FILE* pipe = ::popen((command + " 2>&1").c_str(), "r");
  if (!pipe) return result;
  std::array<char, 4096> buffer{};
  while (std::size_t n = std::fread(buffer.data(), 1, buffer.size(), pipe)) result.output.append(buffer.data(), n);
  const int status = ::pclose(pipe);
  result.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return result;
}

inline std::string quoted(const std::filesystem::path& path) { return "'" + path.string() + "'"; }

inline std::string read_file(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
}

inline void write_file(const std::filesystem::path& path, const std::string& bytes) {
  std::ofstream out(path, std::ios::binary);
  out << bytes;
}

// pdftotext of the whole file (or of one page), in reading order; lines joined by spaces so a
// sentence that wraps still matches.
inline std::string pdf_text(const std::filesystem::path& pdf, int page = 0, bool join_lines = true) {
  std::string command = "pdftotext -enc UTF-8 ";
  if (page > 0) command += "-f " + std::to_string(page) + " -l " + std::to_string(page) + " ";
  const auto r = run(command + quoted(pdf) + " -");
  REQUIRE(r.exit_code == 0);
  if (!join_lines) return r.output;
  std::string text;
  for (char c : r.output) {
    const char d = c == '\n' || c == '\f' ? ' ' : c;
    if (d == ' ' && !text.empty() && text.back() == ' ') continue;
    text += d;
  }
  return text;
}

// The text as pdftotext gives it back: the narrow no-break space (U+202F) that groups digits
// extracts as a plain space.
inline std::string as_extracted(std::string text) {
  for (std::size_t at = text.find("\u202f"); at != std::string::npos; at = text.find("\u202f", at))
    text.replace(at, 3, " ");
  return text;
}

// A text with its white space runs collapsed to single spaces, as pdf_text gives it.
inline std::string collapsed(const std::string& raw) {
  const std::string text = as_extracted(raw);
  std::string out;
  for (char c : text) {
    const char d = c == '\n' ? ' ' : c;
    if (d == ' ' && !out.empty() && out.back() == ' ') continue;
    out += d;
  }
  return out;
}

}  // namespace counterpoise::reports::testing
