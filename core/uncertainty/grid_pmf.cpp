#include "core/uncertainty/grid_pmf.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <stdexcept>

namespace counterpoise::uncertainty {

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
}

GridPmf GridPmf::point(double value, double step) {
  GridPmf pmf;
  pmf.step = step;
  if (value == -kInf) {
    pmf.mass_minus_inf = 1.0;
  } else if (value == kInf) {
    pmf.mass_plus_inf = 1.0;
  } else {
    pmf.shift = value;
    pmf.mass = {1.0};
    pmf.support_low = pmf.support_high = value;
  }
  return pmf;
}

GridPmf GridPmf::from_cdf(const std::function<double(double)>& cdf, double low, double high,
                          double step) {
  if (!(step > 0.0) || !(high >= low)) throw std::invalid_argument("from_cdf: bad range or step");
  GridPmf pmf;
  pmf.step = step;
  pmf.offset = static_cast<std::int64_t>(std::floor(low / step + 0.5));
  const auto last = static_cast<std::int64_t>(std::floor(high / step + 0.5));
  const std::size_t bins = static_cast<std::size_t>(last - pmf.offset + 1);
  pmf.mass.resize(bins);
  double previous = 0.0;  // everything below the first edge goes to the first bin
  for (std::size_t i = 0; i < bins; ++i) {
    const double upper_edge = (static_cast<double>(pmf.offset + static_cast<std::int64_t>(i)) + 0.5) * step;
    const double c = (i + 1 == bins) ? 1.0 : std::clamp(cdf(upper_edge), previous, 1.0);
    pmf.mass[i] = c - previous;
    previous = c;
  }
  return pmf;
}

GridPmf GridPmf::from_draws(const std::vector<double>& draws, double step) {
  GridPmf pmf;
  pmf.step = step;
  if (draws.empty()) throw std::invalid_argument("from_draws: no draws");
  double lo = kInf, hi = -kInf;
  for (double d : draws)
    if (std::isfinite(d)) lo = std::min(lo, d), hi = std::max(hi, d);
  const double weight = 1.0 / static_cast<double>(draws.size());
  if (lo <= hi) {
    pmf.support_low = lo;
    pmf.support_high = hi;
    pmf.offset = static_cast<std::int64_t>(std::floor(lo / step + 0.5));
    const auto last = static_cast<std::int64_t>(std::floor(hi / step + 0.5));
    pmf.mass.assign(static_cast<std::size_t>(last - pmf.offset + 1), 0.0);
  }
  for (double d : draws) {
    if (d == -kInf) pmf.mass_minus_inf += weight;
    else if (d == kInf) pmf.mass_plus_inf += weight;
    else pmf.mass[static_cast<std::size_t>(static_cast<std::int64_t>(std::floor(d / step + 0.5)) - pmf.offset)] += weight;
  }
  return pmf;
}

GridPmf GridPmf::negated() const {
  GridPmf out;
  out.step = step;
  out.shift = -shift;
  out.mass.assign(mass.rbegin(), mass.rend());
  out.offset = mass.empty() ? 0 : -(offset + static_cast<std::int64_t>(mass.size()) - 1);
  out.mass_minus_inf = mass_plus_inf;
  out.mass_plus_inf = mass_minus_inf;
  out.support_low = -support_high;
  out.support_high = -support_low;
  return out;
}

GridPmf& GridPmf::within(double low, double high) {
  if (!(low <= high)) throw std::invalid_argument("within: empty support");
  support_low = low;
  support_high = high;
  return *this;
}

double GridPmf::quantile(double q) const {
  if (!(q > 0.0 && q < 1.0)) throw std::invalid_argument("quantile: q must be in (0, 1)");
  if (q <= mass_minus_inf) return -kInf;
  double cumulative = mass_minus_inf;
  for (std::size_t i = 0; i < mass.size(); ++i) {
    const double next = cumulative + mass[i];
    if (q <= next && mass[i] > 0.0) {
      const double fraction = (q - cumulative) / mass[i];
      return std::clamp(value_at(i) - 0.5 * step + fraction * step, support_low, support_high);
    }
    cumulative = next;
  }
  if (mass_plus_inf > 0.0) return kInf;
  // Rounding left q a hair above the total: the last bin with mass holds it.
  for (std::size_t i = mass.size(); i-- > 0;)
    if (mass[i] > 0.0) return std::clamp(value_at(i) + 0.5 * step, support_low, support_high);
  return kInf;
}

double GridPmf::finite_mean() const {
  double total = 0.0, weighted = 0.0;
  for (std::size_t i = 0; i < mass.size(); ++i) total += mass[i], weighted += mass[i] * value_at(i);
  return total > 0.0 ? weighted / total : std::numeric_limits<double>::quiet_NaN();
}

GridPmf convolve(const GridPmf& a, const GridPmf& b, double* contradiction) {
  if (a.step != b.step) throw std::invalid_argument("convolve: lattices differ");
  GridPmf out;
  out.step = a.step;
  out.shift = a.shift + b.shift;
  out.offset = a.offset + b.offset;
  out.support_low = a.support_low + b.support_low;
  out.support_high = a.support_high + b.support_high;
  const double finite_a = std::accumulate(a.mass.begin(), a.mass.end(), 0.0);
  const double finite_b = std::accumulate(b.mass.begin(), b.mass.end(), 0.0);
  if (!a.mass.empty() && !b.mass.empty()) {
    out.mass.assign(a.mass.size() + b.mass.size() - 1, 0.0);
    // The inner loop runs over distinct arrays; saying so lets the compiler vectorise it.
    const double* __restrict source = b.mass.data();
    const std::size_t width = b.mass.size();
    for (std::size_t i = 0; i < a.mass.size(); ++i) {
      const double ai = a.mass[i];
      if (ai == 0.0) continue;
      double* __restrict target = out.mass.data() + i;
      for (std::size_t j = 0; j < width; ++j) target[j] += ai * source[j];
    }
  }
  // -inf absorbs finite values, +inf likewise; -inf with +inf is a contradiction.
  out.mass_minus_inf = a.mass_minus_inf * (finite_b + b.mass_minus_inf) + finite_a * b.mass_minus_inf;
  out.mass_plus_inf = a.mass_plus_inf * (finite_b + b.mass_plus_inf) + finite_a * b.mass_plus_inf;
  const double clash = a.mass_minus_inf * b.mass_plus_inf + a.mass_plus_inf * b.mass_minus_inf;
  if (contradiction) *contradiction = clash;
  return out;
}

double trim_tails(GridPmf& pmf, double tail) {
  if (pmf.mass.size() < 3) return 0.0;
  std::size_t first = 0, last = pmf.mass.size() - 1;
  double low_mass = 0.0, high_mass = 0.0;
  while (first < last && low_mass + pmf.mass[first] < tail) low_mass += pmf.mass[first++];
  while (last > first && high_mass + pmf.mass[last] < tail) high_mass += pmf.mass[last--];
  if (first == 0 && last == pmf.mass.size() - 1) return 0.0;
  std::vector<double> kept(pmf.mass.begin() + static_cast<std::ptrdiff_t>(first),
                           pmf.mass.begin() + static_cast<std::ptrdiff_t>(last) + 1);
  kept.front() += low_mass;
  kept.back() += high_mass;
  pmf.offset += static_cast<std::int64_t>(first);
  pmf.mass = std::move(kept);
  return low_mass + high_mass;
}

}  // namespace counterpoise::uncertainty
