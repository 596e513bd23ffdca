#include "core/probability/probability_assignment.hpp"

#include <cmath>
#include <limits>

#include <boost/math/distributions/beta.hpp>
#include <boost/math/special_functions/beta.hpp>

#include "core/numbers/log10_math.hpp"
#include "core/numbers/math_policy.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"
#include "core/uncertainty/beta_draws.hpp"
#include "core/validation/checks.hpp"

namespace counterpoise::probability {

using nlohmann::json;
using numbers::exact_text;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr double kMinusInf = -std::numeric_limits<double>::infinity();

template <class... Ts>
struct Overloaded : Ts... {
  using Ts::operator()...;
};
template <class... Ts>
Overloaded(Ts...) -> Overloaded<Ts...>;

BetaValue as_beta(const CountsValue& c) {
  return {static_cast<double>(c.k) + c.prior_a, static_cast<double>(c.n - c.k) + c.prior_b};
}

Assignment read_interval(const json& object, const Location& where) {
  reading::check_known_members(object, {"interval", "scale"}, where);
  const Location at = where.with_field("interval");
  const auto bounds = reading::read_number_array(object.at("interval"), at);
  if (bounds.size() != 2)
    throw InvalidValue(at, "an interval has exactly two numbers [low, high], found " + std::to_string(bounds.size()));
  validation::check_probability(Location{at.item, at.field + "[0]"}, bounds[0]);
  validation::check_probability(Location{at.item, at.field + "[1]"}, bounds[1]);
  validation::check_ordered(at, bounds[0], bounds[1]);
  const std::string scale = reading::read_string_or(object, "scale", where, "log");
  if (scale != "log" && scale != "linear")
    throw InvalidValue(where.with_field("scale"), "scale must be \"log\" or \"linear\", found \"" + scale + "\"");
  const bool linear = scale == "linear";
  if (!linear && bounds[0] == 0.0)
    throw InvalidValue(at, "an interval uniform on the log scale cannot start at 0; give a positive low "
                           "end or state \"scale\": \"linear\"");
  return IntervalValue{bounds[0], bounds[1], linear};
}

Assignment read_beta(const json& object, const Location& where) {
  reading::check_known_members(object, {"beta"}, where);
  const Location at = where.with_field("beta");
  const auto params = reading::read_number_array(object.at("beta"), at);
  if (params.size() != 2)
    throw InvalidValue(at, "Beta needs exactly two parameters [a, b], found " + std::to_string(params.size()));
  validation::check_positive(Location{at.item, at.field + "[0]"}, params[0]);
  validation::check_positive(Location{at.item, at.field + "[1]"}, params[1]);
  return BetaValue{params[0], params[1]};
}

Assignment read_counts(const json& object, const Location& where) {
  reading::check_known_members(object, {"counts"}, where);
  const Location at = where.with_field("counts");
  const json& counts = object.at("counts");
  reading::check_known_members(counts, {"k", "n", "prior"}, at);
  const auto k = reading::read_count(reading::require_member(counts, "k", at), at.with_field("k"));
  const auto n = reading::read_count(reading::require_member(counts, "n", at), at.with_field("n"));
  if (k > n)
    throw InvalidValue(at.with_field("k"), "k = " + std::to_string(k) + " is greater than n = " + std::to_string(n));
  CountsValue value{k, n};
  if (const json* prior = reading::find_member(counts, "prior")) {
    const Location prior_at = at.with_field("prior");
    const auto params = reading::read_number_array(*prior, prior_at);
    if (params.size() != 2)
      throw InvalidValue(prior_at, "prior needs exactly two Beta parameters [a0, b0]");
    value.prior_a = validation::check_positive(Location{prior_at.item, prior_at.field + "[0]"}, params[0]);
    value.prior_b = validation::check_positive(Location{prior_at.item, prior_at.field + "[1]"}, params[1]);
  }
  return value;
}

boost::math::beta_distribution<double, numbers::MathPolicy> distribution(const BetaValue& b) {
  return boost::math::beta_distribution<double, numbers::MathPolicy>(b.a, b.b);
}

// P(log10 X <= t) for X ~ Beta: the regularised incomplete beta at 10^t.
double beta_log10_cdf(const BetaValue& b, double t) {
  if (t >= 0.0) return 1.0;
  const double x = std::pow(10.0, t);
  if (x <= 0.0) return 0.0;
  return boost::math::ibeta(b.a, b.b, x, numbers::MathPolicy());
}

}  // namespace

