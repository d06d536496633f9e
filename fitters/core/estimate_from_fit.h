#pragma once
// Turns the core's FitResult into the Ceres-free pieces of a MotorEstimate.

#include <cmath>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "fitters/core/motor_estimate.h"

namespace coilspin::core {

inline QuantityEstimate ToQuantity(const FitResult& fit, const std::string& name, const std::string& symbol,
                                   const std::string& unit, std::vector<std::string> tests) {
  const ParameterEstimate& p = fit.Get(name);
  QuantityEstimate q;
  q.key = name;
  q.symbol = symbol;
  q.unit = unit;
  q.value = p.value;
  q.std_error = p.std_error;
  q.ci_low = p.ci_low;
  q.ci_high = p.ci_high;
  q.degrees_of_freedom = p.degrees_of_freedom;
  q.tests = std::move(tests);
  return q;
}

inline SolverSummary ToSolverSummary(const FitResult& fit) {
  return SolverSummary{fit.converged, fit.termination, fit.iterations, fit.initial_cost, fit.final_cost};
}

// Covariance and correlation of the named parameters, in the given order.
// The sandwich covariance is symmetric only to rounding (terms up to 2e-7 apart
// relative); the estimate holds its symmetric part, (C + Cᵀ)/2, and the
// correlation of that, so both are exactly symmetric.
inline void CopyCovariance(const FitResult& fit, const std::vector<std::string>& names, MotorEstimate* estimate) {
  estimate->correlation_names = names;
  const std::size_t n = names.size();
  estimate->covariance.assign(n, std::vector<double>(n, 0.0));
  estimate->correlation.assign(n, std::vector<double>(n, 0.0));
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = 0; b < n; ++b) {
      const int ia = fit.IndexOf(names[a]);
      const int ib = fit.IndexOf(names[b]);
      estimate->covariance[a][b] = 0.5 * (fit.covariance(ia, ib) + fit.covariance(ib, ia));
    }
  const auto& c = estimate->covariance;
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = 0; b < n; ++b) {
      const double scale = std::sqrt(c[a][a] * c[b][b]);  // ρ_ab = C_ab/√(C_aa·C_bb)
      estimate->correlation[a][b] = !(scale > 0.0) ? 0.0 : a == b ? 1.0 : c[a][b] / scale;
    }
}

}  // namespace coilspin::core
