#include "core/models/continuous/within_source_sd.hpp"

#include <cmath>
#include <string>

#include "core/validation/checks.hpp"

namespace counterpoise::models::continuous {

using validation::InvalidValue;
using validation::Location;

WithinSourceSd WithinSourceSd::fixed(double sd, const Location& where) {
  WithinSourceSd result;
  result.sd_ = validation::check_positive(where, sd);
  return result;
}

WithinSourceSd WithinSourceSd::pooled(std::vector<std::vector<double>> groups, const Location& where) {
  if (groups.empty()) throw InvalidValue(where, "needs at least one replicate group");
  double squares = 0.0;
  int dof = 0;
  for (std::size_t j = 0; j < groups.size(); ++j) {
    const auto& group = groups[j];
    const Location at{where.item, where.field + "[" + std::to_string(j) + "]"};
    if (group.empty()) throw InvalidValue(at, "a replicate group needs at least one measurement");
    double mean = 0.0;
    for (double v : group) mean += validation::check_finite(at, v);
    mean /= static_cast<double>(group.size());
    for (double v : group) squares += (v - mean) * (v - mean);
    dof += static_cast<int>(group.size()) - 1;
  }
  if (dof == 0)
    throw InvalidValue(where, "every replicate group has one measurement, so there are no degrees of "
                              "freedom to estimate the within-source standard deviation");
  const double sd = std::sqrt(squares / dof);
  if (!(sd > 0.0))
    throw InvalidValue(where, "the replicates within each group are identical, so the pooled standard "
                              "deviation is 0; give within_sd instead");
  WithinSourceSd result;
  result.sd_ = sd;
  result.degrees_of_freedom_ = dof;
  result.groups_ = std::move(groups);
  return result;
}

double WithinSourceSd::draw(std::mt19937_64& rng) const {
  if (!is_estimated()) return sd_;
  // chi-square(nu) is Gamma(nu/2, scale 2).
  std::gamma_distribution<double> chi_square(0.5 * degrees_of_freedom_, 2.0);
  double x = chi_square(rng);
  while (!(x > 0.0)) x = chi_square(rng);
  return sd_ * std::sqrt(degrees_of_freedom_ / x);
}

void WithinSourceSd::write_json(nlohmann::json& item) const {
  if (is_estimated())
    item["within_replicates"] = groups_;
  else
    item["within_sd"] = sd_;
}

nlohmann::json WithinSourceSd::detail() const {
  nlohmann::json out = {{"value", sd_}, {"source", is_estimated() ? "pooled from replicates" : "given"}};
  if (is_estimated()) {
    out["degrees_of_freedom"] = degrees_of_freedom_;
    out["replicate_groups"] = groups_.size();
    out["posterior"] = "scaled inverse chi-square(" + std::to_string(degrees_of_freedom_) + ", s_p^2)";
  }
  return out;
}

}  // namespace counterpoise::models::continuous
