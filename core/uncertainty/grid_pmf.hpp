#pragma once
// A probability distribution of a log10 quantity discretised on a lattice: bin i holds the
// mass of values in [(offset + i - 1/2) step, (offset + i + 1/2) step) + shift. Sums of
// independent terms are convolutions, so the distribution of a combined log10 LR is exact up
// to the lattice spacing and deterministic (common practice in numerical probability; see
// e.g. Williamson & Downs 1990, Int. J. Approx. Reasoning 4:89, on arithmetic of discretised
// distributions — from memory). Mass at -inf (LR zero) and +inf (LR infinite) is kept apart.

#include <cstdint>
#include <functional>
#include <limits>
#include <vector>

namespace counterpoise::uncertainty {

struct GridPmf {
  double step = 1.0;
  std::int64_t offset = 0;        // lattice index of mass[0]
  double shift = 0.0;             // continuous offset added to every lattice value
  std::vector<double> mass;       // sums with the two tails to 1
  double mass_minus_inf = 0.0;    // probability that log10 LR = -inf (LR = 0)
  double mass_plus_inf = 0.0;     // probability that log10 LR = +inf
  // The smallest and largest finite values the quantity can take (its support). A bin's edge
  // may lie beyond them; quantiles never do (docs/methods.md, "Intervals stay within what is
  // possible"). Unbounded unless the maker of the distribution knows better.
  double support_low = -std::numeric_limits<double>::infinity();
  double support_high = std::numeric_limits<double>::infinity();

  // A point mass at `value` (kept exactly through `shift`); its support is that value.
  static GridPmf point(double value, double step);
  // Discretises a distribution given by its CDF over [low, high] (CDF(low) ~ 0, CDF(high) ~ 1);
  // mass outside [low, high] is attributed to the end bins so nothing is lost.
  static GridPmf from_cdf(const std::function<double(double)>& cdf, double low, double high,
                          double step);
  // Histogram of draws (±inf allowed), each draw weighted 1/n; the support is the range of the
  // finite draws.
  static GridPmf from_draws(const std::vector<double>& draws, double step);

  // The value at lattice bin i (its centre).
  double value_at(std::size_t i) const { return (static_cast<double>(offset) + static_cast<double>(i)) * step + shift; }
  // The distribution of -X (Hp and Hd swapped).
  GridPmf negated() const;
  // The distribution restricted to what is possible: support [low, high] (either may be infinite).
  GridPmf& within(double low, double high);
  // The q-quantile (0 < q < 1), interpolated linearly inside the bin and kept within the
  // support (the exact quantile lies in the same bin and inside the support, so the result is
  // within one step of it); ±inf when q falls in a tail.
  double quantile(double q) const;
  // Mean of the finite part (used for checks).
  double finite_mean() const;
};

// The distribution of X + Y for independent X ~ a, Y ~ b on the same step (supports add). Throws
// std::invalid_argument when the steps differ. Mass with -inf + +inf (contradiction) is returned
// in `contradiction` when non-null and dropped from the result's tails, renormalising nothing.
GridPmf convolve(const GridPmf& a, const GridPmf& b, double* contradiction = nullptr);

// Drops bins below `tail` mass at each end (total at most 2 * tail), keeping total mass in the
// end bins, so repeated convolutions stay small. Returns the mass moved.
double trim_tails(GridPmf& pmf, double tail);

}  // namespace counterpoise::uncertainty
