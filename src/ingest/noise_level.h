#pragma once
// The noise of a logged channel, as segmentation thresholds and noise models
// need it on real benches: coloured, quantised, riding on a signal.
//
// Why first differences are not enough. MAD(x_{k+1} − x_k)/(0.6745·√2) is σ
// for white noise, robustly, whatever level or ramp the signal follows. A real
// sensor's noise is coloured (a filtered tachometer, an anti-aliased ADC):
// for AR(1) noise with lag-1 correlation φ the first difference has variance
// 2σ²(1 − φ), so at φ = 0.9 the estimate is a third of σ and every threshold
// built on it is three times too tight (a 6-second flat run before a coast was
// split from it; a plateau broke into pieces).
//
// The estimate. Second differences at lag m,
//     s_k(m) = x_{k+m} − 2·x_k + x_{k−m},
// cancel a level and a ramp at every m; for stationary noise of marginal σ
// and autocorrelation ρ_j their variance is σ²·(6 − 8ρ_m + 2ρ_{2m})
// (variance of a linear combination), which rises to 6σ² once m is beyond the
// noise's correlation, while a signal's curvature adds x''·m², four times more
// per doubling of m. So, for m = 1, 2, 4, …, σ_m = MAD(s(m))/(0.6745·√6), and
// the noise σ is the largest σ_m up to the first doubling that either levels
// off (grows by less than kLevelledGrowthPerDoubling: the noise's correlation is
// passed) or grows by more than kSignalGrowthPerDoubling (coloured noise grows
// it by at most √2 per doubling; curvature by 4). The lag-1 correlation follows from
// σ_1²/σ² = (6 − 8φ + 2φ²)/6 for AR(1) noise: φ = 2 − √(1 + 3·σ_1²/σ²).
// Second differences whose span holds a jump of the signal (a change between
// neighbours beyond ten robust scales of the first differences: a supply step, a
// current's fast rise) are left out at every lag: a step capture's one edge, seen
// by 2m differences at lag m, otherwise passed for noise at long lags (measured: σ
// 60 % high and φ 0.975 for 0.93 on a real-rig capture, which made its input-noise
// term exceed the whole residual). MAD keeps spikes and the rest out.
//
// The reading step. An ADC or a counter reports multiples of a step q; its
// rounding adds q²/12 to the variance (a uniform error, statistics handbook)
// and, below a step, no change can be seen at all: `step` is returned so that
// a threshold is never below it (10 mV steps on 5 mV of noise gave σ = 0 from
// differences that were mostly exactly zero).

#include <cstddef>
#include <vector>

namespace coilspin {

// A doubling of the lag that grows σ_m by more than this is the signal's
// curvature, not noise: AR(1) noise grows it by at most √2 ≈ 1.41 per
// doubling, a curvature by 4 (both from the variance formula in the header).
inline constexpr double kSignalGrowthPerDoubling = 1.6;

// A channel counts as quantised only over this many distinct readings, or when
// at least this fraction of neighbouring readings differ by exactly one step (noise
// toggling a code): a noise-free staircase of a few levels (or a clean jump
// between two values) is also "whole multiples of one step", the spacing of its
// levels, which is no reading step (common practice: an ADC's codes are many, and
// noise near a code boundary toggles them).
inline constexpr std::size_t kMinDistinctReadings = 20;
inline constexpr double kMinToggleFraction = 0.05;

// ... and one that grows it by less than this has levelled off: the lag is
// beyond the noise's correlation, and longer lags would only take in more of the
// signal's edges (a staircase's steps). An estimate from 10⁴ differences is good
// to about 1 % (MAD efficiency), so 5 % is growth, not chance.
inline constexpr double kLevelledGrowthPerDoubling = 1.05;

struct ChannelNoise {
  double sigma = 0.0;       // marginal σ of the noise, at least step/√12
  double lag1 = 0.0;        // φ, its lag-1 correlation as AR(1) noise (0 for white)
  double step = 0.0;        // q, the reading step when the channel is quantised; 0 otherwise
  double white_sigma = 0.0; // the first-difference estimate MAD(Δx)/(0.6745·√2), for reference
};

// The reading step comes from whole_count_step.h (every reading a whole number
// of steps from the first).
ChannelNoise EstimateChannelNoise(const std::vector<double>& x);

}  // namespace coilspin
