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
  auto parameter = std::make_unique<Parameter>();
  parameter->spec = spec;
  ParameterSpec& kept = parameter->spec;  // with placeholders where the numbers cannot be used
  if (!std::isfinite(spec.initial)) {
    MarkUnusable("the starting value of '" + spec.name + "' is not a finite number (" + FormatNumber(spec.initial) +
                 ")");
    kept.initial = 0.0;
  }
  if (!(std::isfinite(spec.scale) && spec.scale >= 0.0)) {
    MarkUnusable("the scale of '" + spec.name + "' is not a finite number >= 0 (" + FormatNumber(spec.scale) + ")");
    kept.scale = 0.0;
  }
  const bool finite_bounds = (!spec.lower || std::isfinite(*spec.lower)) && (!spec.upper || std::isfinite(*spec.upper));
  if (!finite_bounds || (spec.lower && spec.upper && !(*spec.lower < *spec.upper))) {
    MarkUnusable("the bounds of '" + spec.name + "' are not finite numbers in order");
    kept.lower.reset();
    kept.upper.reset();
  }
  const ParameterSpec& spec_used = kept;
  if (spec_used.scale > 0.0) {
    parameter->scale = spec_used.scale;
  } else {
    parameter->scale = spec_used.initial != 0.0 ? std::abs(spec_used.initial) : 1.0;
  }
  parameter->scaled_value = spec_used.initial / parameter->scale;
  double* x = &parameter->scaled_value;
  problem_->AddParameterBlock(x, 1);
  if (spec_used.lower) problem_->SetParameterLowerBound(x, 0, *spec_used.lower / parameter->scale);
  if (spec_used.upper) problem_->SetParameterUpperBound(x, 0, *spec_used.upper / parameter->scale);
  if (spec_used.fixed) problem_->SetParameterBlockConstant(x);
  parameters_.push_back(std::move(parameter));
  return static_cast<int>(parameters_.size()) - 1;
}

void LeastSquaresProblem::MarkUnusable(const std::string& why) {
  if (unusable_.empty()) unusable_ = why;
}

