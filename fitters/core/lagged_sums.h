#pragma once
// Lagged sums of a series, c_m = Σ_k x_k·x_{k+m}, for every lag at once.
//
// The autocovariance of a long residual series is wanted out to lags where a
// slow error has died away: thousands of lags for a coast logged for minutes.
// Summed directly that costs n·M products; by the Wiener–Khinchin relation the
// lagged sums are the inverse Fourier transform of |X|², X the transform of x
// padded with zeros to at least 2n (so that no lag wraps around onto another),
// which costs O(n log n) whatever M is (any signal-processing text; e.g.
// Press et al., Numerical Recipes, §13.2, "correlation" — from memory).
// Short requests (M below kDirectLagLimit) are summed directly: exact to
// rounding and cheaper than a transform.

#include <Eigen/Dense>
#include <vector>

namespace coilspin::core {

// a_0 … a_M, in the squared unit of the series; empty when there is nothing.
using LaggedSums = std::vector<double>;

// Up to this many lags the sums are formed directly (n·M products); beyond it by
// the Fourier transform. At M = 32 both cost about the same for n of 10³–10⁶ (common practice).
inline constexpr int kDirectLagLimit = 32;

// c_m = Σ_k x_k·x_{k+m} for m = 0 … min(max_lag, n − 1).
LaggedSums LaggedProducts(const Eigen::VectorXd& x, int max_lag);

// Adds the lagged sums of x to *sums (m = 0 … max_lag), sizing it on the first
// call: realisations are summed as they are made, never stored.
void AddLaggedSums(const Eigen::VectorXd& x, int max_lag, LaggedSums* sums);

}  // namespace coilspin::core
