// Benchmark of hostile inputs (docs/file-formats.md, "Limits"): time and peak memory of reading
// what an attacker would send, each measured in a child process of its own (peak resident memory
// above the child's start, Linux /proc/self/status VmHWM after a reset through
// /proc/self/clear_refs). Side by side: the JSON reader against nlohmann::json's DOM parser with a
// parser callback (the earlier reader), whose cost grows with the square of the number of objects.
// Figures are printed, never asserted; record them in docs/performance.md.
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <fstream>
#include <functional>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "core/interchange/case_json.hpp"
#include "core/reading/csv_table.hpp"
#include "core/reading/json_text.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

long status_kib(const std::string& field) {
  std::ifstream status("/proc/self/status");
  std::string line;
  while (std::getline(status, line))
    if (line.rfind(field + ":", 0) == 0) return std::stol(line.substr(field.size() + 1));
  return -1;
}

struct Figures {
  double milliseconds = 0;
  double peak_mib = 0;  // resident memory above the start of the work
  bool refused = false;
};

// Runs `work` in a child process; `work` returns whether the input was refused.
Figures measure(const std::function<bool()>& work) {
  int channel[2];
  if (::pipe(channel) != 0) return {};
  const pid_t child = ::fork();
  if (child == 0) {
    ::close(channel[0]);
    std::ofstream("/proc/self/clear_refs") << "5";  // the peak starts again from here
    const long start_kib = status_kib("VmRSS");
    const auto start = std::chrono::steady_clock::now();
    const bool refused = work();
    Figures f;
    f.milliseconds = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count();
    f.peak_mib = static_cast<double>(status_kib("VmHWM") - start_kib) / 1024.0;
    f.refused = refused;
    [[maybe_unused]] auto written = ::write(channel[1], &f, sizeof f);
    ::_exit(0);
  }
  ::close(channel[1]);
  Figures f;
  [[maybe_unused]] auto got = ::read(channel[0], &f, sizeof f);
  ::close(channel[0]);
  ::waitpid(child, nullptr, 0);
  return f;
}

void print(const char* what, std::size_t input_bytes, const Figures& f) {
  const double input_mib = static_cast<double>(input_bytes) / (1024.0 * 1024.0);
  std::printf("%-58s %9.2f MiB %10.1f ms %9.1f MiB peak %6.1f x input%s\n", what, input_mib, f.milliseconds, f.peak_mib,
              input_mib > 0 ? f.peak_mib / input_mib : 0.0, f.refused ? "  (refused)" : "");
}

std::string empty_objects(std::size_t count) {
  std::string text = "[";
  for (std::size_t i = 0; i < count; ++i) text += i ? ",{}" : "{}";
  return text + "]";
}

bool bounded_read(const std::string& text) {
  try {
    reading::parse_json_text(text, "bench.json");
    return false;
  } catch (const validation::Error&) {
    return true;
  }
}

bool callback_read(const std::string& text) {
  // The earlier reader's shape: the DOM parser with a callback that sees every event.
  const json document = json::parse(text, [](int, json::parse_event_t, json&) { return true; });
  return document.is_discarded();
}

std::string case_head() {
  return R"({"format": "counterpoise.case", "version": 1, "case": {"reference": "HV-BENCH", "title": ")";
}

std::string case_with_title(std::size_t title_bytes) {
  return case_head() + std::string(title_bytes, 'x') +
         R"("}, "propositions": {"level": "source", "hp": "a", "hd": "b"},
             "items": [{"id": "E1", "model": "reported-lr", "lr": 10}]})";
}

std::string case_with_items(std::size_t items) {
  std::string text = case_head() + R"(t"}, "propositions": {"level": "source", "hp": "a", "hd": "b"}, "items": [)";
  for (std::size_t i = 0; i < items; ++i)
    text += (i ? "," : "") + std::string(R"({"id": "E)") + std::to_string(i) +
            R"(", "model": "assigned", "p_given_hp": 0.9, "p_given_hd": {"counts": {"k": 3, "n": 412}}})";
  return text + "]}";
}

