// Student-t and normal quantiles for the Wald intervals (see least_squares.h).
// The quantiles come from Boost.Math; nothing here approximates them.

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>
#include <cmath>
#include <limits>

#include "fitters/core/least_squares.h"
#include "fitters/core/require.h"

namespace coilspin::core {

double StudentTQuantile(double probability, double degrees_of_freedom) {
  Require(probability > 0.0 && probability < 1.0, "StudentTQuantile: probability must lie in (0, 1)");
  if (!(degrees_of_freedom > 0.0)) return std::numeric_limits<double>::quiet_NaN();  // no t interval
  if (std::isinf(degrees_of_freedom)) {
    return boost::math::quantile(boost::math::normal_distribution<double>(), probability);
  }
  return boost::math::quantile(boost::math::students_t_distribution<double>(degrees_of_freedom),
                               probability);
}

}  // namespace coilspin::core
