#pragma once
// Natural logarithms of several values in one call, through the vector variants of the C
// library's own functions (glibc's libmvec, x86-64 vector function ABI: _ZGVbN2v_log1p,
// _ZGVdN4v_log1p, _ZGVbN2v_log). A chunk of four values costs about what one scalar call costs,
// and no branch depends on the values, so the Monte Carlo draws (uncertainty/beta_draws) take
// their logarithms here instead of one glibc call per draw.
//
// Accuracy: libmvec's functions are accurate to a few units in the last place (glibc manual,
// "Known Maximum Errors in Math Functions"); measured against glibc's scalar log1p on 16 million
// arguments between 2^-30 and 2^30, at most 2 units. The 4-lane variant (processors with AVX2)
// and the 2-lane one (the rest, SSE2) are different code: a result can differ between them in the
// last bit, so a value is a function of its argument on a given processor, not across processors
// with and without AVX2. On other architectures or C libraries the scalar functions are used.

#include <span>
#include <utility>

namespace counterpoise::numbers {

// out[i] = ln(1 + x[i]) for every i, for x[i] >= -1 (-1 gives -inf, +inf gives +inf). x and out
// may be the same span; each value depends on x[i] alone, not on its position or the length.
// Requires out.size() >= x.size().
void log_one_plus_each(std::span<const double> x, std::span<double> out) noexcept;

// {ln a, ln b} for a, b >= 0, in one vector call.
std::pair<double, double> log_of_pair(double a, double b) noexcept;

}  // namespace counterpoise::numbers
