#pragma once
// A univariate Gaussian kernel density estimate of a background dataset, evaluated in log space
// at one point with a given kernel standard deviation:
//   f(t) = (1/N) sum_i phi(t; z_i, s^2).
// Default bandwidth: Silverman's rule of thumb h = 0.9 min(sd, IQR/1.34) N^(-1/5) (Silverman
// 1986, Density Estimation for Statistics and Data Analysis, eq. 3.31; IQR by linear
// interpolation between order statistics, Hyndman & Fan 1996, Am. Stat. 50:361, definition 7).
//
// Two methods (docs/methods.md, "Continuous measurements, two-level model"):
//  - exact: every term, summed by log-sum-exp shifted by the largest term.
//  - fast: the sorted background is cut into blocks of width h; only blocks meeting the window
//    |t - z| <= r with r^2 = d^2 + K^2 s^2 (d the distance to the nearest background value,
//    K = 8) are summed, so each left-out term is at most exp(-K^2/2) times the largest kept
//    term and the relative error of leaving them out is at most N exp(-32) < 1.3e-14 N. A block
//    with centre c is summed through the Hermite expansion
//      sum_z exp(-(t-z)^2/2s^2) = exp(-x^2/2) sum_q He_q(x) rho^q M_q / q!,
//    x = (t-c)/s, rho = (h/2)/s, M_q = sum_z ((z-c)/(h/2))^q (the generating function of the
//    probabilists' Hermite polynomials, Abramowitz & Stegun 1964, 22.9.17 — from memory for
//    the number), truncated after 32 terms; with Cramér's inequality |He_q(x)| <= 1.0865
//    sqrt(q!) exp(x^2/4) (A&S 22.14.17, from memory) the truncation error is below 1e-15
//    relative for |x| <= 9, rho <= 1/2. Blocks with |x| > 9 are summed term by term.

#include <cstddef>
#include <span>
#include <vector>

namespace counterpoise::models::continuous {

enum class KdeMethod { fast, exact };

// Silverman's rule of thumb (eq. 3.31) for `values` (at least 2). Returns 0.9 A N^(-1/5) with
// A = min(sd, IQR/1.34), or with A = sd when the IQR is 0. Throws std::invalid_argument for
// fewer than 2 values or when all values are equal (sd = 0).
double silverman_bandwidth(std::span<const double> values);

// One evaluation of the log density, with what it cost and how accurate it is.
struct KdeEvaluation {
  double ln_density = 0.0;            // natural log of f(t)
  double relative_error_bound = 0.0;  // bound on |f_computed - f| / f from the method (not rounding)
  std::size_t terms_used = 0;         // background values inside the window
};

class KernelDensity {
 public:
  // Sorts `values` and prepares the blocks for the fast method. `bandwidth` h is the kernel
  // standard deviation of the estimate itself. Throws std::invalid_argument for an empty
  // dataset, a non-finite value or a bandwidth that is not finite and positive.
  KernelDensity(std::vector<double> values, double bandwidth);

  // ln f(t) with kernel standard deviation `kernel_sd` (>= bandwidth for the two-level model,
  // which adds within-source variance). Throws std::invalid_argument when kernel_sd is not
  // finite and positive or t is not finite.
  KdeEvaluation ln_density(double t, double kernel_sd, KdeMethod method) const;

  double bandwidth() const noexcept { return bandwidth_; }
  std::size_t size() const noexcept { return sorted_.size(); }
  double min() const noexcept { return sorted_.front(); }
  double max() const noexcept { return sorted_.back(); }
  const std::vector<double>& sorted_values() const noexcept { return sorted_; }

  static constexpr int kExpansionTerms = 32;
  static constexpr double kWindowSds = 8.0;     // K above
  static constexpr double kExpansionReach = 9.0;  // |x| beyond which a block is summed term by term

 private:
  struct Block {
    std::size_t begin, end;  // [begin, end) in sorted_
    double centre;
    double moments[kExpansionTerms];  // M_q, q = 0..31
  };
  // sum over the block of exp(-(t-z)^2/2s^2 - shift), term by term.
  double sum_block_direct(const Block& block, double t, double kernel_sd, double shift) const;

  std::vector<double> sorted_;
  double bandwidth_;
  double half_width_;  // h / 2: every value of a block lies within this of its centre
  std::vector<Block> blocks_;
  std::vector<double> block_low_, block_high_;  // first and last value of each block
};

}  // namespace counterpoise::models::continuous
