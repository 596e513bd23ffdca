#!/usr/bin/env python3
"""The NumPy side of bench_uncertainty (measured, never a test; CI does not need NumPy).

Does the same work as the C++ benchmark, vectorised:
- joint Monte Carlo: 100 000 draws of log10 LR for each of 40 items, each
  log10 Beta(a, b) - log10 Beta(k + 1, n - k + 1), summed over the items, then the 5/50/95 %
  quantiles;
- prior sweep: for 10 000 log-spaced prior log10 odds, the posterior log10 probability and its
  complement at the point LR (and, for the band, at both interval ends), each through
  t = 10^-|L|: larger = -log1p(t) / ln 10, smaller = -|L| + larger, as core/numbers/posterior.cpp.
Prints one "name wall_ms cpu_ms" line per figure (medians of repeats, wall clock and this thread's
CPU time) for the C++ benchmark to read.
"""
import sys
import time

import numpy as np

LN10 = np.log(10.0)


def median_ms(repeats, work):
    """Wall-clock and thread CPU-time medians (ms) of the same runs, as "wall cpu"."""
    wall, cpu = [], []
    for _ in range(repeats):
        start, cpu_start = time.perf_counter(), time.thread_time()
        work()
        cpu.append((time.thread_time() - cpu_start) * 1000.0)
        wall.append((time.perf_counter() - start) * 1000.0)
    return "%.4f %.4f" % (sorted(wall)[len(wall) // 2], sorted(cpu)[len(cpu) // 2])


def joint_monte_carlo(rng):
    total = np.zeros(100000)
    for i in range(40):
        a, b = 20.0 + i, 3.0 + (i % 5)
        k, n = 2 + (i % 7), 300 + 10 * i
        total += np.log10(rng.beta(a, b, 100000)) - np.log10(rng.beta(k + 1.0, n - k + 1.0, 100000))
    return np.quantile(total, [0.05, 0.5, 0.95])


def posterior(log10_odds):
    magnitude = np.abs(log10_odds)
    larger = -np.log1p(np.power(10.0, -magnitude)) / LN10
    smaller = -magnitude + larger
    positive = log10_odds >= 0
    return np.where(positive, larger, smaller), np.where(positive, smaller, larger)


def main():
    log10_lr, low, high = (float(x) for x in sys.argv[1:4]) if len(sys.argv) >= 4 else (80.0, 79.0, 81.0)
    rng = np.random.default_rng(40)
    print("numpy_monte_carlo_ms %s" % median_ms(3, lambda: joint_monte_carlo(rng)))
    priors = np.linspace(-12.0, 6.0, 10000)
    print("numpy_sweep_ms %s" % median_ms(21, lambda: posterior(priors + log10_lr)))
    print("numpy_sweep_band_ms %s" % median_ms(
        21, lambda: (posterior(priors + log10_lr), posterior(priors + low), posterior(priors + high))))
    print("numpy_version %s" % np.__version__)


if __name__ == "__main__":
    main()
