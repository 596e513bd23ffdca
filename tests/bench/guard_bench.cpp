// Benchmark (measured, not asserted) of the reasoning guard's wording checker:
// 1. precision and recall per family, overall, and the confusion matrix on the development
//    split(s) of the wording corpus and on the held-out split (tests/data/guard/). Only the
//    aggregate figures of the held-out split are printed: its sentences and its
//    misclassifications are never shown, so nothing is tuned on them. Beside the shipped
//    checker (rules and learned reading), each split is scored by the rules alone and, for a
//    development split, with a learned reading trained on the other development splits only
//    (leave one split out), the fair figure for a split the shipped model was trained on.
// 2. speed: a statement of about 10 000 words (target < 100 ms), 1 000 short item texts
//    (target < 0.2 s in all), the rules matched with and without the per-sentence class cache
//    side by side, check-wording's line/column bookkeeping against recounting from the start
//    for each finding, and streamed checks of a long text and of NUL bytes with the peak
//    resident memory.
// Usage: bench_guard [megabytes of streamed prose (default 50)] [megabytes of NUL bytes (default 10)]
#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <iterator>
#include <iostream>
#include <sstream>
#include <streambuf>
#include <string>
#include <vector>

#include "bench_timer.hpp"
#include "core/guard/wording_corpus.hpp"
#include "core/guard/wording_model_training.hpp"
#include "core/guard/wording_stream.hpp"

using namespace counterpoise;
using namespace counterpoise::guard;

namespace {

using bench::median_milliseconds;

const std::filesystem::path kCorpusDir = std::filesystem::path(COUNTERPOISE_TEST_DATA_DIR) / "guard";

std::string cpu_model() {
  std::ifstream in("/proc/cpuinfo");
  std::string line;
  while (std::getline(in, line))
    if (line.rfind("model name", 0) == 0) return line.substr(line.find(':') + 2);
  return "unknown";
}

double peak_megabytes() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;  // ru_maxrss is in kilobytes on Linux
}

bool is_held_out(const std::filesystem::path& p) {
  const std::string name = p.filename().string();
  return name.find("held-out") != std::string::npos || name.find("heldout") != std::string::npos;
}

void print_score(const CorpusScore& score, const std::vector<std::string>& family_order) {
  std::printf("  %-24s %5s %5s %5s %10s %8s\n", "family", "TP", "FP", "FN", "precision", "recall");
  for (const auto& family : family_order) {
    const FamilyCounts& n = score.per_family.at(family);
    std::printf("  %-24s %5d %5d %5d %10.3f %8.3f\n", family.c_str(), n.true_positive, n.false_positive,
                n.false_negative, n.precision(), n.recall());
  }
  const FamilyCounts& e = score.any_error;
  std::printf("  %-24s %5d %5d %5d %10.3f %8.3f\n", "(error vs correct)", e.true_positive, e.false_positive,
              e.false_negative, e.precision(), e.recall());
  std::vector<std::string> columns = {"none"};
  for (const auto& f : family_order)
    if (f != "overall") columns.push_back(f);
  columns.push_back("several");
  std::printf("  confusion matrix (rows: label; columns: flagged; ");
  for (std::size_t c = 0; c < columns.size(); ++c) std::printf("%s%zu=%s", c ? ", " : "", c, columns[c].c_str());
  std::printf(")\n  %-24s", "");
  for (std::size_t c = 0; c < columns.size(); ++c) std::printf(" %4zu", c);
  std::printf("\n");
  for (const auto& row : columns) {
    const auto it = score.confusion.find(row);
    if (it == score.confusion.end()) continue;
    std::printf("  %-24s", row.c_str());
    for (const auto& column : columns) {
      const auto cell = it->second.find(column);
      std::printf(" %4d", cell == it->second.end() ? 0 : cell->second);
    }
    std::printf("\n");
  }
}

// A read-only stream that repeats `unit` until `total` bytes have been given, so a long text
// is checked without being held in memory by the benchmark.
class RepeatingBuffer : public std::streambuf {
 public:
  RepeatingBuffer(std::string unit, std::size_t total) : unit_(std::move(unit)), left_(total) {}

