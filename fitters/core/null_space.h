#pragma once
// Null directions of a Jacobian: which parameters the residuals cannot tell apart.
//
// With the singular value decomposition J = U·D·Vᵀ of the weighted Jacobian
// (n residuals × p scaled parameters), a right singular vector v_i whose
// singular value d_i is below rank_tolerance·d_max is a direction of parameter
// space that moves no residual (to that tolerance): J·v_i ≈ 0. Every such
// direction, and every direction beyond the n-th when there are fewer
// residuals than parameters, makes JᵀJ singular, so no covariance exists.
// A parameter takes part in a null direction when its component of the unit
// vector v_i is a noticeable fraction of the largest component (see
// kNullDirectionParticipation). For y = (a + b)·x the one null direction is
// (1, −1)/√2: a and b are identifiable only as their sum.

#include <Eigen/Dense>
#include <vector>

namespace coilspin::core {

// A parameter belongs to a null direction when |v_j| ≥ this fraction of max_k |v_k|.
// Common practice (no source): a tenth keeps clear participants and drops the
// rounding-level components that every computed singular vector carries.
inline constexpr double kNullDirectionParticipation = 0.1;

// One entry per null direction: the column indices (parameters) that take part, ascending.
// Empty when J has full column rank at this tolerance.
std::vector<std::vector<int>> NullDirections(const Eigen::MatrixXd& jacobian, double rank_tolerance);

}  // namespace coilspin::core
