// LeastSquaresProblem, solving: Levenberg–Marquardt (Ceres, dense QR) inside
// an active-set loop for the bounds, then Gauss–Newton refinement, then the
// optional re-estimation of the group noise levels (least_squares.h, "Solving").

#include <algorithm>
#include <cmath>
#include <utility>

#include "fitters/core/least_squares.h"
#include "fitters/core/problem_internals.h"
#include "fitters/core/quiet_ceres_log.h"

namespace coilspin::core {
namespace {

// Active-set rounds: each round holds or releases at least one parameter, so a
// problem with a few bounds settles in two or three; the cap only stops a cycle.
constexpr int kMaxActiveSetRounds = 10;

// Gauss–Newton refinement steps after Levenberg–Marquardt. Near the minimum
// Gauss–Newton converges quadratically for small residuals (one step is exact
// for a model linear in its parameters) and linearly otherwise; steps stop as
// soon as one fails to lower the gradient.
constexpr int kMaxRefinementSteps = 4;

// A refinement step may raise the cost by this relative amount and still be
// taken (if it lowers the gradient). Near the minimum a cost is only known to
// its rounding: up to 3e-14 relative measured on NIST StRD Thurber, where the
// residuals are 1 % of the data. 1e-12 is far above that, and far below any
// change that matters: it corresponds to a move of 1e-6 standard errors.
constexpr double kRefinementCostSlack = 1e-12;

bool Converged(ceres::TerminationType type) { return type == ceres::CONVERGENCE || type == ceres::USER_SUCCESS; }

std::vector<int> Without(const std::vector<int>& all, const std::vector<int>& removed) {
  std::vector<int> kept;
  for (int index : all) {
    if (std::find(removed.begin(), removed.end(), index) == removed.end()) kept.push_back(index);
  }
  return kept;
}

}  // namespace

std::string LeastSquaresProblem::StartOutsideBounds() const {
  for (const auto& parameter : parameters_) {
    const ParameterSpec& spec = parameter->spec;
    const bool below = spec.lower && spec.initial < *spec.lower;
    const bool above = spec.upper && spec.initial > *spec.upper;
    if (below || above) {
      return "parameter '" + spec.name + "' starts at " + FormatNumber(spec.initial) + ", outside its bounds [" +
             (spec.lower ? FormatNumber(*spec.lower) : "-inf") + ", " +
             (spec.upper ? FormatNumber(*spec.upper) : "+inf") + "]";
    }
  }
  return "";
}

ceres::Solver::Summary LeastSquaresProblem::Minimise(const SolveOptions& options) {
  ceres::Solver::Options ceres_options;
  ceres_options.minimizer_type = ceres::TRUST_REGION;
  ceres_options.trust_region_strategy_type = ceres::LEVENBERG_MARQUARDT;
  ceres_options.linear_solver_type = ceres::DENSE_QR;
  ceres_options.max_num_iterations = options.max_iterations;
  ceres_options.function_tolerance = options.function_tolerance;
  ceres_options.gradient_tolerance = options.gradient_tolerance;
  ceres_options.parameter_tolerance = options.parameter_tolerance;
  ceres_options.logging_type = ceres::SILENT;
  ceres_options.minimizer_progress_to_stdout = false;
  ceres_options.num_threads = 1;
  ceres::Solver::Summary summary;
  ceres::Solve(ceres_options, problem_.get(), &summary);
  return summary;
}

std::vector<int> LeastSquaresProblem::OnBound(const std::vector<int>& parameters) const {
  std::vector<int> on_bound;
  for (int index : parameters) {
    const Parameter& parameter = *parameters_[static_cast<std::size_t>(index)];
    const double value = parameter.scale * parameter.scaled_value;
    if (NearBound(value, parameter.spec.lower) || NearBound(value, parameter.spec.upper)) {
      on_bound.push_back(index);
    }
  }
  return on_bound;
}

std::vector<int> LeastSquaresProblem::BoundNoLongerActive(const std::vector<int>& held) {
  if (held.empty()) return {};
  // The gradient with respect to a held parameter needs it variable for the evaluation.
  const std::vector<double*> blocks = BlocksOf(held);
  for (double* block : blocks) problem_->SetParameterBlockVariable(block);
  ceres::Problem::EvaluateOptions evaluate;
  evaluate.parameter_blocks = blocks;
  double cost = 0.0;
  std::vector<double> gradient;
  const bool evaluated = problem_->Evaluate(evaluate, &cost, nullptr, &gradient, nullptr);
  for (double* block : blocks) problem_->SetParameterBlockConstant(block);
  if (!evaluated) return {};
  // Karush–Kuhn–Tucker: at a lower bound the cost must not fall inwards (∂S/∂x ≥ 0),
  // at an upper bound ∂S/∂x ≤ 0. A held parameter whose gradient points inwards is released.
  std::vector<int> released;
  for (std::size_t k = 0; k < held.size(); ++k) {
    const Parameter& parameter = *parameters_[static_cast<std::size_t>(held[k])];
    const double value = parameter.scale * parameter.scaled_value;
    const bool at_lower = NearBound(value, parameter.spec.lower);
    const bool inwards = at_lower ? gradient[k] < 0.0 : gradient[k] > 0.0;
    if (inwards) released.push_back(held[k]);
  }
  return released;
}

int LeastSquaresProblem::Refine(const std::vector<int>& free) {
  if (free.empty()) return 0;
  const Eigen::Index p = static_cast<Eigen::Index>(free.size());
  GroupEvaluation current = Stack(EvaluateGroups(free));
  if (current.jacobian.rows() == 0) return 0;
  int accepted = 0;
  for (int step = 0; step < kMaxRefinementSteps; ++step) {
    const double cost = 0.5 * current.weighted_residuals.squaredNorm();
    const double gradient = (current.jacobian.transpose() * current.weighted_residuals).norm();
    const Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(current.jacobian);
    if (qr.rank() < p) break;  // a null direction: the covariance step will report it
    const Eigen::VectorXd delta = qr.solve(-current.weighted_residuals);

    std::vector<double> saved;
    bool feasible = true;
    for (Eigen::Index k = 0; k < p; ++k) {
      Parameter& parameter = *parameters_[static_cast<std::size_t>(free[static_cast<std::size_t>(k)])];
      saved.push_back(parameter.scaled_value);
      parameter.scaled_value += delta(k);
      const double value = parameter.scale * parameter.scaled_value;
      if ((parameter.spec.lower && value < *parameter.spec.lower) ||
          (parameter.spec.upper && value > *parameter.spec.upper)) {
        feasible = false;
      }
    }
    GroupEvaluation trial;
    if (feasible) trial = Stack(EvaluateGroups(free));
    const bool evaluated = feasible && trial.weighted_residuals.size() == current.weighted_residuals.size();
    const bool better =
        evaluated && 0.5 * trial.weighted_residuals.squaredNorm() <= cost * (1.0 + kRefinementCostSlack) &&
        (trial.jacobian.transpose() * trial.weighted_residuals).norm() < gradient;
    if (!better) {
      for (Eigen::Index k = 0; k < p; ++k) {
        parameters_[static_cast<std::size_t>(free[static_cast<std::size_t>(k)])]->scaled_value =
            saved[static_cast<std::size_t>(k)];
      }
      break;
    }
    current = std::move(trial);
    ++accepted;
  }
  return accepted;
}

SolveRun LeastSquaresProblem::SolveWithActiveBounds(const SolveOptions& options, const std::vector<int>& estimated) {
  SolveRun run;
  std::vector<int> held;  // estimated parameters held on a bound, constant for Ceres
  for (int round = 0; round < kMaxActiveSetRounds; ++round) {
    run.summary = Minimise(options);
    if (round == 0) run.initial_cost = run.summary.initial_cost;
    run.iterations += run.summary.num_successful_steps + run.summary.num_unsuccessful_steps;
    if (!Converged(run.summary.termination_type)) break;
    const std::vector<int> newly_held = OnBound(Without(estimated, held));
    const std::vector<int> released = BoundNoLongerActive(held);
    if (newly_held.empty() && released.empty()) break;
    for (int index : newly_held) problem_->SetParameterBlockConstant(ScaledValue(index));
    for (int index : released) problem_->SetParameterBlockVariable(ScaledValue(index));
    held = Without(held, released);
    held.insert(held.end(), newly_held.begin(), newly_held.end());
  }
  if (Converged(run.summary.termination_type)) run.refinement_steps = Refine(Without(estimated, held));
  for (int index : held) problem_->SetParameterBlockVariable(ScaledValue(index));
  return run;
}

void LeastSquaresProblem::SetProgress(Progress progress) { progress_ = std::move(progress); }

FitResult LeastSquaresProblem::Solve(const SolveOptions& options) {
  const QuietCeresLog quiet;  // failures are reported in the result, never printed
  const std::vector<int> estimated = EstimatedParameters();
  loss_ = options.loss;
  std::string error;
  std::string refusal;
  if (!options.IsValid(&error)) refusal = "invalid options: " + error;
  if (refusal.empty() && !unusable_.empty()) refusal = "cannot solve: " + unusable_;
  if (refusal.empty()) refusal = StartOutsideBounds();
  if (!refusal.empty()) {
    FitResult result = Report(options, estimated, SolveRun(), FitAnalysis());
    result.termination = "NOT_RUN";
    result.message = refusal;
    return result;
  }

  const int num_solves = options.estimate_group_sigmas ? 1 + options.group_sigma_rounds : 1;
  int iterations = 0;
  int solves = 0;
  SolveRun run;
  FitAnalysis analysis;
  while (true) {
    ReportProgress(progress_, ProgressStage::kSolving, solves, num_solves);
    run = SolveWithActiveBounds(options, estimated);
    iterations += run.iterations;
    ++solves;
    analysis = Analyse(options, estimated);
    if (solves == num_solves || !RescaleGroupSigmas(analysis)) break;
  }
  ReportProgress(progress_, ProgressStage::kSolving, num_solves, num_solves);
  run.iterations = iterations;
  const std::vector<double> solved = Values();
  if (options.separate_input_noise && analysis.has_covariance && analysis.failure.empty() &&
      Converged(run.summary.termination_type) && CorrectInputNoiseBias(estimated, analysis)) {
    ReportProgress(progress_, ProgressStage::kCovariance, 0, 1);
    analysis = Analyse(options, estimated);  // the covariance at the corrected estimate
    ReportProgress(progress_, ProgressStage::kCovariance, 1, 1);
  }
  FitResult result = Report(options, estimated, run, analysis);
  const std::vector<double> corrected = Values();
  for (std::size_t j = 0; j < corrected.size(); ++j) result.input_noise_correction[j] = corrected[j] - solved[j];
  result.num_solves = solves;
  return result;
}

}  // namespace coilspin::core
