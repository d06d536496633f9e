#include "fitters/core/null_space.h"

#include <algorithm>

namespace coilspin::core {

std::vector<std::vector<int>> NullDirections(const Eigen::MatrixXd& jacobian, double rank_tolerance) {
  const Eigen::Index p = jacobian.cols();
  std::vector<std::vector<int>> directions;
  if (p == 0) return directions;
  const Eigen::JacobiSVD<Eigen::MatrixXd> svd(jacobian, Eigen::ComputeFullV);
  const Eigen::VectorXd& singular = svd.singularValues();  // descending, min(n, p) of them
  const double largest = singular.size() > 0 ? singular(0) : 0.0;
  for (Eigen::Index i = 0; i < p; ++i) {
    const bool beyond_rows = i >= singular.size();
    if (!beyond_rows && singular(i) >= rank_tolerance * largest && largest > 0.0) continue;
    const Eigen::VectorXd direction = svd.matrixV().col(i);
    const double biggest = direction.cwiseAbs().maxCoeff();
    std::vector<int> members;
    for (Eigen::Index j = 0; j < p; ++j) {
      if (std::abs(direction(j)) >= kNullDirectionParticipation * biggest) members.push_back(static_cast<int>(j));
    }
    directions.push_back(members);
  }
  return directions;
}

}  // namespace coilspin::core
