#pragma once
// Comparing a computed likelihood ratio with a stated one (a verbal band edge, LR 1). A ratio of
// decimal probabilities is rarely exact in binary: 0.3 / 0.003 gives log10 LR
// 1.9999999999999998, one unit in the last place below the edge at LR 100. Two LRs are taken as
// equal when they differ by at most kLrRelativeTolerance relative to each other, i.e. when their
// log10 values differ by at most log10(1 + 1e-12) ≈ 4.3e-13. That is thousands of units in the
// last place of a log10 near 2 (rounding in a model's arithmetic stays far below it) and far
// below any difference a person could state or read (common practice: compare floating-point
// results with a stated relative tolerance, e.g. Goldberg 1991, ACM Computing Surveys 23:5).

namespace counterpoise::numbers {

// The relative tolerance within which two likelihood ratios are the same value.
inline constexpr double kLrRelativeTolerance = 1e-12;

// The same tolerance on the log10 scale: log10(1 + 1e-12).
inline constexpr double kLog10LrTolerance = 4.342944819030346e-13;  // log1p(1e-12) / ln 10

// True when the LR 10^log10_lr is at least the edge 10^log10_edge, allowing the tolerance
// (so an LR equal to the edge in decimal arithmetic reaches it). Infinite values compare exactly.
bool reaches_edge(double log10_lr, double log10_edge) noexcept;

// True when the LR 10^log10_lr is 1 within the tolerance.
bool is_neutral_log10(double log10_lr) noexcept;

}  // namespace counterpoise::numbers
