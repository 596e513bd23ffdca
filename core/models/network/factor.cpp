#include "core/models/network/factor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::models::network {

namespace {
constexpr double kMinusInf = -std::numeric_limits<double>::infinity();

// Stride of position `pos` in row-major order (last variable fastest).
std::size_t stride_of(const Factor& phi, std::size_t pos) {
  std::size_t stride = 1;
  for (std::size_t i = pos + 1; i < phi.cards.size(); ++i) stride *= phi.cards[i];
  return stride;
}
// The layout of phi seen as [outer][card of var][inner], and an empty factor without var.
struct Split {
  std::size_t card, inner, outer;
  Factor rest;
};
Split split_at(const Factor& phi, std::size_t pos) {
  Split s{phi.cards[pos], stride_of(phi, pos), 0, Factor{phi.vars, phi.cards, {}}};
  s.outer = phi.size() / (s.card * s.inner);
  s.rest.vars.erase(s.rest.vars.begin() + static_cast<std::ptrdiff_t>(pos));
  s.rest.cards.erase(s.rest.cards.begin() + static_cast<std::ptrdiff_t>(pos));
  s.rest.log10_values.resize(s.outer * s.inner);
  return s;
}
}  // namespace

std::size_t Factor::position(std::size_t var) const noexcept {
  return static_cast<std::size_t>(std::find(vars.begin(), vars.end(), var) - vars.begin());
}

Factor multiply(const Factor& a, const Factor& b) {
  Factor out{a.vars, a.cards, {}};
  for (std::size_t j = 0; j < b.vars.size(); ++j) {
    if (a.position(b.vars[j]) == a.vars.size()) {
      out.vars.push_back(b.vars[j]);
      out.cards.push_back(b.cards[j]);
    }
  }
  const std::size_t n = out.vars.size();
  std::size_t total = 1;
  for (auto c : out.cards) total *= c;
  // Stride of each output variable inside a and inside b (0 when the factor lacks it).
  std::vector<std::size_t> stride_a(n, 0), stride_b(n, 0);
  for (std::size_t i = 0; i < n; ++i) {
    if (const auto p = a.position(out.vars[i]); p < a.vars.size()) stride_a[i] = stride_of(a, p);
    if (const auto p = b.position(out.vars[i]); p < b.vars.size()) stride_b[i] = stride_of(b, p);
  }
  out.log10_values.resize(total);
  std::vector<std::size_t> assignment(n, 0);
  std::size_t index_a = 0, index_b = 0;
  for (std::size_t k = 0; k < total; ++k) {
    out.log10_values[k] = a.log10_values[index_a] + b.log10_values[index_b];
    // Odometer step, last variable fastest, keeping the two source indices in step.
    for (std::size_t l = n; l-- > 0;) {
      ++assignment[l];
      index_a += stride_a[l];
      index_b += stride_b[l];
      if (assignment[l] < out.cards[l]) break;
      index_a -= out.cards[l] * stride_a[l];
      index_b -= out.cards[l] * stride_b[l];
      assignment[l] = 0;
    }
  }
  return out;
}

Factor sum_out(const Factor& phi, std::size_t var) {
  const std::size_t pos = phi.position(var);
  if (pos == phi.vars.size()) return phi;
  auto [card, inner, outer, out] = split_at(phi, pos);
  for (std::size_t hi = 0; hi < outer; ++hi) {
    for (std::size_t lo = 0; lo < inner; ++lo) {
      const std::size_t base = hi * card * inner + lo;
      double top = kMinusInf;
      for (std::size_t x = 0; x < card; ++x) top = std::max(top, phi.log10_values[base + x * inner]);
      double value = top;
      if (top != kMinusInf) {
        double scaled = 0.0;
        for (std::size_t x = 0; x < card; ++x)
          scaled += std::exp((phi.log10_values[base + x * inner] - top) * numbers::kLn10);
        value = top + std::log10(scaled);
      }
      out.log10_values[hi * inner + lo] = value;
    }
  }
  return out;
}

Factor reduce(const Factor& phi, std::size_t var, std::size_t state) {
  const std::size_t pos = phi.position(var);
  if (pos == phi.vars.size()) return phi;
  auto [card, inner, outer, out] = split_at(phi, pos);
  for (std::size_t hi = 0; hi < outer; ++hi)
    for (std::size_t lo = 0; lo < inner; ++lo)
      out.log10_values[hi * inner + lo] = phi.log10_values[hi * card * inner + state * inner + lo];
  return out;
}

}  // namespace counterpoise::models::network
