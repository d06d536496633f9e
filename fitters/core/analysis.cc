// LeastSquaresProblem, the covariance step: residuals and Jacobians per group
// at the solution, the rank test, Ceres Covariance for C = (JᵀJ)⁻¹, and the
// per-group combination of group_covariance.h.

#include <cmath>

#include "fitters/core/counted_noise.h"
#include "fitters/core/least_squares.h"
#include "fitters/core/null_space.h"
#include "fitters/core/problem_internals.h"
#include "fitters/core/residual_statistics.h"

namespace coilspin::core {
namespace {

Eigen::MatrixXd DenseFromCrs(const ceres::CRSMatrix& crs) {
  Eigen::MatrixXd dense = Eigen::MatrixXd::Zero(crs.num_rows, crs.num_cols);
  for (int row = 0; row < crs.num_rows; ++row) {
    const auto r = static_cast<std::size_t>(row);
    for (int k = crs.rows[r]; k < crs.rows[r + 1]; ++k) {
      const auto at = static_cast<std::size_t>(k);
      dense(row, crs.cols[at]) = crs.values[at];
    }
  }
  return dense;
}

}  // namespace

std::vector<GroupEvaluation> LeastSquaresProblem::EvaluateGroups(const std::vector<int>& parameters) {
  std::vector<GroupEvaluation> evaluations;
  const std::vector<double*> blocks = BlocksOf(parameters);
  const Eigen::Index p = static_cast<Eigen::Index>(parameters.size());
  for (const auto& group : groups_) {
    GroupEvaluation evaluation;
    evaluation.jacobian = Eigen::MatrixXd::Zero(group->num_residuals, p);
    evaluation.weighted_residuals = Eigen::VectorXd::Zero(group->num_residuals);
    // An empty residual_blocks list would mean "all blocks" to Ceres, so empty groups stay empty.
    if (!group->blocks.empty()) {
      ceres::Problem::EvaluateOptions evaluate;
      evaluate.residual_blocks = group->blocks;
      evaluate.parameter_blocks = blocks;
      double cost = 0.0;
      std::vector<double> residuals;
      ceres::CRSMatrix jacobian;
      // With no parameter listed an empty list would mean "all blocks": skip the Jacobian.
      if (!problem_->Evaluate(evaluate, &cost, &residuals, nullptr, p > 0 ? &jacobian : nullptr)) return {};
      evaluation.weighted_residuals =
          Eigen::Map<const Eigen::VectorXd>(residuals.data(), static_cast<Eigen::Index>(residuals.size()));
      if (p > 0) evaluation.jacobian = DenseFromCrs(jacobian);
    }
    evaluations.push_back(std::move(evaluation));
  }
  return evaluations;
}

std::optional<Eigen::MatrixXd> LeastSquaresProblem::CeresInverseInformation(const std::vector<int>& estimated,
                                                                            double rank_tolerance) {
  ceres::Covariance::Options covariance_options;
  covariance_options.algorithm_type = ceres::DENSE_SVD;
  // Ceres fails when d_min/d_max < sqrt(min_reciprocal_condition_number); this
  // makes that the header's test d_min < rank_tolerance·d_max.
  covariance_options.min_reciprocal_condition_number = rank_tolerance * rank_tolerance;
  covariance_options.null_space_rank = 0;  // a null direction is an error, never a pseudo-inverse
  covariance_options.num_threads = 1;
  ceres::Covariance covariance(covariance_options);
  std::vector<const double*> blocks;
  for (double* block : BlocksOf(estimated)) blocks.push_back(block);
  if (!covariance.Compute(blocks, problem_.get())) return std::nullopt;
  const Eigen::Index p = static_cast<Eigen::Index>(estimated.size());
  Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::RowMajor> inverse(p, p);
  if (!covariance.GetCovarianceMatrix(blocks, inverse.data())) return std::nullopt;
  return Eigen::MatrixXd(inverse);
}

FitAnalysis LeastSquaresProblem::Analyse(const SolveOptions& options, const std::vector<int>& estimated) {
  FitAnalysis analysis;
  analysis.groups = EvaluateGroups(estimated);
  if (analysis.groups.size() != groups_.size()) {
    analysis.failure = "the residuals could not be evaluated at the solution";
    return analysis;
  }
  analysis.evaluated = true;
  const Eigen::Index p = static_cast<Eigen::Index>(estimated.size());

  // Rank first, on the weighted Jacobian Ceres uses: a rank-deficient problem
  // is reported by name and never reaches Ceres Covariance.
  analysis.null_directions = NullDirections(Stack(analysis.groups).jacobian, options.rank_tolerance);
  if (!analysis.null_directions.empty()) {
    std::string names;
    for (const auto& direction : analysis.null_directions) {
      names += names.empty() ? "{" : "; {";
      for (std::size_t k = 0; k < direction.size(); ++k) {
        if (k > 0) names += ", ";
        names += parameters_[static_cast<std::size_t>(estimated[static_cast<std::size_t>(direction[k])])]->spec.name;
      }
      names += "}";
    }
    analysis.failure = "not identifiable: the residuals do not determine " + names +
                       " (a singular value of J below rank_tolerance " + FormatNumber(options.rank_tolerance) +
                       " of the largest); no covariance is reported";
    return analysis;
  }

  Eigen::MatrixXd inverse_information = Eigen::MatrixXd::Zero(p, p);
  if (p > 0) {
    const auto computed = CeresInverseInformation(estimated, options.rank_tolerance);
    if (!computed) {
      analysis.failure = "Ceres Covariance (dense SVD) failed at the solution";
      return analysis;
    }
    inverse_information = *computed;
  }

  std::vector<GroupTerms> terms;
  const std::vector<double> values = Values();
  for (std::size_t g = 0; g < groups_.size(); ++g) {
    GroupTerms term;
    term.num_residuals = groups_[g]->num_residuals;
    term.weighted_rss = analysis.groups[g].weighted_residuals.squaredNorm();
    term.jacobian = analysis.groups[g].jacobian;
    term.sigma_known = groups_[g]->spec.sigma_known;
    const GroupSpec& spec = groups_[g]->spec;
    CountedNoise counted;  // what other terms count: left out of s_g² and the widening (counted_noise.h)
    const bool widen = options.widen_for_autocorrelation && term.num_residuals >= kMinResidualsForWidening;
    if (options.separate_input_noise) {
      // Every lag the widening may sum (autocorrelation_widening.h), or lag 0 alone when it is off.
      counted = CountedNoiseOf(spec, groups_[g]->sigma, values, term.jacobian, widen ? term.num_residuals - 1 : 0);
      if (!counted.explained.empty()) term.explained_sum_squares = counted.explained.front();
      term.counted_moment = counted.moment;
    }
    if (options.widen_for_autocorrelation) {
      const AutocorrelationWidening widening = DecideWidening(analysis.groups[g].weighted_residuals, counted.explained);
      term.variance_inflation = widening.inflation;
      analysis.widening.push_back(widening);
    }
    terms.push_back(std::move(term));
  }
  analysis.breakdown = CombineGroups(inverse_information, terms, options.residual_variance_from_data);
  analysis.inverse_information = inverse_information;
  analysis.has_covariance = true;
  if (options.residual_variance_from_data) {
    for (std::size_t g = 0; g < groups_.size(); ++g) {
      const double residual_dof = analysis.breakdown.residual_degrees_of_freedom[g];
      if (groups_[g]->num_residuals > 0 && !groups_[g]->spec.sigma_known &&
          !(residual_dof > kNoResidualDegreesOfFreedom)) {
        analysis.failure = "group '" + groups_[g]->spec.name + "' has no residual degrees of freedom (n - h = " +
                           FormatNumber(residual_dof) +
                           "), so its noise cannot be estimated from the data; give its sigma and set "
                           "residual_variance_from_data = false";
        return analysis;
      }
    }
  }
  return analysis;
}

bool LeastSquaresProblem::RescaleGroupSigmas(const FitAnalysis& analysis) {
  if (!analysis.has_covariance || !analysis.failure.empty()) return false;
  if (loss_ != RobustLoss::kSquared) {
    // A spike inflates RSS_g but not the median absolute deviation (robust_loss.h, "The scale").
    bool evaluated = false;
    const std::vector<Eigen::VectorXd> residuals = RawResiduals(true, &evaluated);
    if (!evaluated) return false;
    for (std::size_t g = 0; g < groups_.size(); ++g) {
      if (groups_[g]->num_residuals == 0 || groups_[g]->spec.sigma_known) continue;
      const double scale = MedianAbsoluteDeviationScale(residuals[g]);
      if (std::isfinite(scale) && scale > 0.0) groups_[g]->sigma = scale;
    }
    return true;
  }
  for (std::size_t g = 0; g < groups_.size(); ++g) {
    if (groups_[g]->num_residuals == 0 || groups_[g]->spec.sigma_known) continue;
    const double variance = analysis.breakdown.measured_residual_variance[g];
    // A perfect fit (s_g² = 0) cannot rescale σ_g: keep it rather than divide by zero.
    if (std::isfinite(variance) && variance > 0.0) groups_[g]->sigma *= std::sqrt(variance);
  }
  return true;
}

}  // namespace coilspin::core
