#include "fitters/joint/interval_methods.h"

#include <cmath>

#include "fitters/core/added_covariance.h"
#include "fitters/core/profile.h"

namespace coilspin::joint {
namespace {

// k = √(1 + v_in/v): the stretch of an interval whose own variance v leaves out an added term v_in.
double InputStretch(double input_variance, double own_variance) {
  return own_variance > 0.0 ? std::sqrt(1.0 + input_variance / own_variance) : 1.0;
}

}  // namespace

const char* IntervalMethodName(IntervalMethod method) {
  switch (method) {
    case IntervalMethod::kWald: return "wald";
    case IntervalMethod::kProfile: return "profile";
    case IntervalMethod::kBootstrap: return "bootstrap";
  }
  return "wald";
}

std::optional<IntervalMethod> IntervalMethodFromString(const std::string& text) {
  for (IntervalMethod m : {IntervalMethod::kWald, IntervalMethod::kProfile, IntervalMethod::kBootstrap})
    if (text == IntervalMethodName(m)) return m;
  return std::nullopt;
}

void ApplyProfileIntervals(const core::LeastSquaresProblem& problem, const std::vector<std::string>& names,
                           core::FitResult* fit, std::vector<std::string>* notes, const core::Progress& progress) {
  core::ProfileOptions options;
  options.confidence = fit->confidence;
  const int total = static_cast<int>(names.size());
  int done = 0;
  for (const auto& name : names) {
    core::ReportProgress(progress, core::ProgressStage::kProfileIntervals, done++, total);
    const int index = fit->IndexOf(name);
    if (index < 0 || fit->parameters[static_cast<std::size_t>(index)].fixed) continue;
    const core::ProfileInterval profile = core::Profile(problem, *fit, name, options);
    core::ParameterEstimate& p = fit->parameters[static_cast<std::size_t>(index)];
    if (!profile.usable) {
      notes->push_back(name + ": no profile (" + profile.message + "); Wald interval kept");
      continue;
    }
    // The profile's own width follows the rescaled problem's Wald se; the fit's se also counts
    // the input noise and the counted errors: k = se(full)/se(rescaled), 1 for a linear model
    // with nothing counted apart.
    const double k = profile.rescaled_std_error > 0.0 ? p.std_error / profile.rescaled_std_error : 1.0;
    // The profile is of the plain least-squares cost, centred on θ̂ = θ_c − (θ_c − θ̂): its
    // sides are kept as distances from θ̂ and laid around the corrected estimate θ_c.
    const double least_squares = p.value - fit->input_noise_correction[static_cast<std::size_t>(index)];
    if (profile.low.found) p.ci_low = p.value - k * (least_squares - profile.low.bound);
    else notes->push_back(name + ": profile lower side not found (" + profile.low.reason + "); Wald side kept");
    if (profile.high.found) p.ci_high = p.value + k * (profile.high.bound - least_squares);
    else notes->push_back(name + ": profile upper side not found (" + profile.high.reason + "); Wald side kept");
  }
  core::ReportProgress(progress, core::ProgressStage::kProfileIntervals, total, total);
}

std::optional<core::BootstrapResult> ApplyBootstrapIntervals(const core::LeastSquaresProblem& problem,
                                                             const IntervalOptions& options,
                                                             const Eigen::MatrixXd& added_covariance,
                                                             core::FitResult* fit, std::vector<std::string>* notes,
                                                             const core::Progress& progress) {
  core::BootstrapOptions b;
  b.replicates = options.replicates;
  b.seed = options.seed;
  b.confidence = fit->confidence;
  b.progress = progress;
  core::BootstrapResult result = core::Bootstrap(problem, *fit, b);
  if (!result.usable) {
    notes->push_back("bootstrap not usable (" + result.message + "); Wald intervals kept");
    return std::nullopt;
  }
  if (result.failed > 0) notes->push_back(result.message);
  // The replicates' covariance, so correlations and warnings agree with the intervals.
  const Eigen::Index p = fit->covariance.rows();
  const double n = static_cast<double>(result.replicates.size());
  Eigen::VectorXd mean = Eigen::VectorXd::Zero(p);
  for (const auto& r : result.replicates) mean += Eigen::Map<const Eigen::VectorXd>(r.data(), p) / n;
  Eigen::MatrixXd covariance = Eigen::MatrixXd::Zero(p, p);
  for (const auto& r : result.replicates) {
    const Eigen::VectorXd d = Eigen::Map<const Eigen::VectorXd>(r.data(), p) - mean;
    covariance += d * d.transpose() / (n - 1.0);
  }
  covariance += added_covariance;
  core::SetCovariance(covariance, fit);
  for (std::size_t j = 0; j < fit->parameters.size(); ++j) {
    if (fit->parameters[j].fixed) continue;
    const core::ParameterEstimate& q = result.parameters[j];
    const auto at = static_cast<Eigen::Index>(j);
    // The added terms' stretch, and the expanded percentile interval for the Wald fit's ν_j (bootstrap.h).
    const double k = InputStretch(added_covariance(at, at), q.std_error * q.std_error) *
                     core::SmallSampleStretch(fit->parameters[j].degrees_of_freedom, fit->confidence);
    fit->parameters[j].std_error = std::sqrt(covariance(at, at));
    fit->parameters[j].ci_low = q.value - k * (q.value - q.ci_low);
    fit->parameters[j].ci_high = q.value + k * (q.ci_high - q.value);
    fit->parameters[j].degrees_of_freedom = q.degrees_of_freedom;
  }
  return result;
}

}  // namespace coilspin::joint
