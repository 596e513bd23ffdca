#pragma once
// Uncertainty about the drop-out probability d. The probability of the findings under a
// proposition, with d unknown but described by a distribution f, is the average of the
// probability over d: P(E | H) = integral of P(E | H, d) f(d) dd — d is a nuisance parameter
// marginalised under each proposition (common practice; the treatment of d in Balding &
// Buckleton 2009, Forensic Sci. Int. Genet. 4:1, is by a distribution — from memory). One d
// serves every locus of the profile, so the integral is taken of the product over loci, not
// locus by locus. The integral is computed by tanh-sinh quadrature (Boost.Math), which copes
// with the endpoint singularities of Beta densities with a shape parameter below 1.
// The curve of log10 LR over d in [0, 1] is kept beside it, with the d that minimises the LR.

#include <functional>
#include <optional>
#include <vector>

#include "core/probability/probability_assignment.hpp"

namespace counterpoise::models::dna_mixture {

// log10 of the expectation of 10^log10_likelihood(d) for d drawn from `dropout` (a point value,
// an interval uniform on d or on log10 d, a Beta distribution or counts). -inf when the
// likelihood is zero wherever the distribution puts mass. The likelihood must be finite or -inf.
double log10_expected_likelihood(const probability::Assignment& dropout,
                                 const std::function<double(double)>& log10_likelihood);

struct CurvePoint {
  double d = 0.0;
  std::optional<double> log10_lr;  // nullopt where the findings are impossible under both
};

struct DropoutCurve {
  std::vector<CurvePoint> points;   // d = 0, 1/(n-1), ..., 1
  CurvePoint minimum;               // the d minimising the LR (refined between grid points)
};

// log10 LR over d on `count` evenly spaced points of [0, 1] (count >= 3), with the minimum found
// on the grid and refined by Brent's method on the neighbouring interval. log10_lr returns
// -inf/+inf for LR zero/infinite and nullopt where the LR is undefined.
DropoutCurve dropout_curve(const std::function<std::optional<double>(double)>& log10_lr, int count);

}  // namespace counterpoise::models::dna_mixture
