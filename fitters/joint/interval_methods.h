#pragma once
// The interval method of a motor fit (docs/intervals.md):
//   wald       θ ± t·se from the covariance (with the input-noise terms and the
//              effective-sample-size widening of autocorrelated channels); the default;
//   profile    profile-likelihood intervals for the model parameters (asymmetric
//              where the model is curved, e.g. L and J), Wald where a side is not
//              found, with the reason;
//   bootstrap  moving-block bootstrap over each test's residuals, percentile
//              intervals; derived quantities from the same replicates.
// Both alternatives start from the solved joint problem and never change it.
//
// Noise on a logged input (the voltage that drives a step model) is not in the
// residuals that profile and bootstrap work on; its first-order covariance
// (the input-noise terms of the Wald fit) is added to them as an independent
// variance: each side of the interval is stretched by k = √(1 + v_in/v), v the
// method's own variance of the parameter (the output-only Wald variance for the
// profile, the replicates' variance for the bootstrap), and the bootstrap's
// covariance gains the input term.

#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "fitters/core/bootstrap.h"
#include "fitters/core/least_squares.h"
#include "fitters/core/progress.h"

namespace coilspin::joint {

enum class IntervalMethod { kWald, kProfile, kBootstrap };

const char* IntervalMethodName(IntervalMethod method);
std::optional<IntervalMethod> IntervalMethodFromString(const std::string& text);

struct IntervalOptions {
  IntervalMethod method = IntervalMethod::kWald;
  int replicates = 200;
  std::uint64_t seed = core::kDefaultBootstrapSeed;
};

// Profile intervals for `names` replace the Wald ones in *fit (whose covariance
// includes every added term: input noise, counted errors), their sides stretched
// by se(fit)/se(rescaled problem); notes say where a side was not found.
// Reports ProgressStage::kProfileIntervals, one unit per name, to `progress`.
void ApplyProfileIntervals(const core::LeastSquaresProblem& problem, const std::vector<std::string>& names,
                           core::FitResult* fit, std::vector<std::string>* notes, const core::Progress& progress = {});

// Bootstrap intervals replace the Wald ones (and the replicates' covariance the
// fit's) in *fit. added_covariance: the terms resampling cannot reproduce (the
// input-noise terms, counted quantisation errors; same layout as fit->covariance),
// added to the replicates' covariance and stretching the percentile sides by
// √(1 + added/replicate variance). Empty, with a note, when the bootstrap is not usable.
// Reports ProgressStage::kBootstrapReplicates to `progress`.
std::optional<core::BootstrapResult> ApplyBootstrapIntervals(const core::LeastSquaresProblem& problem,
                                                             const IntervalOptions& options,
                                                             const Eigen::MatrixXd& added_covariance,
                                                             core::FitResult* fit, std::vector<std::string>* notes,
                                                             const core::Progress& progress = {});

}  // namespace coilspin::joint
