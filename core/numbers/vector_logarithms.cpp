#include "core/numbers/vector_logarithms.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>

#if defined(__x86_64__) && defined(__GLIBC__) && (defined(__GNUC__) || defined(__clang__))
#define COUNTERPOISE_LIBMVEC 1
#include <immintrin.h>
#endif

namespace counterpoise::numbers {

#ifdef COUNTERPOISE_LIBMVEC

// libmvec's entry points (glibc >= 2.22 for log, 2.35 for log1p). Each is an indirect function:
// the C library picks the implementation for the processor once, at load time (the 4-lane one
// falls back to two 2-lane calls on a processor without AVX2).
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wpsabi"
extern "C" {
__m128d _ZGVbN2v_log1p(__m128d) noexcept;
__m128d _ZGVbN2v_log(__m128d) noexcept;
__attribute__((target("avx2"))) __m256d _ZGVdN4v_log1p(__m256d) noexcept;
}
#pragma GCC diagnostic pop

namespace {

// Compiled for AVX2 on its own (core is built for baseline x86-64) and called only when the
// processor has AVX2; the compiler clears the upper register halves on return
// (numbers/vector_state.hpp).
__attribute__((target("avx2"))) void log_one_plus_4(const double* x, double* out, std::size_t n) noexcept {
  std::size_t i = 0;
  for (; i + 4 <= n; i += 4) _mm256_storeu_pd(out + i, _ZGVdN4v_log1p(_mm256_loadu_pd(x + i)));
  if (i == n) return;
  // The last one to three values through the same function, so a value never depends on where
  // it stands.
  double rest[4] = {0.0, 0.0, 0.0, 0.0};
  std::copy(x + i, x + n, rest);
  _mm256_storeu_pd(rest, _ZGVdN4v_log1p(_mm256_loadu_pd(rest)));
  std::copy(rest, rest + (n - i), out + i);
}

void log_one_plus_2(const double* x, double* out, std::size_t n) noexcept {
  std::size_t i = 0;
  for (; i + 2 <= n; i += 2) _mm_storeu_pd(out + i, _ZGVbN2v_log1p(_mm_loadu_pd(x + i)));
  if (i < n) out[i] = _mm_cvtsd_f64(_ZGVbN2v_log1p(_mm_set_pd(0.0, x[i])));
}

bool processor_has_avx2() noexcept {
  static const bool has_avx2 = __builtin_cpu_supports("avx2");
  return has_avx2;
}

}  // namespace

void log_one_plus_each(std::span<const double> x, std::span<double> out) noexcept {
  if (processor_has_avx2()) log_one_plus_4(x.data(), out.data(), x.size());
  else log_one_plus_2(x.data(), out.data(), x.size());
}

std::pair<double, double> log_of_pair(double a, double b) noexcept {
  const __m128d logs = _ZGVbN2v_log(_mm_set_pd(b, a));
  return {_mm_cvtsd_f64(logs), _mm_cvtsd_f64(_mm_unpackhi_pd(logs, logs))};
}

#else

void log_one_plus_each(std::span<const double> x, std::span<double> out) noexcept {
  std::transform(x.begin(), x.end(), out.begin(), [](double v) { return std::log1p(v); });
}

std::pair<double, double> log_of_pair(double a, double b) noexcept { return {std::log(a), std::log(b)}; }

#endif

}  // namespace counterpoise::numbers
