// LeastSquaresProblem, building: parameters, groups and residual blocks, and
// the small helpers the other parts share. Solving is in solve.cc, the
// covariance step in analysis.cc, the FitResult in report.cc.

#include "fitters/core/least_squares.h"

#include <algorithm>
#include <cmath>
#include <set>
#include <sstream>

#include "fitters/core/problem_internals.h"
#include "fitters/core/require.h"

namespace coilspin::core {

bool NearBound(double value, const std::optional<double>& bound) {
  if (!bound) return false;
  return std::abs(value - *bound) <= kAtBoundRelativeTolerance * std::max(1.0, std::abs(*bound));
}

std::string FormatNumber(double value) {
  std::ostringstream out;
  out.precision(6);
  out << value;
  return out.str();
}

GroupEvaluation Stack(const std::vector<GroupEvaluation>& groups) {
  Eigen::Index rows = 0;
  Eigen::Index columns = 0;
  for (const GroupEvaluation& group : groups) {
    rows += group.jacobian.rows();
    columns = group.jacobian.cols();
  }
  GroupEvaluation stacked;
  stacked.weighted_residuals.resize(rows);
  stacked.jacobian.resize(rows, columns);
  Eigen::Index row = 0;
  for (const GroupEvaluation& group : groups) {
    stacked.weighted_residuals.segment(row, group.jacobian.rows()) = group.weighted_residuals;
    stacked.jacobian.middleRows(row, group.jacobian.rows()) = group.jacobian;
    row += group.jacobian.rows();
  }
  return stacked;
}

LeastSquaresProblem::LeastSquaresProblem() : problem_(std::make_unique<ceres::Problem>()) {}

LeastSquaresProblem::~LeastSquaresProblem() = default;

int LeastSquaresProblem::AddParameter(const ParameterSpec& spec) {
  Require(!spec.name.empty(), "AddParameter: a parameter needs a name");
  for (const auto& existing : parameters_) {
    Require(existing->spec.name != spec.name, "AddParameter: parameter names must be unique");
  }
  Require(std::isfinite(spec.initial), "AddParameter: the starting value must be finite");
  Require(std::isfinite(spec.scale) && spec.scale >= 0.0, "AddParameter: scale must be finite and not negative");
  Require(!spec.lower || !spec.upper || *spec.lower < *spec.upper,
          "AddParameter: the lower bound must lie below the upper bound");

  auto parameter = std::make_unique<Parameter>();
  parameter->spec = spec;
  if (spec.scale > 0.0) {
    parameter->scale = spec.scale;
  } else {
    parameter->scale = spec.initial != 0.0 ? std::abs(spec.initial) : 1.0;
  }
  parameter->scaled_value = spec.initial / parameter->scale;
  double* x = &parameter->scaled_value;
  problem_->AddParameterBlock(x, 1);
  if (spec.lower) problem_->SetParameterLowerBound(x, 0, *spec.lower / parameter->scale);
  if (spec.upper) problem_->SetParameterUpperBound(x, 0, *spec.upper / parameter->scale);
  if (spec.fixed) problem_->SetParameterBlockConstant(x);
  parameters_.push_back(std::move(parameter));
  return static_cast<int>(parameters_.size()) - 1;
}

int LeastSquaresProblem::AddGroup(const GroupSpec& spec) {
  Require(std::isfinite(spec.sigma) && spec.sigma > 0.0, "AddGroup: sigma must be positive and finite");
  auto group = std::make_unique<Group>();
  group->spec = spec;
  group->sigma = spec.sigma;
  groups_.push_back(std::move(group));
  return static_cast<int>(groups_.size()) - 1;
}

double* LeastSquaresProblem::ScaledValue(int parameter) {
  Require(parameter >= 0 && parameter < static_cast<int>(parameters_.size()), "unknown parameter index");
  return &parameters_[static_cast<std::size_t>(parameter)]->scaled_value;
}

double LeastSquaresProblem::ScaleOf(int parameter) const {
  Require(parameter >= 0 && parameter < static_cast<int>(parameters_.size()), "unknown parameter index");
  return parameters_[static_cast<std::size_t>(parameter)]->scale;
}

const double* LeastSquaresProblem::SigmaOf(int group) const {
  Require(group >= 0 && group < static_cast<int>(groups_.size()), "unknown group index");
  return &groups_[static_cast<std::size_t>(group)]->sigma;
}

void LeastSquaresProblem::RegisterBlock(int group, ceres::CostFunction* cost, const std::vector<int>& parameters,
                                        int num_residuals) {
  Require(group >= 0 && group < static_cast<int>(groups_.size()), "AddResiduals: unknown group index");
  Require(num_residuals > 0, "AddResiduals: a residual block needs at least one residual");
  Require(!parameters.empty(), "AddResiduals: a residual block needs at least one parameter");
  Require(parameters.size() <= static_cast<std::size_t>(kMaxParametersPerBlock),
          "AddResiduals: too many parameters for one residual block (kMaxParametersPerBlock)");
  const std::set<int> distinct(parameters.begin(), parameters.end());
  Require(distinct.size() == parameters.size(), "AddResiduals: a parameter is listed twice");
  std::vector<double*> blocks;
  for (int index : parameters) blocks.push_back(ScaledValue(index));
  Group& target = *groups_[static_cast<std::size_t>(group)];
  target.blocks.push_back(problem_->AddResidualBlock(cost, nullptr, blocks));
  target.num_residuals += num_residuals;
}

std::vector<double> LeastSquaresProblem::Values() const {
  std::vector<double> values;
  for (const auto& parameter : parameters_) values.push_back(parameter->scale * parameter->scaled_value);
  return values;
}

std::vector<int> LeastSquaresProblem::EstimatedParameters() const {
  std::vector<int> estimated;
  for (std::size_t j = 0; j < parameters_.size(); ++j) {
    if (!parameters_[j]->spec.fixed) estimated.push_back(static_cast<int>(j));
  }
  return estimated;
}

std::vector<double*> LeastSquaresProblem::BlocksOf(const std::vector<int>& parameters) const {
  std::vector<double*> blocks;
  for (int index : parameters) blocks.push_back(&parameters_[static_cast<std::size_t>(index)]->scaled_value);
  return blocks;
}

const ParameterEstimate& FitResult::Get(const std::string& name) const {
  const int index = IndexOf(name);
  Require(index >= 0, "FitResult::Get: no parameter of that name");
  return parameters[static_cast<std::size_t>(index)];
}

int FitResult::IndexOf(const std::string& name) const {
  for (std::size_t i = 0; i < parameters.size(); ++i) {
    if (parameters[i].name == name) return static_cast<int>(i);
  }
  return -1;
}

}  // namespace coilspin::core
