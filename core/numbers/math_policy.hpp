#pragma once
// The one Boost.Math policy for all of core (a single typedef rather than per-file policy
// macros, which would break the one-definition rule). Domain and pole errors throw; overflow
// throws; we never want a silent NaN or a silently clamped value.

#include <boost/math/policies/policy.hpp>

namespace counterpoise::numbers {

using MathPolicy = boost::math::policies::policy<
    boost::math::policies::domain_error<boost::math::policies::throw_on_error>,
    boost::math::policies::pole_error<boost::math::policies::throw_on_error>,
    boost::math::policies::overflow_error<boost::math::policies::throw_on_error>,
    boost::math::policies::underflow_error<boost::math::policies::ignore_error>,
    boost::math::policies::evaluation_error<boost::math::policies::throw_on_error>,
    boost::math::policies::promote_double<false>>;

}  // namespace counterpoise::numbers