 protected:
  int_type underflow() override {
    if (left_ == 0) return traits_type::eof();
    const std::size_t n = std::min(left_, unit_.size());
    left_ -= n;
    setg(unit_.data(), unit_.data(), unit_.data() + n);
    return traits_type::to_int_type(unit_[0]);
  }

 private:
  std::string unit_;
  std::size_t left_;
};

// check-wording's place of a byte before streaming: counted from the start for each finding.
std::pair<std::size_t, std::size_t> line_and_column_from_start(std::string_view text, std::size_t byte) {
  std::size_t line = 1, column = 1;
  for (std::size_t i = 0; i < byte && i < text.size(); ++i) {
    if (text[i] == '\n') ++line, column = 1;
    else if ((static_cast<unsigned char>(text[i]) & 0xC0) != 0x80) ++column;
  }
  return {line, column};
}

void print_summary(const char* what, const CorpusScore& score) {
  const FamilyCounts& n = score.per_family.at("overall");
  std::printf("  %-52s precision %.3f recall %.3f (error vs correct %.3f / %.3f)\n", what, n.precision(), n.recall(),
              score.any_error.precision(), score.any_error.recall());
}

}  // namespace

int main(int argc, char** argv) {
  const double prose_mb = argc > 1 ? std::atof(argv[1]) : 50.0;
  const double nul_mb = argc > 2 ? std::atof(argv[2]) : 10.0;
  std::printf("CPU: %s\n", cpu_model().c_str());
  const WordingChecker checker = WordingChecker::load_default();
  std::vector<std::string> family_order;
  for (const auto& [id, family] : checker.rules().families()) family_order.push_back(id);
  family_order.push_back("overall");

  // 1. The corpus splits.
  std::vector<std::filesystem::path> files;
  for (const auto& entry : std::filesystem::directory_iterator(kCorpusDir))
    if (entry.path().extension() == ".txt") files.push_back(entry.path());
  std::sort(files.begin(), files.end());
  std::vector<std::filesystem::path> development_files;
  std::copy_if(files.begin(), files.end(), std::back_inserter(development_files),
               [](const auto& file) { return !is_held_out(file); });
  std::vector<CorpusSentence> development;
  const WordingChecker rules_only(checker.rules());
  for (const auto& file : files) {
    const auto corpus = read_wording_corpus(file);
    const CorpusScore score = score_corpus(checker, corpus);
    std::printf("\n%s split: %s (%d sentences)\n", is_held_out(file) ? "held-out" : "development",
                file.filename().string().c_str(), score.sentences);
    print_summary("rules alone:", score_corpus(rules_only, corpus));
    if (!is_held_out(file)) {
      WordingChecker fresh(checker.rules());
      fresh.set_model(std::make_shared<const WordingModel>(
          train_wording_model_without(development_files, file, checker.rules())));
      print_summary("rules + learned reading trained without this split:", score_corpus(fresh, corpus));
    }
    print_summary("shipped (rules + learned reading):", score);
    print_score(score, family_order);
    if (is_held_out(file)) continue;  // never shown sentence by sentence
    for (const auto& line : score.misclassified) std::printf("    %s\n", line.c_str());
    development.insert(development.end(), corpus.begin(), corpus.end());
  }

  // 2. Speed. A statement of about 10 000 words from the development sentences in turn.
  std::string statement;
  std::size_t words = 0;
  for (std::size_t i = 0; words < 10000 && !development.empty(); i = (i + 1) % development.size()) {
    statement += development[i].sentence + (i % 5 == 4 ? "\n\n" : " ");
    words += static_cast<std::size_t>(std::count(development[i].sentence.begin(), development[i].sentence.end(), ' ')) + 1;
  }
  std::size_t statement_findings = 0;
  const double statement_ms = median_milliseconds(5, [&] { statement_findings = checker.check(statement).size(); });
  std::printf("\nspeed\n  statement of %zu words (%zu bytes, %zu findings): %.1f ms (target < 100 ms)\n", words,
              statement.size(), statement_findings, statement_ms);

  std::vector<std::string> items;
  for (int i = 0; i < 1000; ++i)
    items.push_back(i % 10 == 0 ? "The probability that trace " + std::to_string(i) + " came from the suspect is 1 in 1,000."
                                : "Trace " + std::to_string(i) + " could not be distinguished from the control material.");
  const double items_ms = median_milliseconds(5, [&] {
    for (const auto& text : items) (void)checker.check(text);
  });
  std::printf("  1 000 item texts checked one by one: %.1f ms in all, %.3f ms each (target < 200 ms in all)\n",
              items_ms, items_ms / 1000.0);

  // The rules' patterns over the statement's sentences, with and without the class cache.
  const auto sentences = split_sentences(statement);
  const auto match_all = [&](bool cached) {
    std::size_t matched = 0;
    for (const Sentence& s : sentences) {
      std::vector<const Token*> tokens;
      for (const Token& t : s.tokens) tokens.push_back(&t);
      ClassMatchCache cache(tokens);
      for (const WordingRule& rule : checker.rules().rules())
        matched += find_first(rule.pattern, tokens, checker.rules().classes(), 0, cached ? &cache : nullptr) ? 1 : 0;
    }
    return matched;
  };
  std::size_t with = 0, without = 0;
  const double cached_ms = median_milliseconds(3, [&] { with = match_all(true); });
  const double uncached_ms = median_milliseconds(3, [&] { without = match_all(false); });
  std::printf("  every rule's pattern over the statement: %.1f ms with the class cache, %.1f ms without (%zu = %zu matches)\n",
              cached_ms, uncached_ms, with, without);

  // check-wording's bookkeeping over about 2 MB of flagged text.
  std::string flagged_text;
  while (flagged_text.size() < 2'000'000)
    flagged_text += "The chance that this match is a coincidence is 1 in 500.\nIt is 1,000 times more likely that he was there.\n";
  std::size_t streamed = 0, line_sum = 0;
  const auto t0 = std::chrono::steady_clock::now();
  std::istringstream flagged_in(flagged_text);
  check_stream(checker, flagged_in, {}, [&](const WordingFinding&, const TextPlace& p) { ++streamed, line_sum += p.line; });
  const double stream_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  const auto findings = checker.check(flagged_text);
  const std::size_t sample = std::min<std::size_t>(findings.size(), 2000);
  const auto t1 = std::chrono::steady_clock::now();
  std::size_t recount_sum = 0;
  for (std::size_t i = findings.size() - sample; i < findings.size(); ++i)
    recount_sum += line_and_column_from_start(flagged_text, findings[i].span.byte_begin).first;
  const double recount_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t1).count();
  std::printf("  2 MB of flagged text (%zu findings): streamed with running line/column %.2f s; recounting from the "
              "start for the last %zu findings alone %.2f s (all would take about %.0f s)\n",
              streamed, stream_s, sample, recount_s, recount_s * static_cast<double>(findings.size()) / (2.0 * static_cast<double>(sample)));
  if (recount_sum == 0 || line_sum == 0) std::printf("  (no lines counted)\n");
  std::printf("  peak resident memory so far: %.0f MB\n", peak_megabytes());

  // Streamed checks of a long text and of NUL bytes.
  const auto stream_megabytes = [&](const char* what, std::string unit, double megabytes) {
    RepeatingBuffer buffer(std::move(unit), static_cast<std::size_t>(megabytes * 1e6));
    std::istream in(&buffer);
    std::size_t count = 0;
    const auto start = std::chrono::steady_clock::now();
    const std::size_t bytes = check_stream(checker, in, {}, [&](const WordingFinding&, const TextPlace&) { ++count; });
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    std::printf("  streamed %s: %.1f MB in %.2f s (%.1f MB/s), %zu findings; peak resident memory %.0f MB\n", what,
                static_cast<double>(bytes) / 1e6, seconds, static_cast<double>(bytes) / 1e6 / seconds, count,
                peak_megabytes());
  };
  stream_megabytes("prose (the statement repeated)", statement, prose_mb);
  stream_megabytes("NUL bytes", std::string(1 << 16, '\0'), nul_mb);
  return 0;
}
