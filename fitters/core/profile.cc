// Profile-likelihood intervals (profile.h): the rescaled clone, the outward
// bracketing and the Illinois root search on each side.

#include "fitters/core/profile.h"

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>

#include "fitters/core/problem_internals.h"

namespace coilspin::core {
namespace {

bool Fail(std::string* error, const std::string& why) {
  if (error != nullptr) *error = why;
  return false;
}

// One side's search state: the clone with θ_j held, a warm start, and S_min.
class SideSearch {
 public:
  SideSearch(const LeastSquaresProblem& base, int parameter, const SolveOptions& options, double minimum,
             std::vector<double> start, int* solves)
      : clone_(base.Clone()), parameter_(parameter), options_(options), minimum_(minimum),
        warm_(std::move(start)), solves_(solves) {}

  // √(S_p(θ_j) − S_min), or nothing when the solve fails.
  std::optional<double> RootDistance(double value) {
    clone_->SetValues(warm_);
    clone_->HoldAt(parameter_, value);
    const FitResult fit = clone_->Solve(options_);
    ++*solves_;
    if (!fit.converged || !std::isfinite(fit.final_cost)) return std::nullopt;
    warm_ = clone_->Values();
    return std::sqrt(std::max(0.0, 2.0 * fit.final_cost - minimum_));
  }

