#pragma once
// What a group's own noise estimate must leave out: the parts of its residuals
// that other terms count (input_noise_autocovariance.h, quantisation.h).
//
// For a group g with weighted residuals z = r/σ_g:
//   explained  a_m/σ_g² (+ b_m/σ_g²), m = 0 … M: the expected lagged sums of the
//              logged input's noise and of a quantised reading's error, left out
//              of s_g² and of the autocorrelation widening;
//   moment     E_φ[g·gᵀ], g = J_gᵀ·e(φ)/σ_g, of the quantisation error, whose term
//              C·E[g·gᵀ]·C joins the covariance (group_covariance.h).

#include <Eigen/Dense>
#include <vector>

#include "fitters/core/least_squares.h"

namespace coilspin::core {

struct CountedNoise {
  LaggedSums explained;            // in the units of z²; empty when nothing is counted
  Eigen::MatrixXd moment;          // p × p, or empty
};

// `values`: the problem's current parameter values (physical, all of them);
// `jacobian`: J_g = ∂z/∂x over the estimated parameters (n_g × p).
CountedNoise CountedNoiseOf(const GroupSpec& spec, double sigma, const std::vector<double>& values,
                            const Eigen::MatrixXd& jacobian, int max_lag);

}  // namespace coilspin::core
