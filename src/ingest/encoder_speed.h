#pragma once
// Shaft speed from encoder position: a Savitzky–Golay first-derivative filter.
//
// What is computed. At each sample n a quadratic
//   θ(t) ≈ p0 + p1·(t − t_n) + p2·(t − t_n)²
// is fitted by least squares to a window of 2m+1 consecutive samples, and
// ω_n = p1. The fit is linear in θ, so ω_n = Σ_k c_k·θ_k with derivative
// weights c that depend on the sample times alone. The polynomial is fitted in
// t itself, so uniform and non-uniform sampling are treated alike; on uniform
// sampling away from the ends the weights are the classical
// c_k = k/(Δt·Σ_j j²), k = −m..m (the quadratic and the linear filter share
// them). Any quadratic θ(t) — constant angular acceleration — is
// differentiated exactly, at every sample.
//
// Ends. The first and last m samples have no centred window; they use the
// 2m+1 samples at that end of the record and evaluate the fitted slope off
// centre (a one-sided fit). Still exact for quadratics, but noisier (larger
// ‖c‖₂, reported per sample) and, where θ has more than quadratic curvature,
// more biased than the centred fit.
//
// Noise. Positions quantised to steps q = 2π/cpr carry an error uniform on
// ±q/2, σ_θ = q/√12. If that error is independent from sample to sample, the
// derived speed has σ_ω,n = σ_θ·‖c_n‖₂ and neighbouring speeds are correlated,
// ρ = Σ_k c_k·c_{k+1} / Σ_k c_k² (centred, uniform: ρ = 1 − 3/(2m+1)).
// Without counts per revolution σ_θ is estimated from the data
// (EstimatePositionNoise).
//
// When it breaks. The error of a quantised position is independent from sample
// to sample only while the shaft moves irregularly by a count or more between
// samples. Slower (near rest, or an exact whole number of counts per sample)
// the error is a slow sawtooth or a constant: the derived speed's actual error
// is then not the stated σ_ω (it may be smaller or larger), and a fitter should
// prefer fitting the position itself. A window longer than the time over which
// the acceleration changes biases the speed (a sinusoid of Ω rad/sample is
// attenuated by 2·Σ_{k=1..m} k·sin(kΩ) / (Ω·Σ_{k=−m..m} k²)).
//
// Window. Unless given, m is the smallest in [min_half_width, max_half_width]
// for which σ_ω (uniform formula at the median sampling interval) is at most
// target_noise_fraction of the speed range; the range is read from secant
// speeds over 2·max_half_width samples.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace coilspin {

struct SpeedFromPositionOptions {
  // Encoder counts per revolution: positions are multiples of q = 2π/cpr rad
  // and σ_θ = q/√12. Empty: σ_θ is estimated from the data.
  std::optional<double> counts_per_rev;
  // m: the window holds 2m+1 samples. Empty: chosen from the data.
  std::optional<std::size_t> half_width;
  // 5 samples: the shortest window with two samples more than the quadratic's
  // three coefficients, so the fit smooths rather than interpolates (common practice).
  std::size_t min_half_width = 2;
  // 51 samples: the longest window in common use for Savitzky–Golay smoothing
  // (common practice); longer windows attenuate the coast's curvature.
  std::size_t max_half_width = 25;
  // The derived speed's quantisation σ is at most 1 % of the speed range, so the
  // noise is small beside what the fitters resolve (common practice).
  double target_noise_fraction = 0.01;

  // False, with the reason in *error, when an option is out of range.
  bool IsValid(std::string* error) const;
};

struct DerivedSpeed {
  std::vector<double> speed_rad_s;        // ω_n, one per position sample
  std::vector<double> speed_sigma_rad_s;  // σ_θ·‖c_n‖₂ per sample (larger at the ends)
  std::size_t half_width = 0;             // m used
  std::size_t window_samples = 0;         // 2m+1
  double position_sigma_rad = 0.0;        // σ_θ
  double noise_sigma_rad_s = 0.0;         // median of speed_sigma_rad_s (the centred value on uniform sampling)
  double lag1_correlation = 0.0;          // median over neighbours of corr(ω_n, ω_{n+1}) from the weights
  std::string method;                     // "Savitzky–Golay first derivative, quadratic, 11-sample window, ..."
  std::string noise_source;               // where σ_θ came from
  SpeedFromPositionOptions options;       // as given
};

struct PositionNoise {
  double sigma_rad = 0.0;
  std::string source;  // how it was estimated
};

// Position noise σ_θ from the data: the residual at the centre of a 5-sample
// local quadratic fit, divided by its weight norm, over windows where the shaft
// moves; σ from their median absolute deviation (MAD/0.6745). When that is 0
// (positions on a grid), the smallest non-zero step q gives σ_θ = q/√12.
PositionNoise EstimatePositionNoise(const std::vector<double>& time_s, const std::vector<double>& position_rad);

// Throws std::invalid_argument for invalid options, channels of different
// lengths, fewer than 3 samples or time that is not strictly increasing
// (ingest guarantees all of these for a log it has read).
DerivedSpeed SpeedFromPosition(const std::vector<double>& time_s, const std::vector<double>& position_rad,
                               const SpeedFromPositionOptions& options = {});

}  // namespace coilspin