 private:
  std::unique_ptr<LeastSquaresProblem> clone_;
  int parameter_;
  SolveOptions options_;
  double minimum_;
  std::vector<double> warm_;
  int* solves_;
};

// Searches from `centre` in the direction of `step` (the Wald half-width, signed)
// for √ΔS = t, out to `reach` (= reach_standard_errors standard errors) or `bound`.
ProfileSide SearchSide(SideSearch& search, double centre, double step, double reach, double reach_standard_errors,
                       std::optional<double> bound, double t, double root_tolerance) {
  ProfileSide side;
  const double direction = step > 0.0 ? 1.0 : -1.0;
  double inside = centre;  // last value with √ΔS < t
  double inside_root = -t;
  double distance = std::abs(step);
  while (true) {
    double value = centre + direction * std::min(distance, reach);
    bool at_bound = false;
    if (bound && direction * (value - *bound) >= 0.0) {
      value = *bound;
      at_bound = true;
    }
    const std::optional<double> root = search.RootDistance(value);
    if (!root) {
      side.bound = inside;
      side.reason = "the solve with the parameter held at " + FormatNumber(value) + " failed";
      return side;
    }
    const double h = *root - t;
    if (h >= 0.0) {
      // Illinois: regula falsi that halves the stale end's value when one end repeats.
      double a = inside, fa = inside_root, b = value, fb = h;
      int repeated = 0;
      for (int iteration = 0; iteration < kMaxProfileRootIterations; ++iteration) {
        const double c = b - fb * (b - a) / (fb - fa);
        const std::optional<double> rc = search.RootDistance(c);
        if (!rc) break;
        const double fc = *rc - t;
        if (std::abs(fc) <= root_tolerance * t) {
          side.found = true;
          side.bound = c;
          return side;
        }
        if (fc >= 0.0) {
          b = c;
          fb = fc;
          if (repeated == -1) fa *= 0.5;
          repeated = -1;
        } else {
          a = c;
          fa = fc;
          if (repeated == 1) fb *= 0.5;
          repeated = 1;
        }
      }
      // Out of iterations (or a failed solve inside the bracket): the bracket's
      // outer end is a conservative bound, reported as not found.
      side.bound = b;
      side.reason = "the crossing was bracketed but not resolved to tolerance";
      return side;
    }
    inside = value;
    inside_root = h;
    if (at_bound) {
      side.bound = value;
      side.reason = "the parameter's bound " + FormatNumber(value) + " is inside the interval";
      return side;
    }
    if (distance >= reach) {
      side.bound = value;
      side.reason = "the profile stays below the threshold out to " + FormatNumber(value) + " (" +
                    FormatNumber(reach_standard_errors) + " standard errors from the estimate)";
      return side;
    }
    distance *= kProfileStepGrowth;
  }
}

}  // namespace

bool ProfileOptions::IsValid(std::string* error) const {
  if (!(confidence > 0.0 && confidence < 1.0)) return Fail(error, "confidence must lie strictly between 0 and 1");
  if (!(std::isfinite(reach_standard_errors) && reach_standard_errors > 0.0)) {
    return Fail(error, "reach_standard_errors must be positive and finite");
  }
  return true;
}

ProfileInterval Profile(const LeastSquaresProblem& problem, const FitResult& fit, const std::string& name,
                        const ProfileOptions& options) {
  ProfileInterval out;
  out.name = name;
  std::string error;
  const int j = fit.IndexOf(name);
  if (!options.IsValid(&error)) {
    out.message = "invalid profile options: " + error;
  } else if (!fit.usable || static_cast<int>(fit.parameters.size()) != problem.NumParameters()) {
    out.message = "the fit is not usable or not this problem's";
  } else if (j < 0) {
    out.message = "no parameter named '" + name + "'";
  } else if (fit.parameters[static_cast<std::size_t>(j)].fixed) {
    out.message = "parameter '" + name + "' is fixed";
  } else if (fit.options.loss != RobustLoss::kSquared) {
    out.message = "a profile needs the squared loss; the " + RobustLossToString(fit.options.loss) +
                  " objective is no Gaussian log-likelihood";
  }
  if (!out.message.empty()) return out;
  const ParameterEstimate& estimate = fit.parameters[static_cast<std::size_t>(j)];
  out.value = estimate.value;
  const double t = StudentTQuantile(0.5 * (1.0 + options.confidence), estimate.degrees_of_freedom);
  out.threshold = t * t;

  // The rescaled problem: σ'_g = σ_g·√(s_g²·f_g), at the full fit.
  const std::unique_ptr<LeastSquaresProblem> base = problem.Clone();
  std::vector<double> values;
  for (const ParameterEstimate& p : fit.parameters) values.push_back(p.value);
  base->SetValues(values);
  for (int g = 0; g < problem.NumGroups(); ++g) {
    const GroupStatistics& group = fit.groups[static_cast<std::size_t>(g)];
    if (group.num_residuals == 0) continue;
    // The measured s_g², input noise and counted errors included: the profile's shape comes
    // from this cost, its width is matched to the full Wald variance by the caller
    // (ProfileInterval::rescaled_std_error).
    const double variance = fit.options.residual_variance_from_data ? group.residual_variance : 1.0;
    base->SetGroupSigma(g, group.sigma * std::sqrt(variance * group.variance_inflation));
  }
  SolveOptions solve = fit.options;
  solve.estimate_group_sigmas = false;
  solve.residual_variance_from_data = false;  // σ'_g count as known; only the cost is used
  solve.widen_for_autocorrelation = false;
  solve.separate_input_noise = false;
  const FitResult minimum = base->Solve(solve);
  out.solves = 1;
  if (!minimum.converged) {
    out.message = "the rescaled problem did not converge at its minimum: " + minimum.message;
    return out;
  }
  out.rescaled_std_error = minimum.parameters[static_cast<std::size_t>(j)].std_error;
  const double minimum_cost = 2.0 * minimum.final_cost;
  const std::vector<double> start = base->Values();
  const double centre = start[static_cast<std::size_t>(j)];
  const double half_width = t * estimate.std_error;
  const double reach = options.reach_standard_errors * estimate.std_error;
  const ParameterSpec& spec = problem.Spec(j);

  SideSearch below(*base, j, solve, minimum_cost, start, &out.solves);
  out.low = SearchSide(below, centre, -half_width, reach, options.reach_standard_errors, spec.lower, t, options.root_tolerance);
  SideSearch above(*base, j, solve, minimum_cost, start, &out.solves);
  out.high = SearchSide(above, centre, half_width, reach, options.reach_standard_errors, spec.upper, t, options.root_tolerance);
  out.usable = true;
  return out;
}

}  // namespace coilspin::core