int LeastSquaresProblem::AddGroup(const GroupSpec& spec) {
  auto group = std::make_unique<Group>();
  group->spec = spec;
  if (!(std::isfinite(spec.sigma) && spec.sigma > 0.0)) {
    MarkUnusable("the noise level of '" + spec.name + "' is not a finite number > 0 (" + FormatNumber(spec.sigma) +
                 ")");
    group->spec.sigma = 1.0;
  }
  group->sigma = group->spec.sigma;
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

const LeastSquaresProblem::Weighting* LeastSquaresProblem::NewBlock(int group, const std::vector<int>& parameters,
                                                                    int num_residuals, RawEvaluation evaluate,
                                                                    BlockCopier copier) {
  Require(group >= 0 && group < static_cast<int>(groups_.size()), "AddResiduals: unknown group index");
  Require(num_residuals > 0, "AddResiduals: a residual block needs at least one residual");
  Require(!parameters.empty(), "AddResiduals: a residual block needs at least one parameter");
  Require(parameters.size() <= static_cast<std::size_t>(kMaxParametersPerBlock),
          "AddResiduals: too many parameters for one residual block (kMaxParametersPerBlock)");
  for (int index : parameters) {
    Require(index >= 0 && index < static_cast<int>(parameters_.size()), "AddResiduals: unknown parameter index");
  }
  const std::set<int> distinct(parameters.begin(), parameters.end());
  Require(distinct.size() == parameters.size(), "AddResiduals: a parameter is listed twice");
  auto block = std::make_unique<Block>();
  block->group = group;
  block->parameters = parameters;
  block->num_residuals = num_residuals;
  block->weighting.sigma = &groups_[static_cast<std::size_t>(group)]->sigma;
  block->weighting.loss = &loss_;
  block->evaluate = std::move(evaluate);
  block->copier = std::move(copier);
  blocks_.push_back(std::move(block));
  return &blocks_.back()->weighting;
}

void LeastSquaresProblem::AttachCost(ceres::CostFunction* cost) {
  const Block& block = *blocks_.back();
  Group& target = *groups_[static_cast<std::size_t>(block.group)];
  target.blocks.push_back(problem_->AddResidualBlock(cost, nullptr, BlocksOf(block.parameters)));
  target.block_indices.push_back(static_cast<int>(blocks_.size()) - 1);
  target.num_residuals += block.num_residuals;
}

int LeastSquaresProblem::NumParameters() const { return static_cast<int>(parameters_.size()); }

int LeastSquaresProblem::NumGroups() const { return static_cast<int>(groups_.size()); }

const ParameterSpec& LeastSquaresProblem::Spec(int parameter) const {
  Require(parameter >= 0 && parameter < static_cast<int>(parameters_.size()), "Spec: unknown parameter index");
  return parameters_[static_cast<std::size_t>(parameter)]->spec;
}

std::unique_ptr<LeastSquaresProblem> LeastSquaresProblem::Clone() const {
  auto clone = std::make_unique<LeastSquaresProblem>();
  for (const auto& parameter : parameters_) {
    ParameterSpec spec = parameter->spec;
    spec.scale = parameter->scale;  // the resolved s_j, so both solve in the same scaled space
    clone->AddParameter(spec);
    clone->parameters_.back()->scaled_value = parameter->scaled_value;
  }
  for (const auto& group : groups_) {
    clone->AddGroup(group->spec);
    clone->groups_.back()->sigma = group->sigma;
  }
  for (const auto& block : blocks_) {
    block->copier(*clone);
    clone->blocks_.back()->weighting.offsets = block->weighting.offsets;
  }
  clone->loss_ = loss_;
  clone->unusable_ = unusable_;
  return clone;
}

void LeastSquaresProblem::SetValues(const std::vector<double>& values) {
  Require(values.size() == parameters_.size(), "SetValues: one value per parameter");
  for (std::size_t j = 0; j < values.size(); ++j) {
    Parameter& parameter = *parameters_[j];
    const ParameterSpec& spec = parameter.spec;
    if (!std::isfinite(values[j])) {
      MarkUnusable("the value set for '" + spec.name + "' is not a finite number (" + FormatNumber(values[j]) + ")");
      continue;
    }
    Require((!spec.lower || values[j] >= *spec.lower) && (!spec.upper || values[j] <= *spec.upper),
            "SetValues: a value lies outside its bounds");
    parameter.scaled_value = values[j] / parameter.scale;
    if (spec.fixed) parameter.spec.initial = values[j];
  }
}

void LeastSquaresProblem::HoldAt(int parameter, double value) {
  double* x = ScaledValue(parameter);
  Parameter& held = *parameters_[static_cast<std::size_t>(parameter)];
  if (!std::isfinite(value)) {
    MarkUnusable("the value '" + held.spec.name + "' is held at is not a finite number (" + FormatNumber(value) + ")");
    return;
  }
  Require((!held.spec.lower || value >= *held.spec.lower) && (!held.spec.upper || value <= *held.spec.upper),
          "HoldAt: the value lies outside the parameter's bounds");
  held.spec.fixed = true;
  held.spec.initial = value;
  *x = value / held.scale;
  problem_->SetParameterBlockConstant(x);
}

void LeastSquaresProblem::SetGroupSigma(int group, double sigma) {
  Require(group >= 0 && group < static_cast<int>(groups_.size()), "SetGroupSigma: unknown group index");
  if (!(std::isfinite(sigma) && sigma > 0.0)) {
    MarkUnusable("the noise level of '" + groups_[static_cast<std::size_t>(group)]->spec.name +
                 "' is not a finite number > 0 (" + FormatNumber(sigma) + ")");
    return;
  }
  groups_[static_cast<std::size_t>(group)]->sigma = sigma;
}

void LeastSquaresProblem::GiveGroupSigma(int group, double sigma) {
  SetGroupSigma(group, sigma);
  if (!(std::isfinite(sigma) && sigma > 0.0)) return;  // unusable, as SetGroupSigma recorded
  Group& target = *groups_[static_cast<std::size_t>(group)];
  target.spec.sigma = sigma;
  target.spec.sigma_known = true;
}

void LeastSquaresProblem::SetResidualOffsets(int group, const std::vector<double>& offsets) {
  Require(group >= 0 && group < static_cast<int>(groups_.size()), "SetResidualOffsets: unknown group index");
  const Group& target = *groups_[static_cast<std::size_t>(group)];
  Require(offsets.empty() || static_cast<int>(offsets.size()) == target.num_residuals,
          "SetResidualOffsets: one offset per residual of the group, or none");
  std::size_t next = 0;
  for (int index : target.block_indices) {
    Block& block = *blocks_[static_cast<std::size_t>(index)];
    if (offsets.empty()) {
      block.weighting.offsets.clear();
      continue;
    }
    const auto count = static_cast<std::size_t>(block.num_residuals);
    block.weighting.offsets.assign(offsets.begin() + static_cast<std::ptrdiff_t>(next),
                                   offsets.begin() + static_cast<std::ptrdiff_t>(next + count));
    next += count;
  }
}

std::vector<Eigen::VectorXd> LeastSquaresProblem::RawResiduals(bool with_offsets, bool* evaluated) const {
  *evaluated = true;
  std::vector<Eigen::VectorXd> out;
  std::array<double, kMaxParametersPerBlock> physical{};
  std::array<const double*, kMaxParametersPerBlock> pointers{};
  for (const auto& group : groups_) {
    Eigen::VectorXd residuals(group->num_residuals);
    Eigen::Index row = 0;
    for (int index : group->block_indices) {
      const Block& block = *blocks_[static_cast<std::size_t>(index)];
      for (std::size_t k = 0; k < block.parameters.size(); ++k) {
        const Parameter& parameter = *parameters_[static_cast<std::size_t>(block.parameters[k])];
        physical[k] = parameter.scale * parameter.scaled_value;
        pointers[k] = &physical[k];
      }
      double* r = residuals.data() + row;
      if (!block.evaluate(pointers.data(), r)) *evaluated = false;
      if (with_offsets && !block.weighting.offsets.empty()) {
        for (int i = 0; i < block.num_residuals; ++i) r[i] += block.weighting.offsets[static_cast<std::size_t>(i)];
      }
      row += block.num_residuals;
    }
    out.push_back(std::move(residuals));
  }
  return out;
}

std::optional<std::vector<Eigen::VectorXd>> LeastSquaresProblem::Residuals() const {
  bool evaluated = false;
  std::vector<Eigen::VectorXd> residuals = RawResiduals(false, &evaluated);
  if (!evaluated) return std::nullopt;
  return residuals;
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