std::string dense_network_case(std::size_t roots) {
  json nodes = json::array({{{"name", "H"}, {"states", {"hp", "hd"}}}});
  json observed = json::object();
  for (std::size_t i = 0; i < roots; ++i)
    nodes.push_back({{"name", "A" + std::to_string(i)}, {"states", {"y", "n"}}, {"parents", {"H"}},
                     {"cpt", {{0.5, "complement"}, {0.4, "complement"}}}});
  for (std::size_t i = 0; i < roots; ++i)
    for (std::size_t j = i + 1; j < roots; ++j) {
      const std::string name = "F" + std::to_string(i) + "_" + std::to_string(j);
      nodes.push_back({{"name", name}, {"states", {"y", "n"}},
                       {"parents", {"A" + std::to_string(i), "A" + std::to_string(j)}},
                       {"cpt", {{0.9, "complement"}, {0.5, "complement"}, {0.5, "complement"}, {0.1, "complement"}}}});
      observed[name] = "y";
    }
  json document = {{"format", "counterpoise.case"}, {"version", 1}, {"case", {{"reference", "HV-NET"}}},
                   {"propositions", {{"level", "activity"}, {"hp", "a"}, {"hd", "b"}}},
                   {"items", {{{"id", "N1"}, {"model", "network"}, {"nodes", nodes},
                               {"proposition", {{"node", "H"}, {"hp", "hp"}, {"hd", "hd"}}}, {"observed", observed}}}}};
  return document.dump();
}

bool read_case_text(const std::string& text) {
  try {
    const auto result = interchange::read_case(reading::parse_json_text(text, "bench.json"), ".");
    return !result.value;
  } catch (const validation::Error&) {
    return true;
  }
}

std::string background_csv(std::size_t rows) {
  std::ostringstream out;
  out << "# invented refractive indices\nsource,ri\n";
  for (std::size_t i = 0; i < rows; ++i) out << "S" << i << "," << 1.515 + static_cast<double>(i % 997) * 1e-5 << "\n";
  return out.str();
}

bool read_csv_column(const std::string& text) {
  const validation::Location where{"G1", "population.kde.file"};
  const auto table = reading::parse_csv(text, "background.csv", where);
  const std::size_t column = table.require_column("ri", where);
  double sum = 0;
  for (const auto& row : table.rows) sum += reading::csv_number(table, row, column, where);
  return sum < 0;
}

}  // namespace

int main() {
  std::printf("Hostile inputs: time and peak memory above the start, each in its own process.\n\n");
  std::printf("JSON array of empty objects: the bounded SAX reader against the DOM parser with a callback\n");
  for (std::size_t n : {12'500, 25'000, 50'000}) {
    const std::string text = empty_objects(n);
    const std::string label = std::to_string(n) + " objects, DOM parser with callback";
    print(label.c_str(), text.size(), measure([&] { return callback_read(text); }));
  }
  for (std::size_t n : {12'500, 25'000, 50'000, 400'000}) {
    const std::string text = empty_objects(n);
    const std::string label = std::to_string(n) + " objects, bounded reader";
    print(label.c_str(), text.size(), measure([&] { return bounded_read(text); }));
  }
  std::printf("\nCases at and beyond the limits (parse + read_case)\n");
  {
    const std::string at_limit = case_with_title(1u << 20);
    print("title of 1 MiB (the limit for one text)", at_limit.size(), measure([&] { return read_case_text(at_limit); }));
    const std::string beyond = case_with_title(16u << 20);
    print("title of 16 MiB", beyond.size(), measure([&] { return read_case_text(beyond); }));
  }
  {
    const std::string at_limit = case_with_items(interchange::kMaxCaseItems);
    print("10,000 items (the limit)", at_limit.size(), measure([&] { return read_case_text(at_limit); }));
    const std::string beyond = case_with_items(100'000);
    print("100,000 items", beyond.size(), measure([&] { return read_case_text(beyond); }));
  }
  {
    const std::string dense = dense_network_case(24);
    print("dense network: 24 roots, 276 observed pairs", dense.size(), measure([&] { return read_case_text(dense); }));
  }
  std::printf("\nBackground CSV (parse, then one column read as numbers)\n");
  for (std::size_t rows : {100'000, 1'000'000, 3'000'000}) {
    const std::string text = background_csv(rows);
    const std::string label = std::to_string(rows) + " rows";
    print(label.c_str(), text.size(), measure([&] { return read_csv_column(text); }));
  }
  return 0;
}
