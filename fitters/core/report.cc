// LeastSquaresProblem, the result: physical values, standard errors,
// intervals, covariance and correlation, group statistics (least_squares.h).

#include <cmath>
#include <limits>

#include "fitters/core/least_squares.h"
#include "fitters/core/problem_internals.h"
#include "fitters/core/residual_statistics.h"

namespace coilspin::core {
namespace {

bool Converged(ceres::TerminationType type) { return type == ceres::CONVERGENCE || type == ceres::USER_SUCCESS; }

}  // namespace

FitResult LeastSquaresProblem::Report(const SolveOptions& options, const std::vector<int>& estimated,
                                      const SolveRun& run, const FitAnalysis& analysis) const {
  const double not_a_number = std::numeric_limits<double>::quiet_NaN();
  const Eigen::Index count = static_cast<Eigen::Index>(parameters_.size());
  const Eigen::Index p = static_cast<Eigen::Index>(estimated.size());
  const ceres::Solver::Summary& summary = run.summary;
  FitResult result;
  result.converged = Converged(summary.termination_type);
  result.termination = ceres::TerminationTypeToString(summary.termination_type);
  result.iterations = run.iterations;
  result.refinement_steps = run.refinement_steps;
  result.initial_cost = run.initial_cost;
  result.final_cost = summary.final_cost;
  if (analysis.evaluated) result.final_cost = 0.5 * Stack(analysis.groups).weighted_residuals.squaredNorm();
  result.num_estimated = static_cast<int>(p);
  result.confidence = options.confidence;
  result.options = options;
  for (const auto& group : groups_) result.num_residuals += group->num_residuals;
  result.covariance = Eigen::MatrixXd::Zero(count, count);
  result.correlation = Eigen::MatrixXd::Zero(count, count);
  result.inverse_information = Eigen::MatrixXd::Zero(count, count);
  result.counted_covariance = Eigen::MatrixXd::Zero(count, count);
  result.input_noise_correction.assign(static_cast<std::size_t>(count), 0.0);

  // Physical covariance of the estimated parameters: S·Cov(x)·S.
  Eigen::VectorXd scales(p);
  for (Eigen::Index k = 0; k < p; ++k) {
    scales(k) = parameters_[static_cast<std::size_t>(estimated[static_cast<std::size_t>(k)])]->scale;
  }
  if (analysis.has_covariance) {
    const Eigen::MatrixXd physical = scales.asDiagonal() * analysis.breakdown.covariance * scales.asDiagonal();
    const Eigen::MatrixXd bread = scales.asDiagonal() * analysis.inverse_information * scales.asDiagonal();
    const Eigen::MatrixXd counted = scales.asDiagonal() * analysis.breakdown.counted_covariance * scales.asDiagonal();
    for (Eigen::Index a = 0; a < p; ++a) {
      for (Eigen::Index b = 0; b < p; ++b) {
        const Eigen::Index i = estimated[static_cast<std::size_t>(a)];
        const Eigen::Index j = estimated[static_cast<std::size_t>(b)];
        result.covariance(i, j) = physical(a, b);
        result.inverse_information(i, j) = bread(a, b);
        result.counted_covariance(i, j) = counted(a, b);
        const double denominator = std::sqrt(physical(a, a) * physical(b, b));
        result.correlation(i, j) = denominator > 0.0 ? physical(a, b) / denominator : 0.0;
      }
    }
  }

  const bool intervals = analysis.has_covariance && analysis.failure.empty();
  const double upper_probability = 0.5 * (1.0 + options.confidence);
  std::string no_interval;  // the first parameter left without degrees of freedom for its interval
  int position = 0;
  for (Eigen::Index i = 0; i < count; ++i) {
    const Parameter& parameter = *parameters_[static_cast<std::size_t>(i)];
    ParameterEstimate estimate;
    estimate.name = parameter.spec.name;
    estimate.value = parameter.scale * parameter.scaled_value;
    estimate.fixed = parameter.spec.fixed;
    estimate.at_bound = NearBound(estimate.value, parameter.spec.lower) ||
                        NearBound(estimate.value, parameter.spec.upper);
    if (estimate.fixed) {
      estimate.ci_low = estimate.ci_high = estimate.value;
    } else if (intervals) {
      estimate.std_error = std::sqrt(result.covariance(i, i));
      estimate.degrees_of_freedom = analysis.breakdown.degrees_of_freedom(position);
      const double half_width =
          StudentTQuantile(upper_probability, estimate.degrees_of_freedom) * estimate.std_error;
      estimate.ci_low = estimate.value - half_width;
      estimate.ci_high = estimate.value + half_width;
      if (!std::isfinite(half_width) && no_interval.empty()) {
        no_interval = "no interval for '" + estimate.name + "': " +
                      (estimate.degrees_of_freedom > 0.0 ? "its standard error is not finite"
                                                         : "no residual degrees of freedom are left for it");
      }
    } else {
      estimate.std_error = estimate.ci_low = estimate.ci_high = estimate.degrees_of_freedom = not_a_number;
    }
    if (!estimate.fixed) ++position;
    result.parameters.push_back(estimate);
  }

  for (std::size_t g = 0; g < groups_.size(); ++g) {
    const Group& group = *groups_[g];
    GroupStatistics statistics;
    statistics.name = group.spec.name;
    statistics.num_residuals = group.num_residuals;
    statistics.sigma = group.sigma;
    statistics.information_share.assign(static_cast<std::size_t>(count), 0.0);
    statistics.effective_num_residuals = group.num_residuals;
    if (g < analysis.widening.size()) {
      statistics.widened_for_autocorrelation = analysis.widening[g].widened;
      statistics.variance_inflation = analysis.widening[g].inflation;
      statistics.effective_num_residuals = analysis.widening[g].effective_num_residuals;
      statistics.integrated_autocorrelation_time = analysis.widening[g].integrated_time;
      statistics.autocorrelation_lags = analysis.widening[g].lags;
    }
    if (analysis.evaluated) {
      const Eigen::VectorXd unweighted = analysis.groups[g].weighted_residuals * group.sigma;
      statistics.rms = RootMeanSquare(unweighted);
      statistics.lag1_autocorrelation = Lag1Autocorrelation(unweighted);
    }
    if (analysis.has_covariance) {
      const CovarianceBreakdown& breakdown = analysis.breakdown;
      statistics.residual_variance = breakdown.measured_residual_variance[g];
      statistics.own_residual_variance = breakdown.residual_variance[g];
      statistics.degrees_of_freedom = breakdown.residual_degrees_of_freedom[g];
      if (g < breakdown.leverage.size()) statistics.leverage = breakdown.leverage[g];
      statistics.fitted_degrees_of_freedom = breakdown.fitted_degrees_of_freedom[g];
      for (Eigen::Index k = 0; k < p; ++k) {
        const double total = breakdown.variance_parts.col(k).sum();
        const double part = breakdown.variance_parts(static_cast<Eigen::Index>(g), k);
        statistics.information_share[static_cast<std::size_t>(estimated[static_cast<std::size_t>(k)])] =
            total > 0.0 ? part / total : 0.0;
      }
    }
    result.groups.push_back(statistics);
  }

  for (const auto& direction : analysis.null_directions) {
    std::vector<std::string> names;
    for (int k : direction) {
      names.push_back(parameters_[static_cast<std::size_t>(estimated[static_cast<std::size_t>(k)])]->spec.name);
    }
    result.not_identifiable.push_back(names);
  }

  result.usable = result.converged && intervals && no_interval.empty();
  if (!result.converged) {
    result.message = "the solver did not converge (" + result.termination + "): " + summary.message;
  } else if (!analysis.failure.empty()) {
    result.message = analysis.failure;
  } else if (!no_interval.empty()) {
    result.message = no_interval;
  } else {
    result.message = summary.message;
  }
  return result;
}

}  // namespace coilspin::core
