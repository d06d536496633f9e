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
// When it breaks. Only the lag-1 coefficient is used, so noise that is not
// AR(1) (a slow drift, periodic ripple) is corrected only roughly; a drift that
// is really model error gives ρ̂ near 1 and very wide intervals, which is the
// honest outcome. ρ̂ is biased low by about (1 + 4ρ)/n after a fit (from memory,
// Kendall's bias of the serial correlation), so short series are under-widened.
// A parameter whose sensitivity alternates from sample to sample is over-widened.
// Intervals change in a step when ρ̂ crosses the threshold.

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

struct AutocorrelationWidening {
  bool widened = false;
  double inflation = 1.0;               // f_g; 1 when not widened
  double effective_num_residuals = 0.0; // n_g / f_g; n_g when not widened
};

// The decision for one group of `num_residuals` residuals with sample lag-1
// autocorrelation `lag1`.
AutocorrelationWidening DecideWidening(int num_residuals, double lag1);

}  // namespace coilspin::core
