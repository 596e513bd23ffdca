#pragma once
// Discrete factors over network variables, held as log10 values so products of many small
// probabilities never underflow: a product adds logs, summing a variable out is a log-sum-exp
// shifted by the maximum (Koller & Friedman 2009, Probabilistic Graphical Models, section 9.3
// for the factor operations and appendix 10.A for the product by index strides — from memory
// for the section numbers).

#include <cstddef>
#include <vector>

namespace counterpoise::models::network {

// A factor phi(X_1, ..., X_m): vars[i] has cards[i] states; entries in row-major order with the
// first variable varying slowest (the CPT layout: parents first, the node itself last).
struct Factor {
  std::vector<std::size_t> vars;
  std::vector<std::size_t> cards;
  std::vector<double> log10_values;  // -inf for a zero entry

  // Number of entries (1 for a factor over no variables).
  std::size_t size() const noexcept { return log10_values.size(); }
  // Position of `var` in vars, or vars.size() when absent.
  std::size_t position(std::size_t var) const noexcept;
};

// The product phi_a · phi_b over the union of their variables (a's first, then b's new ones).
Factor multiply(const Factor& a, const Factor& b);
// sum over `var` of phi; phi unchanged (copied) when it does not contain var.
Factor sum_out(const Factor& phi, std::size_t var);
// phi with `var` fixed to `state` (the evidence reduction); unchanged when it does not contain var.
Factor reduce(const Factor& phi, std::size_t var, std::size_t state);

}  // namespace counterpoise::models::network
