#pragma once
// Robust losses for logs with spikes, applied inside the residual block.
//
// What is minimised. With z = r/σ_g the weighted residual, a robust fit
// minimises Σ_g Σ_k ρ(z_gk²) instead of Σ z². Huber (Huber, Robust Statistics,
// 1981) and Cauchy (also "Lorentzian") losses, with tuning constant k:
//     Huber   ρ(s) = s                  for s ≤ k²,    2k·√s − k²  above
//     Cauchy  ρ(s) = k²·ln(1 + s/k²)
// Both equal s near 0, so small residuals count as in least squares; a large
// residual costs like |z| (Huber) or like ln z (Cauchy), so one spike cannot
// drag the fit.
//
// Why a transform and not Ceres' LossFunction. A motor fitter adds a whole time
// series as one residual block (output-error simulations are recursive), and
// Ceres applies a LossFunction to a block's squared norm, not to each
// residual. So each residual is transformed instead:
//     z̃ = sign(z)·√ρ(z²)       so that  Σ z̃² = Σ ρ(z²),
// and the unchanged least-squares machinery minimises the robust objective.
// z̃ is smooth in z (for Huber z̃ = z inside ±k, and dz̃/dz = 1 at |z| = k;
// for Cauchy z̃ = z·√(ln(1+u)/u), u = z²/k², with log1p (ln(1+u) formed as
// log(1 + u) would lose digits for small u) and by its series near 0, so that
// automatic differentiation never meets 0/0 or √0).
//
// The scale. k is in units of σ_g, so the σ_g must be right: a robust fit
// estimates them from the median absolute deviation, σ_g = 1.4826·MAD, in the
// group-σ rounds (SolveOptions::estimate_group_sigmas), or takes them as known.
//
// When it breaks. The Wald covariance of a robust fit is the Gauss–Newton one
// of the transformed residuals: it treats a down-weighted spike as a point of
// small weight rather than of zero influence, so its intervals are only
// approximate; use the bootstrap (bootstrap.h) for honest ones. More than
// about a quarter of the residuals wild, or spikes that agree with each other
// (a step, not a spike), defeat any M-estimator.

#include <cmath>
#include <optional>
#include <string>

namespace coilspin::core {

enum class RobustLoss { kSquared, kHuber, kCauchy };

// "squared", "huber", "cauchy"; the from-string side returns nullopt for anything else.
std::string RobustLossToString(RobustLoss loss);
std::optional<RobustLoss> RobustLossFromString(const std::string& name);

// Tuning constants giving 95 % asymptotic efficiency at the normal distribution
// (Holland & Welsch, Commun. Statist. A6(9), 1977, table of tuning constants —
// from memory): Huber k = 1.345, Cauchy k = 2.385.
inline constexpr double kHuberTuning = 1.345;
inline constexpr double kCauchyTuning = 2.385;

// Below this u = z²/k² the Cauchy transform uses the series
// ln(1+u)/u = 1 − u/2 + u²/3 − u³/4 + …; the first omitted term, u⁴/5, is then
// below 2·10⁻¹⁷, under double rounding (common practice for a removable singularity).
inline constexpr double kCauchySeriesLimit = 1e-4;

double RobustTuning(RobustLoss loss);  // k of the loss; 1 for kSquared (unused)

// z̃ = sign(z)·√ρ(z²) for one weighted residual z; T is double or a Ceres Jet.
template <typename T>
T RobustResidual(const T& z, RobustLoss loss) {
  using std::log1p;
  using std::sqrt;
  switch (loss) {
    case RobustLoss::kSquared:
      return z;
    case RobustLoss::kHuber: {
      const double k = kHuberTuning;
      if (z <= T(k) && z >= T(-k)) return z;
      const T magnitude = sqrt(T(2.0 * k) * (z < T(0.0) ? -z : z) - T(k * k));
      return z < T(0.0) ? -magnitude : magnitude;
    }
    case RobustLoss::kCauchy: {
      const double k = kCauchyTuning;
      const T u = z * z / T(k * k);
      const T ratio = u < T(kCauchySeriesLimit) ? T(1.0) - u / T(2.0) + u * u / T(3.0) - u * u * u / T(4.0)
                                                 : log1p(u) / u;
      return z * sqrt(ratio);
    }
  }
  return z;
}

}  // namespace coilspin::core
