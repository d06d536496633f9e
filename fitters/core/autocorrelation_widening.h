#pragma once
// Widening the Wald intervals of a group whose residuals are autocorrelated.
//
// The problem. The covariance of least_squares.h assumes independent
// residuals. A time series whose errors are correlated carries less
// information than its n samples: for a mean (and for any parameter whose
// sensitivity varies slowly along the series, such as a slope or a time
// constant) the variance of the estimate is larger by the integrated
// autocorrelation time
//     τ_int = 1 + 2·Σ_{k≥1} ρ_k
// and the series is worth an effective sample size n_eff = n/τ_int. For a
// first-order autoregression ρ_k = φ^k this is the familiar (1 + φ)/(1 − φ)
// (Wilks, Statistical Methods in the Atmospheric Sciences; Bretherton et al.,
// J. Climate 12, 1999 — both from memory). Real benches are rarely AR(1): a
// tachometer's coloured noise on top of a slow misfit of the model (friction
// that wanders, a drag the model lacks) decays in two stages, and a coast
// logged for minutes can be worth a handful of independent samples while its
// lag-1 correlation looks moderate.
//
// The estimate. Geyer's initial monotone sequence estimator (Geyer, Practical
// Markov chain Monte Carlo, Statistical Science 7(4), 1992 — from memory):
// with Γ_m = ρ̂_{2m} + ρ̂_{2m+1} (ρ̂_0 = 1), sum Γ_0, Γ_1, … up to the last
// one clearly positive (kGeyerStopStandardErrors), each taken no larger than the
// one before, and
//     τ̂ = −1 + 2·Σ_m Γ_m.
// Pairs of a positive-definite autocorrelation are positive and decreasing, so
// the sum stops by itself where the estimated correlations turn into noise,
// whether the correlation dies after two lags or after thousands: no window
// constant is chosen by hand (unlike Sokal's window, which stops early on a
// white series with a weak slow part). The lagged sums come from one Fourier
// transform (lagged_sums.h).
//
// For noise close to AR(1) the factor (1 + ρ̂_1)/(1 − ρ̂_1) of the lag-1
// correlation alone is the steadier estimate (one lag, where the sum adds the
// noise of many): the larger of the two is used.
//
// What the core does. With SolveOptions::widen_for_autocorrelation, a group g
// with n_g ≥ kMinResidualsForWidening residuals whose τ̂ exceeds 1 by more than
// max(kMinimumWidening, kWideningStandardErrors·√(2(2L+1)/n_g)) — L the lags
// the estimate summed; the second term is twice the standard error of τ̂ for
// white noise (Madras & Sokal, J. Stat. Phys. 50, 1988 — from memory) — has its
// whole sandwich term multiplied by f_g = τ̂, and its residual degrees of
// freedom in the Welch–Satterthwaite combination taken as n_g/f_g − h_g (never
// below kMinimumEffectiveDegreesOfFreedom). s_g² itself is unchanged: RSS/(n − h)
// estimates the marginal variance, which f multiplies. The estimate runs on the
// residuals the fit kept: outliers set aside at ingest (src/ingest/outliers.h)
// can no longer pull the correlation towards zero.
//
// Input noise explained elsewhere. Part of a group's autocorrelation may come
// from noise on a logged input that drives the model, or from a quantised
// reading, which separate covariance terms count (input_noise_autocovariance.h,
// quantisation.h). Given their expected lagged sums a_m (in the weighted
// residuals' units), the decision and the factor rest on what is left, the
// group's own autocorrelation
//     ρ_m = (c_m − a_m)/(c_0 − a_0),   c_m = Σ_k (z_k − z̄)(z_{k+m} − z̄)
// (a_m = 0 beyond the lags given, which can only widen more).
//
// When it breaks. A misfit so slow that the whole series holds a few of its
// periods is under-estimated: the fit absorbs part of it and the residuals'
// long-lag correlations come out low (the estimate is then a lower bound; the
// result names the widening and the effective sample size, so a reader sees
// how few independent samples a log held). A parameter whose sensitivity
// alternates from sample to sample is over-widened. Intervals change in a step
// when τ̂ crosses the threshold.

#include <Eigen/Dense>

#include "fitters/core/lagged_sums.h"

namespace coilspin::core {

// τ̂ of a handful of residuals is mostly noise (ρ̂₁ alone has a standard error
// ≈ 1/√n, 0.18 for 30 residuals; Bartlett, Box & Jenkins §2.1.6 — from memory),
// so groups shorter than this (plateau means) are never widened (common practice).
inline constexpr int kMinResidualsForWidening = 30;

// τ̂ − 1 below this: intervals less than 5 % wider, not worth a flag in the
// result (common practice).
inline constexpr double kMinimumWidening = 0.1;

// Widening starts two standard errors of τ̂ above 1 (white noise: about 2 % of
// white groups are widened, by little; one-sided normal tail).
inline constexpr double kWideningStandardErrors = 2.0;

// A strongly correlated short group can have n_eff ≤ h_g; its degrees of freedom
// are then taken as this floor (t with 1 degree of freedom, the widest usual
// quantile) rather than undefined (common practice).
inline constexpr double kMinimumEffectiveDegreesOfFreedom = 1.0;

// The sum stops at the first pair Γ_m that is not above this many of its own
// standard errors: √(var ρ̂) from Bartlett's formula var ρ̂_m ≈ (1 + 2·Σ_{k<m} ρ_k²)/n
// (Bartlett 1946; Box & Jenkins §2.1.6 — from memory) for the whole series, scaled by
// c_0/(c_0 − a_0) when part of it is explained, and times kPairStandardErrorsPerLag for
// the two (nearly fully correlated, in a persistent series) lags of a pair. Geyer's own
// rule stops at the first non-positive pair; where most of a series is explained by
// counted noise, the remainder's pairs are that noise's realisation less its
// expectation, positive half the time and correlated from lag to lag, and a sum that
// runs on over them counted it again (measured: a 45 % excess on an AR(1) output under
// an input-noise part half its size). One standard error keeps the slow parts that
// matter: a correlation ρ_k is summed until it falls below about √(τ/n).
inline constexpr double kGeyerStopStandardErrors = 2.0;
inline constexpr double kPairStandardErrorsPerLag = 2.0;

struct IntegratedTime {
  double tau = 1.0;  // τ̂ ≥ 1
  int lags = 0;      // L, the lags summed (2·pairs − 1; 0 for none)
};

// Geyer's initial monotone sequence estimate from the lagged sums c_0 … c_M of a
// centred series of `num_samples` values (0: M + 1), less `explained` (a_0 … a_M;
// empty for none).
IntegratedTime GeyerIntegratedTime(const LaggedSums& sums, const LaggedSums& explained = {}, double num_samples = 0.0);

// τ̂ of a series (centred here).
double IntegratedAutocorrelationTime(const Eigen::VectorXd& residuals);

struct AutocorrelationWidening {
  bool widened = false;
  double inflation = 1.0;               // f_g = max(τ̂, AR(1) factor); 1 when not widened
  double effective_num_residuals = 0.0; // n_g / f_g; n_g when not widened
  double integrated_time = 1.0;         // max(τ̂, AR(1) factor) of the group's own part, widened or not
  int lags = 0;                         // L, the lags τ̂ summed
};

// The decision for one group's (weighted) residuals z, less the part `explained`
// by counted noise (a_0 … a_M in the units of z², empty for none). No widening
// when the explained variance a_0 is not below c_0 (nothing of the group's own left).
AutocorrelationWidening DecideWidening(const Eigen::VectorXd& residuals, const LaggedSums& explained);

}  // namespace coilspin::core
