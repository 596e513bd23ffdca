#include "core/guard/wording_model.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <ostream>

#include "core/platform/sha256.hpp"
#include "core/platform/shipped_data.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

namespace {

constexpr const char* kFormat = "counterpoise-wording-model";

std::vector<std::string_view> split_tabs(std::string_view line) {
  std::vector<std::string_view> fields;
  for (std::size_t at = 0;;) {
    const std::size_t tab = line.find('\t', at);
    fields.push_back(line.substr(at, tab == std::string_view::npos ? std::string_view::npos : tab - at));
    if (tab == std::string_view::npos) return fields;
    at = tab + 1;
  }
}

double parse_number(std::string_view text, const validation::Location& where) {
  double value = 0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
    throw validation::InvalidValue(where, "'" + std::string(text) + "' is not a finite number");
  return value;
}

}  // namespace

WordingModel::WordingModel(std::vector<std::string> classes, double threshold)
    : classes_(std::move(classes)), threshold_(threshold) {
  if (classes_.size() < 2 || classes_.front() != "none")
    throw validation::InvalidValue({"wording model", "classes"}, "the classes must start with 'none' and name at least one family");
  if (!(threshold_ > 0 && threshold_ <= 1))
    throw validation::InvalidValue({"wording model", "threshold"}, "the threshold must lie in (0, 1]");
}

void WordingModel::set_weights(const std::string& feature, std::vector<double> weights) {
  if (weights.size() != classes_.size())
    throw validation::InvalidValue({"wording model", "weights"}, "feature '" + feature + "' has " +
                                   std::to_string(weights.size()) + " weights for " +
                                   std::to_string(classes_.size()) + " classes");
  if (!std::all_of(weights.begin(), weights.end(), [](double w) { return std::isfinite(w); }))
    throw validation::InvalidValue({"wording model", "weights"}, "feature '" + feature + "' has a weight that is not finite");
  weights_[feature] = std::move(weights);
}

std::vector<double> WordingModel::probabilities(const std::vector<std::string>& features) const {
  std::vector<double> score(classes_.size(), 0.0);
  for (const std::string& f : features) {
    const auto found = weights_.find(f);
    if (found == weights_.end()) continue;
    for (std::size_t c = 0; c < score.size(); ++c) score[c] += found->second[c];
  }
  // Softmax with the largest score taken out first, so no exponential overflows.
  const double top = *std::max_element(score.begin(), score.end());
  double sum = 0;
  for (double& s : score) sum += (s = std::exp(s - top));
  for (double& s : score) s /= sum;
  return score;
}

LearnedReading WordingModel::read(const std::vector<std::string>& features) const {
  const std::vector<double> p = probabilities(features);
  LearnedReading reading;
  reading.error_probability = 1.0 - p.front();
  const auto best = std::max_element(p.begin() + 1, p.end());
  const std::size_t family = static_cast<std::size_t>(best - p.begin());
  reading.family = classes_[family];
  reading.family_probability = *best;
  std::vector<std::pair<double, std::string>> towards;
  for (const std::string& f : features) {
    const auto found = weights_.find(f);
    // Only words: the structure, the mode and quotation weigh but name nothing a writer can change.
    const bool word_feature = f.rfind("mode:", 0) != 0 && f.rfind("class:", 0) != 0 && f.rfind("frame:", 0) != 0 &&
                              f.rfind("quoted:", 0) != 0;
    if (found == weights_.end() || !word_feature) continue;
    const double lean = found->second[family] - found->second.front();
    if (lean > 0) towards.emplace_back(lean, f.front() == '^' ? f.substr(1) : f);
  }
  std::sort(towards.begin(), towards.end(), [](const auto& a, const auto& b) { return a.first > b.first; });
  for (std::size_t k = 0; k < towards.size() && reading.weightiest.size() < 3; ++k)
    if (std::find(reading.weightiest.begin(), reading.weightiest.end(), towards[k].second) == reading.weightiest.end())
      reading.weightiest.push_back(towards[k].second);
  return reading;
}

void WordingModel::write(std::ostream& out) const {
  out << kFormat << "\t1\n";
  char number[32];
  const auto text = [&](double x) {
    const auto [end, error] = std::to_chars(number, number + sizeof number, x, std::chars_format::general, 6);
    return std::string_view(number, static_cast<std::size_t>(end - number));
  };
  out << "threshold\t" << text(threshold_) << "\n";
  out << "classes";
  for (const std::string& c : classes_) out << "\t" << c;
  out << "\n";
  for (const std::string& line : provenance_) out << line << "\n";
  // Sorted, so the same model always writes the same bytes.
  std::vector<const std::pair<const std::string, std::vector<double>>*> sorted;
  for (const auto& entry : weights_) sorted.push_back(&entry);
  std::sort(sorted.begin(), sorted.end(), [](auto* a, auto* b) { return a->first < b->first; });
  for (const auto* entry : sorted) {
    out << "w\t" << entry->first;
    for (double w : entry->second) out << "\t" << text(w);
    out << "\n";
  }
}

WordingModel WordingModel::read_file(const std::filesystem::path& path) {
  const std::string content = reading::read_text_file(path, {path.string(), ""});
  std::vector<std::string_view> lines;
  for (std::size_t at = 0; at < content.size();) {
    const std::size_t end = std::min(content.find('\n', at), content.size());
    lines.push_back(std::string_view(content).substr(at, end - at));
    at = end + 1;
  }
  const auto where = [&](std::size_t index, const std::string& field) {
    return validation::Location{path.string() + " line " + std::to_string(index + 1), field};
  };
  if (lines.size() < 3 || split_tabs(lines[0]) != std::vector<std::string_view>{kFormat, "1"})
    throw validation::InvalidValue(where(0, "format"), std::string("not a wording model file (expected '") + kFormat +
                                                            "', version 1, then a threshold and the classes)");
  const auto threshold_line = split_tabs(lines[1]);
  if (threshold_line.size() != 2 || threshold_line[0] != "threshold")
    throw validation::InvalidValue(where(1, "threshold"), "expected 'threshold', a tab and a number");
  const auto class_line = split_tabs(lines[2]);
  if (class_line.size() < 3 || class_line[0] != "classes")
    throw validation::InvalidValue(where(2, "classes"), "expected 'classes' and at least 'none' and one family");
  WordingModel model(std::vector<std::string>(class_line.begin() + 1, class_line.end()),
                     parse_number(threshold_line[1], where(1, "threshold")));
  for (std::size_t i = 3; i < lines.size(); ++i) {
    if (lines[i].empty()) continue;
    const auto fields = split_tabs(lines[i]);
    if (fields[0] == "trained-on" || fields[0] == "settings") {
      model.add_provenance(std::string(lines[i]));
      continue;
    }
    if (fields[0] != "w" || fields.size() != model.classes_.size() + 2 || fields[1].empty())
      throw validation::InvalidValue(where(i, "weights"), "expected 'w', a feature and " +
                                     std::to_string(model.classes_.size()) + " weights, separated by tabs");
    std::vector<double> weights;
    for (std::size_t k = 2; k < fields.size(); ++k) weights.push_back(parse_number(fields[k], where(i, "weights")));
    model.set_weights(std::string(fields[1]), std::move(weights));
  }
  model.file_sha256_ = platform::sha256_hex(content);
  return model;
}

std::filesystem::path default_wording_model_path() {
  return platform::shipped_data_dir() / "guard" / "wording-model.tsv";
}

}  // namespace counterpoise::guard
