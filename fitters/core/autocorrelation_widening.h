#pragma once
// Widening the Wald intervals of a group whose residuals are autocorrelated.
//
// The problem. The covariance of least_squares.h assumes independent
// residuals. A time series whose noise is a first-order autoregression
// e_k = ρ·e_{k−1} + w_k carries less information than its n samples: for a
// mean (and for any parameter whose sensitivity varies slowly along the
// series, such as a slope or a time constant) the variance of the estimate is
// larger by the factor
//     f = (1 + ρ)/(1 − ρ)
// and the series is worth an effective sample size
//     n_eff = n·(1 − ρ)/(1 + ρ) = n / f
// (Wilks, Statistical Methods in the Atmospheric Sciences, the variance
// inflation factor for AR(1) data — from memory; Bretherton et al., J. Climate
// 12, 1999, for the effective sample size — from memory).
//
// What the core does. With SolveOptions::widen_for_autocorrelation, a group g
// with n_g ≥ kMinResidualsForWidening whose sample lag-1 autocorrelation ρ̂_g
// exceeds max(kMinimumWidenedAutocorrelation, kWideningStandardErrors/√n_g)
// has its whole sandwich term multiplied by f_g (so v_gj and the covariances
// with it), and its residual degrees of freedom in the Welch–Satterthwaite
// combination taken as n_eff − h_g (never below kMinimumEffectiveDegreesOfFreedom).
// s_g² itself is unchanged: RSS/(n − h) estimates the marginal variance of an
// AR(1) series, which is what f multiplies.
//
// Beyond AR(1). Noise whose autocorrelation decays more slowly than ρ^k (the
// quantisation error of an encoder read at a near-constant speed is a slow
// sawtooth; measured on a step fit: ρ̂ = 0.13, 0.12, 0.07, 0.03 at lags 1, 2, 5,
// 10, where AR(1) would give 0.13, 0.02, 0.00) is under-widened by f. So for a
// group of quantised readings (GroupSpec::quantised), once widened, f is the
// larger of the AR(1) factor and the integrated autocorrelation time
//     τ_int = 1 + 2·Σ_{k=1}^{M} ρ̂_k,   M the first lag with M ≥ kSokalWindow·τ_int(M)
// (Sokal's automatic window, Monte Carlo Methods in Statistical Mechanics,
// 1989 — from memory), which for AR(1) noise tends to the same (1 + ρ)/(1 − ρ).
// Not for every group: in a joint fit the residuals of a step capture carry the
// logged voltage's noise through the winding's lag, a slow error already counted
// by the input-noise terms; τ_int on every group counted it twice (measured: L's
// interval 30 times its spread).
//
// Input noise explained elsewhere. Part of a group's autocorrelation may come
// from noise on a logged input that drives the model, which a separate
// covariance term counts (input_noise_autocovariance.h). Given its expected
// lagged sums a_m (in the weighted residuals' units), the decision and the
// factor rest on what is left, the output noise's own autocorrelation
//     ρ_m = (c_m − a_m)/(c_0 − a_0),   c_m = Σ_k (z_k − z̄)(z_{k+m} − z̄)
// (a_m = 0 beyond the lags given). Left out, a step fit's current residuals,
// whose lag-1 autocorrelation is mostly the logged voltage's noise seen
// through the winding's lag, were widened for it on top of that term.
//
// When it breaks. The decision to widen still rests on ρ̂₁, so noise that is
// correlated only beyond lag 1 is not widened; a drift that
// is really model error gives ρ̂ near 1 and very wide intervals, which is the
// honest outcome. ρ̂ is biased low by about (1 + 4ρ)/n after a fit (from memory,
// Kendall's bias of the serial correlation), so short series are under-widened.
// A parameter whose sensitivity alternates from sample to sample is over-widened.
// Intervals change in a step when ρ̂ crosses the threshold.

#include <Eigen/Dense>

#include "fitters/core/input_noise_autocovariance.h"

namespace coilspin::core {

// ρ̂₁ of a handful of residuals is mostly noise: its standard error is ≈ 1/√n
// (0.18 for 30 residuals; Bartlett, Box & Jenkins §2.1.6 — from memory), so
// groups shorter than this (plateau means) are never widened (common practice).
inline constexpr int kMinResidualsForWidening = 30;

// ρ̂₁ below this gives f < 1.105, intervals less than 5 % wider: not worth a
// flag in the result (common practice).
inline constexpr double kMinimumWidenedAutocorrelation = 0.05;

// White residuals give ρ̂₁ with standard error ≈ 1/√n (Bartlett, from memory);
// widening starts two standard errors above zero, so about 2 % of white groups
// are widened (one-sided normal tail), by little.
inline constexpr double kWideningStandardErrors = 2.0;

// A strongly correlated short group can have n_eff ≤ h_g; its degrees of freedom
// are then taken as this floor (t with 1 degree of freedom, the widest usual
// quantile) rather than undefined (common practice).
inline constexpr double kMinimumEffectiveDegreesOfFreedom = 1.0;

// Sokal's window constant c: the sum of ρ̂_k is cut at M ≥ c·τ_int, which keeps the
// truncation bias about e^(−c) for a single exponential decay while the sum's noise
// stays O(√(M/n)) (Sokal 1989 recommends c between 4 and 10 — from memory). The
// upper end, because residual noise is often mostly white with a weak slow part,
// whose decay time exceeds τ_int: measured on white noise plus a 10 % AR(1) part
// with φ = 0.95 (τ_int = 4.8), c = 6 stops at 3.6 and c = 10 at 4.4.
inline constexpr double kSokalWindow = 10.0;

struct AutocorrelationWidening {
  bool widened = false;
  double inflation = 1.0;               // f_g; 1 when not widened
  double effective_num_residuals = 0.0; // n_g / f_g; n_g when not widened
};

// The decision for one group of `num_residuals` residuals with sample lag-1
// autocorrelation `lag1`.
AutocorrelationWidening DecideWidening(int num_residuals, double lag1);

// τ_int of a series by Sokal's window (≥ 1).
double IntegratedAutocorrelationTime(const Eigen::VectorXd& residuals);

// The decision for one group's (weighted) residuals z, less the part `explained`
// by input noise (a_0 … a_M in the units of z², empty for none): DecideWidening
// on the remaining ρ_1, then, for a quantised reading and when widened,
// f = max(AR(1) factor, τ_int of the remaining ρ_m). No widening when the
// explained variance a_0 is not below c_0 (nothing of the group's own left).
AutocorrelationWidening DecideWidening(const Eigen::VectorXd& residuals, const LaggedSums& explained,
                                       bool quantised);

}  // namespace coilspin::core
