#include "core/models/continuous/kernel_density.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <numeric>
#include <stdexcept>

namespace counterpoise::models::continuous {

namespace {

constexpr double kLnSqrt2Pi = 0.91893853320467274178032973640561764;  // ln sqrt(2 pi)
constexpr double kCramerConstant = 1.086435;  // Cramér's inequality (A&S 22.14.17, from memory)

// 1 / (q + 1), so the recurrence multiplies instead of dividing.
constexpr auto kReciprocals = [] {
  std::array<double, KernelDensity::kExpansionTerms> r{};
  for (int q = 0; q < KernelDensity::kExpansionTerms; ++q) r[q] = 1.0 / (q + 1);
  return r;
}();

// Type-7 sample quantile of sorted data (Hyndman & Fan 1996, definition 7).
double sorted_quantile(const std::vector<double>& sorted, double p) {
  const double h = static_cast<double>(sorted.size() - 1) * p;
  const auto lo = static_cast<std::size_t>(std::floor(h));
  const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
  return sorted[lo] + (h - static_cast<double>(lo)) * (sorted[hi] - sorted[lo]);
}

// sum_{q >= P} rho^q / sqrt(q!), the factor of the truncation bound that depends on rho only:
// the ratio of consecutive terms is rho / sqrt(q + 1) <= rho / sqrt(P + 1) < 1, so the tail is
// at most its first term over 1 - rho / sqrt(P + 1) (geometric series).
double expansion_tail(double rho, int first_term) {
  if (rho <= 0.0) return 0.0;
  const double ratio = rho / std::sqrt(first_term + 1.0);
  return std::exp(first_term * std::log(rho) - 0.5 * std::lgamma(first_term + 1.0)) / (1.0 - ratio);
}

}  // namespace

double silverman_bandwidth(std::span<const double> values) {
  if (values.size() < 2) throw std::invalid_argument("the bandwidth rule needs at least 2 values");
  std::vector<double> sorted(values.begin(), values.end());
  std::sort(sorted.begin(), sorted.end());
  const double n = static_cast<double>(sorted.size());
  const double mean = std::accumulate(sorted.begin(), sorted.end(), 0.0) / n;
  double squares = 0.0;
  for (double v : sorted) squares += (v - mean) * (v - mean);
  const double sd = std::sqrt(squares / (n - 1.0));
  if (!(sd > 0.0))
    throw std::invalid_argument("all background values are equal; the bandwidth rule cannot be applied");
  const double iqr = sorted_quantile(sorted, 0.75) - sorted_quantile(sorted, 0.25);
  const double spread = iqr > 0.0 ? std::min(sd, iqr / 1.34) : sd;
  return 0.9 * spread * std::pow(n, -0.2);
}

KernelDensity::KernelDensity(std::vector<double> values, double bandwidth)
    : sorted_(std::move(values)), bandwidth_(bandwidth), half_width_(bandwidth / 2.0) {
  if (sorted_.empty()) throw std::invalid_argument("the background dataset is empty");
  for (double v : sorted_)
    if (!std::isfinite(v)) throw std::invalid_argument("the background dataset has a non-finite value");
  if (!std::isfinite(bandwidth) || !(bandwidth > 0.0))
    throw std::invalid_argument("the bandwidth must be finite and positive");
  std::sort(sorted_.begin(), sorted_.end());

  std::size_t i = 0;
  while (i < sorted_.size()) {
    Block block{};
    block.begin = i;
    block.centre = sorted_[i] + half_width_;
    const double limit = sorted_[i] + bandwidth_;
    while (i < sorted_.size() && sorted_[i] <= limit) {
      const double u = (sorted_[i] - block.centre) / half_width_;  // in [-1, 1]
      double power = 1.0;
      for (int q = 0; q < kExpansionTerms; ++q) {
        block.moments[q] += power;
        power *= u;
      }
      ++i;
    }
    block.end = i;
    block_low_.push_back(sorted_[block.begin]);
    block_high_.push_back(sorted_[block.end - 1]);
    blocks_.push_back(block);
  }
}

double KernelDensity::sum_block_direct(const Block& block, double t, double kernel_sd, double shift) const {
  double sum = 0.0;
  for (std::size_t j = block.begin; j < block.end; ++j) {
    const double u = (t - sorted_[j]) / kernel_sd;
    sum += std::exp(-0.5 * u * u - shift);
  }
  return sum;
}

KdeEvaluation KernelDensity::ln_density(double t, double kernel_sd, KdeMethod method) const {
  if (!std::isfinite(t)) throw std::invalid_argument("the evaluation point is not finite");
  if (!std::isfinite(kernel_sd) || !(kernel_sd > 0.0))
    throw std::invalid_argument("the kernel standard deviation must be finite and positive");
  const double n = static_cast<double>(sorted_.size());
  const double normaliser = -std::log(n) - std::log(kernel_sd) - kLnSqrt2Pi;

  // The largest term belongs to the nearest background value; shifting by it keeps every
  // partial sum between 1 and N, so nothing underflows even far out in the tail.
  const auto it = std::lower_bound(sorted_.begin(), sorted_.end(), t);
  double nearest = std::numeric_limits<double>::infinity();
  if (it != sorted_.end()) nearest = *it - t;
  if (it != sorted_.begin()) nearest = std::min(nearest, t - *std::prev(it));
  const double shift = -0.5 * (nearest / kernel_sd) * (nearest / kernel_sd);

  KdeEvaluation result;
  if (method == KdeMethod::exact) {
    double sum = 0.0;
    for (double z : sorted_) {
      const double u = (t - z) / kernel_sd;
      sum += std::exp(-0.5 * u * u - shift);
    }
    result.ln_density = normaliser + shift + std::log(sum);
    result.terms_used = sorted_.size();
    return result;
  }

  const double radius = std::sqrt(nearest * nearest + kWindowSds * kWindowSds * kernel_sd * kernel_sd);
  const auto first = static_cast<std::size_t>(
      std::lower_bound(block_high_.begin(), block_high_.end(), t - radius) - block_high_.begin());
  const auto last = static_cast<std::size_t>(
      std::upper_bound(block_low_.begin(), block_low_.end(), t + radius) - block_low_.begin());

  const double rho = half_width_ / kernel_sd;
  const bool expand = rho <= 0.5;
  double sum = 0.0;
  double widest_x = -1.0;  // max |x| over expanded blocks (-1: none)
  std::size_t used = 0;
  for (std::size_t b = first; b < last; ++b) {
    const Block& block = blocks_[b];
    used += block.end - block.begin;
    const double x = (t - block.centre) / kernel_sd;
    if (!expand || std::abs(x) > kExpansionReach || block.end - block.begin < 4) {
      sum += sum_block_direct(block, t, kernel_sd, shift);
      continue;
    }
    // g_q = He_q(x) rho^q / q!, by the three-term recurrence of He_q.
    const double x_rho = x * rho, rho2 = rho * rho;
    double g_prev = 1.0;
    double g = x_rho;
    double series = block.moments[0] + g * block.moments[1];
    for (int q = 1; q + 1 < kExpansionTerms; ++q) {
      const double g_next = (x_rho * g - rho2 * g_prev) * kReciprocals[q];
      g_prev = g;
      g = g_next;
      series += g * block.moments[q + 1];
    }
    if (!(series > 0.0)) {  // only possible through rounding; never trust it
      sum += sum_block_direct(block, t, kernel_sd, shift);
      continue;
    }
    widest_x = std::max(widest_x, std::abs(x));
    sum += series * std::exp(-0.5 * x * x - shift);
  }
  const double ln_sum = shift + std::log(sum);  // ln sum_z exp(-(t-z)^2/2s^2) over kept values
  const double left_out = n - static_cast<double>(used);
  const double window_bound =
      left_out > 0 ? std::exp(std::log(left_out) - 0.5 * (radius / kernel_sd) * (radius / kernel_sd) - ln_sum)
                   : 0.0;
  // Per block: relative truncation error <= K exp(x^2/4 + |x| rho + rho^2/2) * tail(rho).
  const double series_bound =
      widest_x >= 0.0 ? kCramerConstant * std::exp(0.25 * widest_x * widest_x + widest_x * rho + 0.5 * rho * rho) *
                            expansion_tail(rho, kExpansionTerms)
                      : 0.0;
  result.ln_density = normaliser + ln_sum;
  result.relative_error_bound = window_bound + series_bound;
  result.terms_used = used;
  return result;
}

}  // namespace counterpoise::models::continuous
