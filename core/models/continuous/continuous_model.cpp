#include "core/models/continuous/continuous_model.hpp"

#include <cmath>
#include <stdexcept>

#include "core/models/item_fields.hpp"
#include "core/numbers/log10_math.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/csv_table.hpp"
#include "core/reading/json_fields.hpp"
#include "core/validation/checks.hpp"

namespace counterpoise::models::continuous {

using nlohmann::json;
using numbers::kLn10;
using numbers::LikelihoodRatio;
using validation::InvalidValue;
using validation::Location;

namespace {

double mean_of(const std::vector<double>& values) {
  double sum = 0.0;
  for (double v : values) sum += v;
  return sum / static_cast<double>(values.size());
}

const char* method_name(KdeMethod method) { return method == KdeMethod::exact ? "exact" : "fast"; }

// {"log10": L, "value": 10^L} with the value left out where it would overflow or underflow.
json density_json(double ln_density) {
  const double log10_density = ln_density / kLn10;
  json out = {{"log10", log10_density}};
  if (std::abs(log10_density) < 300.0) out["value"] = std::pow(10.0, log10_density);
  return out;
}

double log10_lr_of(const TwoLevelDensities& d) { return (d.ln_numerator - d.ln_denominator) / kLn10; }

// The density of a group mean with sampling variance `variance` about a source mean drawn from
// `population`: the between-source density with that variance added (normal: tau^2 + variance;
// kernel: h^2 + variance), as in the denominator of the two-level LR.
KdeEvaluation marginal_density(const Population& population, double mean, double variance) {
  if (const auto* normal = std::get_if<NormalPopulation>(&population))
    return KdeEvaluation{ln_normal_density(mean, normal->mean, normal->sd * normal->sd + variance), 0.0, 0};
  const auto& kde = std::get<KdePopulation>(population);
  const double h = kde.density->bandwidth();
  return kde.density->ln_density(mean, std::sqrt(h * h + variance), kde.method.value_or(KdeMethod::fast));
}

json population_json(const Population& population) {
  if (const auto* normal = std::get_if<NormalPopulation>(&population))
    return {{"normal", {{"mean", normal->mean}, {"sd", normal->sd}}}};
  const auto& kde = std::get<KdePopulation>(population);
  const KernelDensity& density = *kde.density;
  return {{"kde",
           {{"file", kde.file},
            {"column", kde.column},
            {"values", density.size()},
            {"min", density.min()},
            {"max", density.max()},
            {"bandwidth", density.bandwidth()},
            {"bandwidth_rule", kde.bandwidth ? "given" : "Silverman's rule of thumb"}}}};
}

}  // namespace

ContinuousTwoLevelModel::ContinuousTwoLevelModel(ContinuousInputs inputs, json as_written)
    : inputs_(std::move(inputs)),
      control_mean_(mean_of(inputs_.control)),
      recovered_mean_(mean_of(inputs_.recovered)),
      as_written_(std::move(as_written)) {}

GroupSummary ContinuousTwoLevelModel::summary(double sigma) const {
  const double variance = sigma * sigma;
  return GroupSummary{control_mean_, recovered_mean_, variance / static_cast<double>(inputs_.control.size()),
                      variance / static_cast<double>(inputs_.recovered.size())};
}

TwoLevelDensities ContinuousTwoLevelModel::densities(const GroupSummary& g) const {
  TwoLevelDensities d;
  if (const auto* normal = std::get_if<NormalPopulation>(&inputs_.population)) {
    const bool approximate = inputs_.form == NormalForm::approximate;
    d = approximate ? lindley_approximate(g, normal->mean, normal->sd) : lindley_exact(g, normal->mean, normal->sd);
  } else {
    const auto& kde = std::get<KdePopulation>(inputs_.population);
    d = kernel_two_level(g, *kde.density, kde.method.value_or(KdeMethod::fast));
  }
  if (!inputs_.population_hd) return d;
  // Under Hd the recovered source mean is drawn from population_hd instead: the denominator is
  // f(xbar | population) f(ybar | population_hd); the reader refuses the approximate form here.
  const KdeEvaluation control = marginal_density(inputs_.population, g.control_mean, g.control_variance);
  const KdeEvaluation recovered = marginal_density(*inputs_.population_hd, g.recovered_mean, g.recovered_variance);
  d.ln_denominator = control.ln_density + recovered.ln_density;
  d.relative_error_bound += 2.0 * recovered.relative_error_bound;
  return d;
}

double ContinuousTwoLevelModel::log10_lr_with_sd(double sigma) const { return log10_lr_of(densities(summary(sigma))); }

PointResult ContinuousTwoLevelModel::evaluate() const {
  const double sigma = inputs_.within.point();
  const GroupSummary g = summary(sigma);
  const TwoLevelDensities d = densities(g);
  PointResult result;
  result.lr = LikelihoodRatio::from_log10(log10_lr_of(d));

  json detail;
  detail["control"] = {{"count", inputs_.control.size()}, {"mean", g.control_mean}};
  detail["recovered"] = {{"count", inputs_.recovered.size()}, {"mean", g.recovered_mean}};
  detail["pooled_mean"] = g.pooled_mean();
  detail["within_sd"] = inputs_.within.detail();
  detail["variances"] = {{"control_mean", g.control_variance},
                         {"recovered_mean", g.recovered_variance},
                         {"difference_of_means", g.control_variance + g.recovered_variance},
                         {"pooled_mean", g.pooled_mean_variance()}};
  detail["numerator"] = density_json(d.ln_numerator);
  detail["denominator"] = density_json(d.ln_denominator);
  detail["log10_lr"] = log10_lr_of(d);

  if (inputs_.population_hd) {
    detail["population_hd"] = population_json(*inputs_.population_hd);
    detail["recovered_log10_density_hd"] =
        marginal_density(*inputs_.population_hd, g.recovered_mean, g.recovered_variance).ln_density / kLn10;
  }
  if (const auto* normal = std::get_if<NormalPopulation>(&inputs_.population)) {
    const bool approximate = inputs_.form == NormalForm::approximate;
    detail["method"] = approximate ? "normal between-source, approximate form" : "normal between-source, exact form";
    detail["population"] = population_json(inputs_.population);
    detail["variances"]["between"] = normal->sd * normal->sd;
    // The approximation takes one population for both sources: not shown with population_hd.
    if (!inputs_.population_hd) {
      const double exact = log10_lr_of(lindley_exact(g, normal->mean, normal->sd));
      const double approx = log10_lr_of(lindley_approximate(g, normal->mean, normal->sd));
      detail["approximation"] = {{"log10_lr_exact", exact},
                                 {"log10_lr_approximate", approx},
                                 {"log10_approximate_minus_exact", approx - exact}};
    }
  } else {
    const auto& kde = std::get<KdePopulation>(inputs_.population);
    const KernelDensity& density = *kde.density;
    const double h = density.bandwidth();
    detail["method"] = std::string("kernel density between-source, ") + method_name(kde.method.value_or(KdeMethod::fast));
    detail["population"] = population_json(inputs_.population);
    detail["kernel_sd"] = {{"pooled_mean", std::sqrt(h * h + g.pooled_mean_variance())},
                           {"control_mean", std::sqrt(h * h + g.control_variance)},
                           {"recovered_mean", std::sqrt(h * h + g.recovered_variance)}};
    detail["kernel_log10_density"] = {{"pooled_mean", d.kde_pooled.ln_density / kLn10},
                                      {"control_mean", d.kde_control.ln_density / kLn10},
                                      {"recovered_mean", d.kde_recovered.ln_density / kLn10}};
    detail["lr_relative_error_bound"] = d.relative_error_bound;
    if (g.recovered_mean < density.min() || g.recovered_mean > density.max())
      result.notes.push_back({"outside-background-range",
                              "the recovered mean " + numbers::exact_text(g.recovered_mean) +
                                  " lies outside the range of the background data [" +
                                  numbers::exact_text(density.min()) + ", " + numbers::exact_text(density.max()) +
                                  "]; the between-source density there rests on the kernel tails only"});
  }
  result.detail = std::move(detail);
  return result;
}

void ContinuousTwoLevelModel::draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const {
  if (!is_uncertain()) return EvidenceModel::draw_log10_lr(rng, out);
  for (double& value : out) value = log10_lr_with_sd(inputs_.within.draw(rng));
}

std::string ContinuousTwoLevelModel::assumptions() const {
  std::string text =
      "The control and recovered measurements are each taken as normally distributed about the mean of their "
      "source with a common within-source standard deviation";
  text += inputs_.within.is_estimated()
              ? " estimated from replicate measurements (pooled, " +
                    std::to_string(inputs_.within.degrees_of_freedom()) +
                    " degrees of freedom; its uncertainty is carried into the interval)"
              : " taken as known";
  text += ". If the recovered and control material come from the same source, they share one source mean; if "
          "they come from different sources, the recovered source mean is an independent draw from the relevant "
          "population of sources, ";
  if (std::holds_alternative<NormalPopulation>(inputs_.population))
    text += "modelled as a normal distribution of source means.";
  else
    text += "modelled by a Gaussian kernel density estimate of the background data, which are assumed to be "
            "source means representative of that population.";
  if (inputs_.population_hd)
    text += std::holds_alternative<NormalPopulation>(*inputs_.population_hd)
                ? " If Hd is true, the recovered source mean is drawn instead from the population of sources that Hd "
                  "names, modelled as a normal distribution of source means."
                : " If Hd is true, the recovered source mean is drawn instead from the population of sources that Hd "
                  "names, modelled by a Gaussian kernel density estimate of its own background data.";
  text += " Measurements are taken as independent given their source.";
  return text;
}

json ContinuousTwoLevelModel::to_json() const {
  if (!as_written_.is_null()) return as_written_;
  json out;
  out["control"] = inputs_.control;
  out["recovered"] = inputs_.recovered;
  inputs_.within.write_json(out);
  const auto as_read = [](const Population& population) {
    if (const auto* normal = std::get_if<NormalPopulation>(&population))
      return json{{"normal", {{"mean", normal->mean}, {"sd", normal->sd}}}};
    const auto& kde = std::get<KdePopulation>(population);
    json k = {{"file", kde.file}, {"column", kde.column}};
    if (kde.bandwidth) k["bandwidth"] = *kde.bandwidth;
    if (kde.method) k["method"] = method_name(*kde.method);
    return json{{"kde", k}};
  };
  out["population"] = as_read(inputs_.population);
  if (inputs_.population_hd) out["population_hd"] = as_read(*inputs_.population_hd);
  if (inputs_.form) out["form"] = *inputs_.form == NormalForm::approximate ? "approximate" : "exact";
  return out;
}

std::vector<double> read_background_column(const std::string& text, const std::string& name, const std::string& column,
                                           const Location& where) {
  const auto table = reading::parse_csv(text, name, where.with_field("file"));
  const std::size_t index = table.require_column(column, where.with_field("column"));
  // Read once into doubles; the table (the text of every column) goes when this returns.
  std::vector<double> values = reading::csv_numbers(table, index, where.with_field("file"));
  if (values.size() < 2)
    throw InvalidValue(where.with_field("file"), table.source + ": column '" + column +
                                                     "' needs at least 2 background values, found " +
                                                     std::to_string(values.size()));
  return values;
}

std::vector<DataFileUse> ContinuousTwoLevelModel::data_files() const {
  std::vector<DataFileUse> files;
  if (const auto* kde = std::get_if<KdePopulation>(&inputs_.population); kde && kde->file_use) files.push_back(*kde->file_use);
  if (inputs_.population_hd)
    if (const auto* kde = std::get_if<KdePopulation>(&*inputs_.population_hd); kde && kde->file_use)
      files.push_back(*kde->file_use);
  return files;
}

namespace {

std::vector<double> read_measurements(const json& item, const char* key, const Location& where) {
  const Location at = where.with_field(key);
  auto values = reading::read_number_array(reading::require_member(item, key, where), at);
  if (values.empty()) throw InvalidValue(at, "needs at least one measurement");
  return values;
}

WithinSourceSd read_within(const json& item, const Location& where) {
  const json* sd = reading::find_member(item, "within_sd");
  const json* replicates = reading::find_member(item, "within_replicates");
  if (sd && replicates)
    throw InvalidValue(where.with_field("within_replicates"), "give either within_sd or within_replicates, not both");
  if (!sd && !replicates)
    throw InvalidValue(where.with_field("within_sd"),
                       "missing field (give within_sd, or within_replicates to estimate it)");
  if (sd) {
    const Location at = where.with_field("within_sd");
    return WithinSourceSd::fixed(reading::read_number(*sd, at), at);
  }
  const Location at = where.with_field("within_replicates");
  if (!replicates->is_array())
    throw InvalidValue(at, "expected an array of replicate groups (arrays of numbers), found " +
                               reading::json_type_name(*replicates));
  std::vector<std::vector<double>> groups;
  for (std::size_t j = 0; j < replicates->size(); ++j)
    groups.push_back(reading::read_number_array((*replicates)[j], Location{at.item, at.field + "[" + std::to_string(j) + "]"}));
  return WithinSourceSd::pooled(std::move(groups), at);
}

KdePopulation read_kde(const json& object, const ReadContext& context, const Location& at) {
  reading::check_known_members(object, {"file", "column", "bandwidth", "method"}, at);
  KdePopulation kde;
  kde.file = reading::read_string(reading::require_member(object, "file", at), at.with_field("file"));
  if (kde.file.empty()) throw InvalidValue(at.with_field("file"), "the file name is empty");
  kde.column = reading::read_string(reading::require_member(object, "column", at), at.with_field("column"));
  if (const json* bw = reading::find_member(object, "bandwidth")) {
    const Location bw_at = at.with_field("bandwidth");
    kde.bandwidth = validation::check_positive(bw_at, reading::read_number(*bw, bw_at));
  }
  if (const json* method = reading::find_member(object, "method")) {
    const std::string name = reading::read_string(*method, at.with_field("method"));
    if (name == "fast")
      kde.method = KdeMethod::fast;
    else if (name == "exact")
      kde.method = KdeMethod::exact;
    else
      throw InvalidValue(at.with_field("method"), "unknown method '" + name + "' (expected fast or exact)");
  }
  DataFile data = read_data_file(context.base_dir, kde.file, at.with_field("file"));
  auto values = read_background_column(data.text, kde.file, kde.column, at);
  kde.file_use = std::move(data.use);
  double bandwidth = 0.0;
  if (kde.bandwidth) {
    bandwidth = *kde.bandwidth;
  } else {
    try {
      bandwidth = silverman_bandwidth(values);
    } catch (const std::invalid_argument& error) {
      throw InvalidValue(at.with_field("bandwidth"), std::string(error.what()) + "; give a bandwidth");
    }
  }
  kde.density = std::make_shared<const KernelDensity>(std::move(values), bandwidth);
  return kde;
}

Population read_population(const json& population, const ReadContext& context, const Location& pop_at) {
  reading::check_known_members(population, {"normal", "kde"}, pop_at);
  const json* normal = reading::find_member(population, "normal");
  const json* kde = reading::find_member(population, "kde");
  if (normal && kde) throw InvalidValue(pop_at, "give either normal or kde, not both");
  if (!normal && !kde) throw InvalidValue(pop_at, "expected {\"normal\": {...}} or {\"kde\": {...}}");
  if (kde) return read_kde(*kde, context, pop_at.with_field("kde"));
  const Location at = pop_at.with_field("normal");
  reading::check_known_members(*normal, {"mean", "sd"}, at);
  NormalPopulation p;
  p.mean = reading::read_number(reading::require_member(*normal, "mean", at), at.with_field("mean"));
  p.sd = validation::check_positive(
      at.with_field("sd"), reading::read_number(reading::require_member(*normal, "sd", at), at.with_field("sd")));
  return p;
}

}  // namespace

EvidenceModelPtr read_continuous_model(const json& item, const ReadContext& context) {
  const Location& where = context.where;
  check_model_members(item, {"control", "recovered", "within_sd", "within_replicates", "population", "population_hd", "form"},
                      where);
  ContinuousInputs inputs;
  inputs.control = read_measurements(item, "control", where);
  inputs.recovered = read_measurements(item, "recovered", where);
  inputs.within = read_within(item, where);

  inputs.population = read_population(reading::require_member(item, "population", where), context,
                                      where.with_field("population"));
  if (const json* hd = reading::find_member(item, "population_hd"))
    inputs.population_hd = read_population(*hd, context, where.with_field("population_hd"));
  const bool kde = std::holds_alternative<KdePopulation>(inputs.population);

  if (const json* form = reading::find_member(item, "form")) {
    const Location at = where.with_field("form");
    const std::string name = reading::read_string(*form, at);
    if (kde) throw InvalidValue(at, "form applies to a normal population only");
    if (name == "exact")
      inputs.form = NormalForm::exact;
    else if (name == "approximate")
      inputs.form = NormalForm::approximate;
    else
      throw InvalidValue(at, "unknown form '" + name + "' (expected exact or approximate)");
    if (inputs.form == NormalForm::approximate && inputs.population_hd)
      throw InvalidValue(where.with_field("population_hd"),
                         "the continuous-two-level model cannot use a population of its own under Hd with the "
                         "approximate form, which replaces both means by their pooled mean in one population; "
                         "use form exact");
  }

  json as_written = json::object();
  for (const char* key : {"control", "recovered", "within_sd", "within_replicates", "population", "population_hd", "form"})
    if (const json* member = reading::find_member(item, key)) as_written[key] = *member;
  return std::make_shared<ContinuousTwoLevelModel>(std::move(inputs), std::move(as_written));
}

std::vector<EvidenceModelPtr> read_continuous_alternatives(const json& item, std::span<const std::string> alternative_ids,
                                                           const ReadContext& context) {
  return read_per_alternative(item, alternative_ids, {"population_hd"}, &read_continuous_model, context);
}

}  // namespace counterpoise::models::continuous