Assignment read_assignment(const json& value, const Location& where) {
  if (value.is_number()) return PointValue{validation::check_probability(where, reading::read_number(value, where))};
  if (!value.is_object())
    throw InvalidValue(where, "a probability is a number or an object with \"interval\", \"beta\" or \"counts\"; found " +
                                  reading::json_type_name(value));
  if (value.contains("interval")) return read_interval(value, where);
  if (value.contains("beta")) return read_beta(value, where);
  if (value.contains("counts")) return read_counts(value, where);
  throw InvalidValue(where, "a probability object needs one of \"interval\", \"beta\" or \"counts\"");
}

json to_json(const Assignment& assignment) {
  return std::visit(Overloaded{
                        [](const PointValue& v) { return json(v.p); },
                        [](const IntervalValue& v) {
                          json j = {{"interval", {v.low, v.high}}};
                          if (v.linear) j["scale"] = "linear";
                          return j;
                        },
                        [](const BetaValue& v) { return json{{"beta", {v.a, v.b}}}; },
                        [](const CountsValue& v) {
                          json counts = {{"k", v.k}, {"n", v.n}};
                          if (v.prior_a != 1.0 || v.prior_b != 1.0) counts["prior"] = {v.prior_a, v.prior_b};
                          return json{{"counts", counts}};
                        },
                    },
                    assignment);
}

double log10_mean(const Assignment& assignment) {
  return std::visit(Overloaded{
                        [](const PointValue& v) { return v.p == 0.0 ? kMinusInf : std::log10(v.p); },
                        [](const IntervalValue& v) {
                          if (v.linear || v.low == v.high) return std::log10(0.5 * (v.low + v.high));
                          // Mean of X when log10 X ~ U(log10 lo, log10 hi): (hi - lo) / ln(hi / lo).
                          const double ln_ratio = std::log(v.high) - std::log(v.low);
                          return std::log10(v.high - v.low) - std::log10(ln_ratio);
                        },
                        [](const BetaValue& v) { return std::log10(v.a) - std::log10(v.a + v.b); },
                        [](const CountsValue& v) {
                          const BetaValue b = as_beta(v);
                          return std::log10(b.a) - std::log10(b.a + b.b);
                        },
                    },
                    assignment);
}

double mean(const Assignment& assignment) { return std::pow(10.0, log10_mean(assignment)); }

bool is_uncertain(const Assignment& assignment) {
  if (const auto* interval = std::get_if<IntervalValue>(&assignment)) return interval->low < interval->high;
  return !std::holds_alternative<PointValue>(assignment);
}

namespace {

template <class Engine>
double draw_log10_with(const Assignment& assignment, Engine& rng) {
  return std::visit(Overloaded{
                        [](const PointValue& v) { return v.p == 0.0 ? kMinusInf : std::log10(v.p); },
                        [&rng](const IntervalValue& v) {
                          std::uniform_real_distribution<double> uniform(0.0, 1.0);
                          const double u = uniform(rng);
                          if (v.linear) {
                            const double x = v.low + u * (v.high - v.low);
                            return x == 0.0 ? kMinusInf : std::log10(x);
                          }
                          const double lo = std::log10(v.low), hi = std::log10(v.high);
                          return lo + u * (hi - lo);
                        },
                        [&rng](const BetaValue& v) { return uncertainty::BetaSampler(v.a, v.b).draw_log10(rng); },
                        [&rng](const CountsValue& v) {
                          const BetaValue b = as_beta(v);
                          return uncertainty::BetaSampler(b.a, b.b).draw_log10(rng);
                        },
                    },
                    assignment);
}

}  // namespace

double draw_log10(const Assignment& assignment, std::mt19937_64& rng) { return draw_log10_with(assignment, rng); }

