#pragma once
// The private parts of LeastSquaresProblem, shared by the files that implement
// it (least_squares.cc builds, solve.cc solves, analysis.cc computes the
// covariance, report.cc writes the FitResult). Not for use outside the core.

#include <ceres/ceres.h>

#include <Eigen/Dense>
#include <optional>
#include <string>
#include <vector>

#include "fitters/core/autocorrelation_widening.h"
#include "fitters/core/group_covariance.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {

// An estimate counts as on its bound when it is within this relative distance of it.
// Ceres projects steps onto the box, so an active bound is met exactly in the
// scaled space; the margin only absorbs the rounding of θ = s·x.
inline constexpr double kAtBoundRelativeTolerance = 1e-12;

struct LeastSquaresProblem::Parameter {
  ParameterSpec spec;
  double scale = 1.0;         // s_j > 0
  double scaled_value = 0.0;  // x_j = θ_j / s_j, the memory Ceres moves
};

struct LeastSquaresProblem::Group {
  GroupSpec spec;
  double sigma = 1.0;  // σ_g of the next solve; re-estimated with estimate_group_sigmas
  std::vector<ceres::ResidualBlockId> blocks;
  std::vector<int> block_indices;  // into blocks_, in order of addition
  int num_residuals = 0;
};

// One residual block as added: enough to evaluate it without Ceres and to add
// the same block (sharing the model) to another problem.
struct LeastSquaresProblem::Block {
  int group = -1;
  std::vector<int> parameters;
  int num_residuals = 0;
  Weighting weighting;     // read by the block's cost function
  RawEvaluation evaluate;  // the model: unweighted r from physical parameters
  BlockCopier copier;      // AddShared of the same model into another problem
};

struct GroupEvaluation {
  Eigen::VectorXd weighted_residuals;  // r/σ_g, in order of addition
  Eigen::MatrixXd jacobian;            // ∂(r/σ_g)/∂x over the parameters asked for, n_g × p
};

// Everything the covariance step found at the current values.
struct FitAnalysis {
  bool evaluated = false;                         // residuals and Jacobians are available
  std::vector<GroupEvaluation> groups;
  std::vector<std::vector<int>> null_directions;  // positions in the estimated list
  bool has_covariance = false;
  CovarianceBreakdown breakdown;
  Eigen::MatrixXd inverse_information;            // C = (JᵀJ)⁻¹ in the scaled parameters, p × p
  std::vector<AutocorrelationWidening> widening;  // per group; none applied when empty
  std::string failure;  // why no usable covariance; empty when there is one
};

// What one solve did.
struct SolveRun {
  ceres::Solver::Summary summary;  // of the last Ceres solve
  double initial_cost = 0.0;       // ½·S where this solve started
  int iterations = 0;              // Levenberg–Marquardt iterations, all active-set rounds
  int refinement_steps = 0;        // Gauss–Newton steps accepted afterwards
};

// The weighted residuals and Jacobians of all groups, stacked in group order.
GroupEvaluation Stack(const std::vector<GroupEvaluation>& groups);

bool NearBound(double value, const std::optional<double>& bound);

// "1.5" style rendering of a number for messages.
std::string FormatNumber(double value);

}  // namespace coilspin::core
