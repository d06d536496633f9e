#pragma once
// Summary statistics of one group's residual sequence e_1 … e_n (unweighted,
// in the order the residuals were added).
//
//   root mean square   rms = sqrt( Σ e_k² / n )
//   robust scale       1.4826 · median |e_k − median(e)|
//   lag-1 autocorrelation (Box & Jenkins, Time Series Analysis, the sample
//   autocorrelation function at lag 1)
//       r_1 = Σ_{k=1}^{n-1} (e_k − ē)(e_{k+1} − ē) / Σ_{k=1}^{n} (e_k − ē)²
//
// White residuals give r_1 ≈ 0 (standard error ≈ 1/√n); a first-order
// autoregressive sequence e_k = φ·e_{k−1} + w_k gives r_1 ≈ φ. Intervals that
// assume independent residuals are too narrow when r_1 is clearly positive.

#include <Eigen/Dense>

namespace coilspin::core {

// 0 for an empty sequence.
double RootMeanSquare(const Eigen::VectorXd& residuals);

// 0 when there are fewer than two residuals or they are all equal (no spread to correlate).
double Lag1Autocorrelation(const Eigen::VectorXd& residuals);

// Robust noise scale 1.4826·median_k |e_k − median(e)|: the factor 1/Φ⁻¹(3/4)
// makes it estimate σ for normal residuals (Hampel 1974; Huber, Robust
// Statistics, 1981 — from memory), and up to half the residuals may be wild
// without carrying it away. 0 for an empty sequence.
inline constexpr double kMadToSigma = 1.4826;
double MedianAbsoluteDeviationScale(const Eigen::VectorXd& residuals);

}  // namespace coilspin::core
