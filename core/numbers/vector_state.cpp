#include "core/numbers/vector_state.hpp"

#if defined(__x86_64__) || defined(__i386__)
#include <immintrin.h>
#endif

namespace counterpoise::numbers {

#if (defined(__x86_64__) || defined(__i386__)) && (defined(__GNUC__) || defined(__clang__))

namespace {

// Compiled for AVX on its own, so the rest of core keeps the baseline instruction set; it is
// called only after the processor has been found to support AVX.
__attribute__((target("avx"))) void zero_upper() noexcept { _mm256_zeroupper(); }

bool processor_has_avx() noexcept {
  static const bool has_avx = __builtin_cpu_supports("avx");
  return has_avx;
}

}  // namespace

void clear_upper_vector_state() noexcept {
  if (processor_has_avx()) zero_upper();
}

#else

void clear_upper_vector_state() noexcept {}

#endif

}  // namespace counterpoise::numbers
