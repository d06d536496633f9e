#pragma once
// Profile-likelihood intervals for one parameter.
//
// What is computed. For parameter j, the profile S_p(θ_j) = min over the other
// parameters of S(θ) with θ_j held, and the interval
//     { θ_j : S_p(θ_j) − S_min ≤ t²_{(1+c)/2, ν_j} }
// (Bates & Watts, Nonlinear Regression Analysis and Its Applications, 1988,
// §6.1, the likelihood-ratio / profile-t interval — from memory), with ν_j the
// fit's degrees of freedom for θ_j. S is the weighted sum of squares with each
// group's σ_g replaced by σ'_g = σ_g·√(s_g²·f_g): s_g² the group's measured
// residual variance (1 with known σ_g; input noise and counted errors included,
// least_squares.h) and f_g its autocorrelation inflation. Then
// every group has unit residual variance at the minimum; after group-σ
// re-estimation s_g ≈ 1 already, and for one group the rule is the classical
// (S_p − S_min)/s² ≤ t², s² = RSS/(n − p) of the full fit. For a model linear
// in its parameters S_p is an exact parabola and the interval is the Wald one;
// for a nonlinear model it follows the curvature the Wald interval ignores.
//
// How. From the Wald end θ̂_j ± t·se the held value steps outwards (doubling
// the distance) until S_p − S_min crosses t², then the crossing is found by
// the Illinois variant of regula falsi on √(S_p − S_min) − t, which is
// linear in θ_j for a linear model (one step exact). Each point is a full
// re-solve of the other parameters, warm-started from the previous point.
//
// When a side is not found (open interval). The profile stays below t² out to
// ProfileOptions::reach_standard_errors (the data do not bound θ_j on that
// side), a parameter bound is met first, or a solve fails; the side then
// reports the farthest value examined (the interval extends at least there)
// and the reason.
//
// When it breaks. Profiles with a robust loss are refused: Σρ(z²) is not a
// Gaussian log-likelihood, so t² is no threshold for it. With several groups
// whose s_g differ (no group-σ re-estimation) the rescaled objective weights the
// groups by their measured noise, so its minimum can differ slightly from θ̂;
// use estimate_group_sigmas. Autocorrelation enters only through f_g, as in Wald.

#include <string>

#include "fitters/core/least_squares.h"

namespace coilspin::core {

// An interval 20 standard errors wide on one side says the Wald interval is
// useless anyway; looking farther only spends solves (common practice).
inline constexpr double kDefaultProfileReachStandardErrors = 20.0;
// Each outward step doubles the distance from θ̂ (common practice for bracketing).
inline constexpr double kProfileStepGrowth = 2.0;
// The crossing is accepted when |√ΔS − t| ≤ this·t, i.e. the bound is placed to
// about 1e-4 of its distance from θ̂: far below any statistical meaning (an
// interval's own coverage is uncertain by far more), and reachable by a re-solve
// of a large joint problem, whose S is known only to about 1e-12 relative
// (measured: at 1e-10 every side of the demo's joint fit failed to resolve).
inline constexpr double kProfileRootTolerance = 1e-4;
// Regula falsi iterations per side; Illinois converges superlinearly, so
// a smooth profile needs under ten (common practice).
inline constexpr int kMaxProfileRootIterations = 60;

struct ProfileOptions {
  double confidence = 0.95;  // two-sided level c
  double reach_standard_errors = kDefaultProfileReachStandardErrors;
  double root_tolerance = kProfileRootTolerance;  // |√ΔS − t| ≤ root_tolerance·t
  bool IsValid(std::string* error) const;
};

struct ProfileSide {
  bool found = false;
  double bound = 0.0;   // the crossing; when not found the farthest value examined
  std::string reason;   // why not found; empty when found
};

struct ProfileInterval {
  bool usable = false;  // the profile could be computed (not: both sides found)
  std::string message;  // why not usable
  std::string name;
  double value = 0.0;      // θ̂_j of the fit
  double threshold = 0.0;  // t²_{(1+c)/2, ν_j}
  ProfileSide low;
  ProfileSide high;
  int solves = 0;          // re-solves used, both sides
  // se_j of the rescaled problem (Wald, σ'_g known): the scale of the profile's own
  // width. A caller whose covariance counts more than the groups' noise (input
  // noise, counted errors) stretches the sides by se_j(full)/rescaled_std_error.
  double rescaled_std_error = 0.0;
};

// `fit` must be problem.Solve's usable result; `problem` is only cloned.
ProfileInterval Profile(const LeastSquaresProblem& problem, const FitResult& fit, const std::string& name,
                        const ProfileOptions& options);

}  // namespace coilspin::core
