#include "fitters/core/group_covariance.h"

#include <algorithm>
#include <limits>

namespace coilspin::core {

CovarianceBreakdown CombineGroups(const Eigen::MatrixXd& inverse_information,
                                  const std::vector<GroupTerms>& groups, bool variance_from_data) {
  const Eigen::Index p = inverse_information.rows();
  const Eigen::Index num_groups = static_cast<Eigen::Index>(groups.size());
  const double not_a_number = std::numeric_limits<double>::quiet_NaN();
  const double infinity = std::numeric_limits<double>::infinity();
  const Eigen::MatrixXd& c = inverse_information;

  CovarianceBreakdown out;
  out.variance_parts = Eigen::MatrixXd::Zero(num_groups, p);
  out.counted_parts = Eigen::MatrixXd::Zero(num_groups, p);
  out.counted_covariance = Eigen::MatrixXd::Zero(p, p);
  out.covariance = Eigen::MatrixXd::Zero(p, p);
  out.degrees_of_freedom = Eigen::VectorXd::Constant(p, infinity);

  for (Eigen::Index g = 0; g < num_groups; ++g) {
    const GroupTerms& group = groups[static_cast<std::size_t>(g)];
    if (group.num_residuals == 0) {
      out.fitted_degrees_of_freedom.push_back(0.0);
      out.residual_degrees_of_freedom.push_back(0.0);
      out.effective_degrees_of_freedom.push_back(0.0);
      out.residual_variance.push_back(0.0);
      out.measured_residual_variance.push_back(0.0);
      out.leverage.emplace_back();
      continue;
    }
    const Eigen::MatrixXd projected = group.jacobian * c;  // B_g = J_g·C
    out.leverage.push_back(projected.cwiseProduct(group.jacobian).rowwise().sum());
    const double fitted = out.leverage.back().sum();
    const double residual_dof = group.num_residuals - fitted;
    const double measured =
        residual_dof > kNoResidualDegreesOfFreedom ? group.weighted_rss / residual_dof : not_a_number;
    // The group's own noise: less the input noise another term counts, never below 0.
    const double own = residual_dof > kNoResidualDegreesOfFreedom
                           ? std::max(group.weighted_rss - group.explained_sum_squares, 0.0) / residual_dof
                           : not_a_number;
    const double used = variance_from_data && !group.sigma_known ? own : 1.0;
    out.fitted_degrees_of_freedom.push_back(fitted);
    out.residual_degrees_of_freedom.push_back(residual_dof);
    const double inflation = group.variance_inflation;
    out.effective_degrees_of_freedom.push_back(
        group.sigma_known ? infinity
        : inflation > 1.0 ? std::max(group.num_residuals / inflation - fitted, kMinimumEffectiveDegreesOfFreedom)
                          : residual_dof);
    out.residual_variance.push_back(used);
    out.measured_residual_variance.push_back(measured);

    const Eigen::MatrixXd sandwich = projected.transpose() * projected;  // M_g = C·J_gᵀJ_g·C
    out.covariance += inflation * used * sandwich;
    out.variance_parts.row(g) = inflation * used * sandwich.diagonal().transpose();
    if (group.counted_moment.size() > 0) {
      const Eigen::MatrixXd counted = c * group.counted_moment * c;  // C·E[g·gᵀ]·C
      out.covariance += counted;
      out.counted_covariance += counted;
      out.counted_parts.row(g) = counted.diagonal().transpose();
      out.variance_parts.row(g) += out.counted_parts.row(g);
    }
  }

  if (!variance_from_data) return out;
  for (Eigen::Index j = 0; j < p; ++j) {
    double total = 0.0;
    double spread = 0.0;
    for (Eigen::Index g = 0; g < num_groups; ++g) {
      total += out.variance_parts(g, j);
      const double part = out.variance_parts(g, j) - out.counted_parts(g, j);  // the estimated share
      if (part == 0.0) continue;
      spread += part * part / out.effective_degrees_of_freedom[static_cast<std::size_t>(g)];
    }
    out.degrees_of_freedom(j) = spread > 0.0 ? total * total / spread : infinity;
  }
  return out;
}

}  // namespace coilspin::core