void fill_log10(const Assignment& assignment, uncertainty::BulkEngine& rng, std::span<double> out) {
  if (const auto* beta = std::get_if<BetaValue>(&assignment))
    return uncertainty::BetaSampler(beta->a, beta->b).fill_log10(rng, out);
  if (const auto* counts = std::get_if<CountsValue>(&assignment)) {
    const BetaValue b = as_beta(*counts);
    return uncertainty::BetaSampler(b.a, b.b).fill_log10(rng, out);
  }
  for (double& value : out) value = draw_log10_with(assignment, rng);
}

double log10_quantile(const Assignment& assignment, double q) {
  return std::visit(Overloaded{
                        [](const PointValue& v) { return v.p == 0.0 ? kMinusInf : std::log10(v.p); },
                        [q](const IntervalValue& v) {
                          if (v.linear) {
                            const double x = v.low + q * (v.high - v.low);
                            return x == 0.0 ? kMinusInf : std::log10(x);
                          }
                          const double lo = std::log10(v.low), hi = std::log10(v.high);
                          return lo + q * (hi - lo);
                        },
                        [q](const BetaValue& v) { return std::log10(boost::math::quantile(distribution(v), q)); },
                        [q](const CountsValue& v) { return std::log10(boost::math::quantile(distribution(as_beta(v)), q)); },
                    },
                    assignment);
}

std::optional<uncertainty::GridPmf> log10_grid(const Assignment& assignment, double step) {
  if (!is_uncertain(assignment)) return uncertainty::GridPmf::point(log10_mean(assignment), step);
  if (const auto* interval = std::get_if<IntervalValue>(&assignment)) {
    if (interval->linear) {
      const double lo = interval->low, hi = interval->high;
      auto cdf = [lo, hi](double t) { return std::clamp((std::pow(10.0, t) - lo) / (hi - lo), 0.0, 1.0); };
      // A linear interval from 0 has an unbounded log tail: start the lattice where the CDF is 1e-12.
      const double start = lo > 0.0 ? std::log10(lo) : std::log10(lo + 1e-12 * (hi - lo));
      return uncertainty::GridPmf::from_cdf(cdf, start, std::log10(hi), step)
          .within(lo > 0.0 ? std::log10(lo) : kMinusInf, std::log10(hi));
    }
    const double lo = std::log10(interval->low), hi = std::log10(interval->high);
    auto cdf = [lo, hi](double t) { return std::clamp((t - lo) / (hi - lo), 0.0, 1.0); };
    return uncertainty::GridPmf::from_cdf(cdf, lo, hi, step).within(lo, hi);
  }
  const BetaValue beta = std::holds_alternative<BetaValue>(assignment)
                             ? std::get<BetaValue>(assignment)
                             : as_beta(std::get<CountsValue>(assignment));
  // The lattice spans the central 1 - 2e-12 of the mass; the rest is kept in the end bins.
  const double low_quantile = boost::math::quantile(distribution(beta), 1e-12);
  if (!(low_quantile > 1e-300)) return std::nullopt;
  const double low = std::log10(low_quantile);
  const double high = std::log10(boost::math::quantile(boost::math::complement(distribution(beta), 1e-12)));
  // A probability is at most 1: log10 p <= 0 bounds the quantiles however coarse the top bin.
  return uncertainty::GridPmf::from_cdf([&beta](double t) { return beta_log10_cdf(beta, t); }, low, high, step)
      .within(kMinusInf, 0.0);
}

std::string describe(const Assignment& assignment) {
  return std::visit(Overloaded{
                        [](const PointValue& v) { return exact_text(v.p); },
                        [](const IntervalValue& v) {
                          return "between " + exact_text(v.low) + " and " + exact_text(v.high) +
                                 (v.linear ? " (uniform)" : " (uniform on the log scale)");
                        },
                        [](const BetaValue& v) { return "Beta(" + exact_text(v.a) + ", " + exact_text(v.b) + ")"; },
                        [](const CountsValue& v) {
                          std::string text = std::to_string(v.k) + " of " + std::to_string(v.n);
                          if (v.prior_a != 1.0 || v.prior_b != 1.0)
                            text += " (Beta prior " + exact_text(v.prior_a) + ", " + exact_text(v.prior_b) + ")";
                          return text;
                        },
                    },
                    assignment);
}

}  // namespace counterpoise::probability
