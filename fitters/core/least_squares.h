#pragma once
// Weighted nonlinear least squares over Ceres, with honest uncertainty.
//
// What is estimated. Parameters θ (physical units) minimise
//     S(θ) = Σ_g Σ_k ( r_gk(θ) / σ_g )²
// where r_gk are the residuals of group g (one bench test's channel, or one
// NIST data set) and σ_g is that group's noise level. Ceres sees scaled
// parameters x_j = θ_j / s_j (s_j the parameter's typical magnitude), so every
// value it moves is O(1); bounds are applied in the same scaled space.
//
// Solving (solve.cc). Levenberg–Marquardt with dense QR (Ceres), then two
// steps Ceres does not take. Bounds: Ceres projects each step onto the box,
// which can stall the other parameters while one sits on its bound (measured:
// a line with its slope capped ends with the intercept 2 % off), so a parameter
// found on a bound is held there and the rest solved again, until the
// Karush–Kuhn–Tucker signs agree. Refinement: near the minimum the cost stops
// telling points apart (the relative cost tolerance leaves parameters about
// √tolerance standard errors off), so Gauss–Newton steps follow, each kept only
// if it lowers the gradient without raising the cost beyond rounding; a model
// linear in its parameters ends exact to rounding.
//
// Covariance. At the solution, with J the Jacobian of the weighted residuals
// with respect to x, C = (JᵀJ)⁻¹ (Ceres Covariance, dense SVD). Each group's
// residual variance is  s_g² = RSS_g / (n_g − h_g), where h_g = trace(C·J_gᵀJ_g)
// is the group's share of the p fitted degrees of freedom (Σ_g h_g = p; with one
// group this is the classical s² = RSS/(n − p)). The parameter covariance is
//     Cov(θ) = S · Σ_g s_g² · C·J_gᵀJ_g·C · S,     S = diag(s_j)
// which reduces to s²·(JᵀJ)⁻¹ for one group (computed without forming J_gᵀJ_g,
// which would cost digits: group_covariance.h). With `estimate_group_sigmas`
// the σ_g are re-estimated from the residuals and the problem solved again, so
// that each group counts by its own noise.
//
// Intervals. Wald: θ_j ± t_{(1+c)/2, ν_j} · se_j, with Student-t quantiles
// (Boost.Math). ν_j is n − p for one group; with several groups it is the
// Welch–Satterthwaite combination  ν_j = (Σ_g v_gj)² / Σ_g (v_gj² / (n_g − h_g)),
// v_gj = s_g²·[C·J_gᵀJ_g·C]_jj, so a parameter informed by a few plateau means
// gets the few degrees of freedom they have.
//
// When it breaks. If JᵀJ is rank deficient (a direction of θ that no residual
// sees), no covariance is reported: the result names the parameters of each
// null direction as not identifiable. Residuals that are not independent
// (autocorrelated time series) make these intervals too narrow; the group
// statistics report the lag-1 autocorrelation, and by default a clearly
// autocorrelated group has its variance part inflated by the AR(1) factor and
// its degrees of freedom taken from the effective sample size
// (autocorrelation_widening.h, SolveOptions::widen_for_autocorrelation). A model
// that is undefined at a trial point may return non-finite residuals: the step
// is rejected, and nothing is printed (logging is silent; outcomes are in the
// FitResult). Accuracy on the NIST StRD nonlinear regression sets: docs/nist-strd.md.
//
// Beyond Wald (docs/intervals.md). Residual offsets δ_g (r + δ before weighting)
// and Clone() let bootstrap.h refit resampled data on other threads without
// touching the caller's models; profile.h inverts the objective for one
// parameter; robust_loss.h replaces Σz² by Σρ(z²) for logs with spikes.

#include <ceres/ceres.h>

#include <Eigen/Dense>
#include <array>
#include <cmath>
#include <memory>
#include <optional>
#include <string>
#include <functional>
#include <vector>

#include "fitters/core/input_noise_autocovariance.h"
#include "fitters/core/progress.h"
#include "fitters/core/quantisation.h"
#include "fitters/core/robust_loss.h"

namespace coilspin::core {

struct ParameterSpec {
  std::string name;                  // e.g. "resistance"
  double initial = 0.0;              // starting value, physical units
  double scale = 0.0;                // typical magnitude s_j; 0 means |initial| (1 if initial is 0)
  std::optional<double> lower;       // physical bounds
  std::optional<double> upper;
  bool fixed = false;                // held at `initial`, not estimated
};

struct GroupSpec {
  std::string name;                  // e.g. "locked-rotor step current"
  double sigma = 1.0;                // noise σ_g of this group's residuals, in their unit
  // σ_g is given (e.g. by the user from the bench's instrument specification): it is
  // not re-estimated by estimate_group_sigmas, and the covariance counts it as known
  // (s_g² = 1, no degrees of freedom lost to it) while the other groups' come from data.
  bool sigma_known = false;
  // Noise on a logged input that drives this group's model, counted by a covariance
  // term of the caller's (input_noise_autocovariance.h): when set, the covariance
  // step leaves its expected share out of s_g² and out of the autocorrelation
  // widening, so that it is not counted twice. Evaluated at the solution, on the
  // caller's thread, only with SolveOptions::separate_input_noise.
  InputNoiseModel input_noise = nullptr;
  // A reading quantised in whole steps of `quantisation_step` (an encoder's count,
  // in the group's unit; 0: not modelled), whose modelled value `modelled_reading`
  // gives: its error is counted exactly over the unknown phase of the steps
  // (quantisation.h), and left out of s_g² and the widening. Only with
  // SolveOptions::separate_input_noise.
  double quantisation_step = 0.0;
  ModelledReading modelled_reading = nullptr;
};

struct SolveOptions {
  double confidence = 0.95;          // two-sided interval level c
  int max_iterations = 500;
  double function_tolerance = 1e-15;
  double gradient_tolerance = 1e-15;
  double parameter_tolerance = 1e-15;
  // Re-estimate σ_g from the residuals and solve again (needs residual_variance_from_data).
  bool estimate_group_sigmas = false;
  int group_sigma_rounds = 3;
  // True: the noise scale is estimated from the residuals (s_g², Student-t).
  // False: σ_g are known exactly (s_g² = 1, normal quantiles).
  bool residual_variance_from_data = true;
  // A singular value of J below this fraction of the largest marks a null direction.
  double rank_tolerance = 1e-10;
  // Inflate the variance part of groups with clearly autocorrelated residuals
  // by (1+ρ₁)/(1−ρ₁) and take their degrees of freedom from n_eff
  // (autocorrelation_widening.h). With known σ_g the quantile stays normal.
  bool widen_for_autocorrelation = true;
  // For groups with GroupSpec::input_noise: correct the estimate for the bias the
  // input noise puts into an output-error fit (input_noise_bias.cc), and leave its
  // share out of their s_g² and widening (input_noise_autocovariance.h). Off where
  // only the cost is used (bootstrap replicates, profile solves).
  bool separate_input_noise = true;
  // Loss on the weighted residuals (robust_loss.h). A robust loss needs a noise
  // scale: either estimate_group_sigmas (σ_g from 1.4826·MAD of the residuals)
  // or σ_g known (residual_variance_from_data = false).
  RobustLoss loss = RobustLoss::kSquared;

  bool IsValid(std::string* error) const;
};

// std_error, ci_low, ci_high and degrees_of_freedom are NaN when no covariance
// exists (FitResult::not_identifiable); a fixed parameter has std_error 0, the
// interval [value, value] and 0 degrees of freedom. degrees_of_freedom is
// +infinity when the σ_g are known (residual_variance_from_data = false).
struct ParameterEstimate {
  std::string name;
  double value = 0.0;
  double std_error = 0.0;
  double ci_low = 0.0;
  double ci_high = 0.0;
  double degrees_of_freedom = 0.0;
  bool fixed = false;
  // The estimate sits on one of its bounds. The Wald interval ignores the bound
  // (the covariance is the unconstrained one), so treat it with care.
  bool at_bound = false;
};

struct GroupStatistics {
  std::string name;
  int num_residuals = 0;
  double sigma = 0.0;                // σ_g used in the final solve
  // s_g² = RSS_g/(n_g − h_g) of the weighted residuals (≈ 1 when σ_g is right), as
  // measured; the covariance uses it only with residual_variance_from_data. NaN
  // when n_g − h_g is not positive.
  double residual_variance = 0.0;
  // The s_g² the covariance used: residual_variance less the input noise counted
  // apart (GroupSpec::input_noise), or 1 when σ_g is known.
  double own_residual_variance = 0.0;
  double rms = 0.0;                  // RMS of the unweighted residuals, in their unit
  double lag1_autocorrelation = 0.0; // of the residual sequence, in order of addition
  double degrees_of_freedom = 0.0;   // n_g − h_g
  // v_gj / Σ_g v_gj for every parameter, in the order added (0 for fixed ones).
  std::vector<double> information_share;
  double fitted_degrees_of_freedom = 0.0;  // h_g = trace(C·J_gᵀJ_g); Σ_g h_g = p
  // Autocorrelation widening (autocorrelation_widening.h): whether it was
  // applied, the factor f_g on the group's variance part (1 when not), and
  // n_eff = n_g/f_g (n_g when not).
  bool widened_for_autocorrelation = false;
  double variance_inflation = 1.0;
  double effective_num_residuals = 0.0;
  // τ̂ of the group's own residuals (Geyer's estimate, whether or not it widened
  // the group; 1 for groups too short to estimate it), and the lags it summed.
  double integrated_autocorrelation_time = 1.0;
  int autocorrelation_lags = 0;
  // The leverage h_k of each residual (group_covariance.h); empty without a covariance.
  Eigen::VectorXd leverage;
};

struct FitResult {
  bool usable = false;               // converged and covariance available
  bool converged = false;
  std::string termination;           // Ceres termination type
  std::string message;               // Ceres message, or why not usable
  int iterations = 0;                // summed over all solves
  double initial_cost = 0.0;         // ½·S at start and at the end of the last solve (Ceres convention)
  double final_cost = 0.0;
  int num_residuals = 0;
  int num_estimated = 0;             // p
  int num_solves = 0;                // 1, or 1 + group_sigma_rounds with estimate_group_sigmas
  int refinement_steps = 0;          // Gauss–Newton steps taken after Levenberg–Marquardt, last solve
  double confidence = 0.95;
  std::vector<ParameterEstimate> parameters;  // same order as added
  Eigen::MatrixXd covariance;        // physical units, estimated parameters and fixed ones (zero rows)
  Eigen::MatrixXd correlation;       // same layout; rows of fixed parameters are zero
  // (JᵀWJ)⁻¹ in physical units, same layout: the estimator's linearisation
  // δθ = (JᵀWJ)⁻¹·JᵀW·δr, W = diag(1/σ_g²), for error propagation by the caller
  // (the input-noise terms); unlike `covariance` it carries no s_g² and no widening.
  Eigen::MatrixXd inverse_information;
  // The part of `covariance` from errors counted exactly rather than estimated
  // (quantised readings, GroupSpec::quantisation_step); same layout, zero when none.
  Eigen::MatrixXd counted_covariance;
  std::vector<GroupStatistics> groups;
  // Each null direction of JᵀJ, as the names of the parameters it involves.
  std::vector<std::vector<std::string>> not_identifiable;
  SolveOptions options;              // the options of this solve (loss, widening, …)
  // θ_c − θ̂ per parameter (physical, same order), the input-noise bias correction
  // applied after the solve (SolveOptions::separate_input_noise); all 0 when none.
  std::vector<double> input_noise_correction;

  const ParameterEstimate& Get(const std::string& name) const;  // asserts the name exists
  int IndexOf(const std::string& name) const;                     // -1 when absent
};

// Internal types of the implementation, defined in fitters/core/problem_internals.h.
struct GroupEvaluation;
struct FitAnalysis;
struct SolveRun;

class LeastSquaresProblem {
 public:
  LeastSquaresProblem();
  ~LeastSquaresProblem();
  LeastSquaresProblem(const LeastSquaresProblem&) = delete;
  LeastSquaresProblem& operator=(const LeastSquaresProblem&) = delete;

  // Numbers from data never abort: a starting value, scale or bound that is not
  // a finite number (or bounds out of order), a σ_g that is not finite and > 0,
  // and a non-finite value given to SetValues or HoldAt make the problem
  // unusable instead (a placeholder is kept, so indices stay valid), and Solve
  // then refuses with termination "NOT_RUN" and a message naming the parameter
  // or group (the first such number). A fitter passes what it computed and
  // reads the outcome. Misuse (an empty or repeated name, an unknown index)
  // still aborts (require.h): that is a bug, never the data.
  int AddParameter(const ParameterSpec& spec);  // returns the parameter index
  int AddGroup(const GroupSpec& spec);          // returns the group index

  // Adds `num_residuals` residuals of group `group`, computed by `model` from the
  // parameters listed (by index). Model is a functor templated for Ceres
  // automatic differentiation:
  //     template <typename T> bool operator()(T const* const* p, T* r) const;
  // where *p[k] is the k-th listed parameter in physical units and r receives
  // the unweighted residuals (measured − model). The core applies scaling and
  // the group weight 1/σ_g around it.
  template <class Model>
  void AddResiduals(int group, const std::vector<int>& parameters, int num_residuals, Model model);

  FitResult Solve(const SolveOptions& options);

  // Solve reports each solve (ProgressStage::kSolving) and the covariance step
  // to `progress` (empty: silent). Not copied by Clone(), so refits of clones
  // on other threads never report.
  void SetProgress(Progress progress);

  // Current values (physical) of all parameters, e.g. after Solve.
  std::vector<double> Values() const;

  int NumParameters() const;
  int NumGroups() const;
  const ParameterSpec& Spec(int parameter) const;  // as added (fixed and initial as last held)

  // An independent problem with the same parameters (specs, scales, current
  // values, fixed ones), groups (current σ_g), residual blocks and residual
  // offsets. The blocks share the models given to AddResiduals, read-only: a
  // model evaluated from several clones on several threads must not change
  // state in operator() (no mutable members), which Ceres' const call implies.
  std::unique_ptr<LeastSquaresProblem> Clone() const;

  // Sets the current values (physical, every parameter in the order added; a
  // fixed parameter is then held at its new value). Each must lie in its bounds.
  void SetValues(const std::vector<double>& values);
  // Fixes a parameter at `value` (physical, within its bounds) for later solves.
  void HoldAt(int parameter, double value);
  void SetGroupSigma(int group, double sigma);
  // Gives group's σ_g as known (GroupSpec::sigma_known): kept through estimate_group_sigmas.
  void GiveGroupSigma(int group, double sigma);
  // Offsets δ added to group g's unweighted residuals before weighting, r + δ
  // (n_g values in the order the residuals were added); empty removes them.
  void SetResidualOffsets(int group, const std::vector<double>& offsets);
  // Unweighted residuals r of each group (without offsets) at the current
  // values; nullopt when a model fails to evaluate.
  std::optional<std::vector<Eigen::VectorXd>> Residuals() const;

 private:
  struct Parameter;
  struct Group;
  struct Block;
  static constexpr int kMaxParametersPerBlock = 16;

  // What a block's cost function reads from its problem at each evaluation.
  struct Weighting {
    const double* sigma = nullptr;     // the group's σ_g, may change between solves
    const RobustLoss* loss = nullptr;  // the problem's loss of the current solve
    std::vector<double> offsets;       // δ per residual of the block; empty: none
  };
  using RawEvaluation = std::function<bool(const double* const*, double*)>;
  using BlockCopier = std::function<void(LeastSquaresProblem&)>;

  // z̃ = robust( (r + δ)/σ_g ), with θ = s·x.
  template <class Model>
  struct Scaled {
    std::shared_ptr<const Model> model;
    std::vector<double> scales;
    const Weighting* weighting;  // owned by the problem's block
    int num_residuals;
    template <typename T>
    bool operator()(T const* const* x, T* r) const {
      std::array<T, kMaxParametersPerBlock> physical;
      std::array<const T*, kMaxParametersPerBlock> pointers;
      for (std::size_t k = 0; k < scales.size(); ++k) {
        physical[k] = x[k][0] * scales[k];  // θ = s·x
        pointers[k] = &physical[k];
      }
      if (!(*model)(pointers.data(), r)) return false;
      const bool offset = !weighting->offsets.empty();
      for (int i = 0; i < num_residuals; ++i) {
        T z = offset ? r[i] + weighting->offsets[static_cast<std::size_t>(i)] : r[i];
        z /= *weighting->sigma;
        r[i] = RobustResidual(z, *weighting->loss);
        // A trial step that overflows (exp of a wild argument) is reported as a
        // failed evaluation: Ceres rejects the step without building its long
        // per-block diagnostic for a non-finite value.
        if (!Finite(r[i])) return false;
      }
      return true;
    }
  };
  static bool Finite(double value) { return std::isfinite(value); }
  template <int N>
  static bool Finite(const ceres::Jet<double, N>& value) {
    return std::isfinite(value.a) && value.v.allFinite();
  }

  double* ScaledValue(int parameter);
  double ScaleOf(int parameter) const;
  template <class Model>
  void AddShared(int group, const std::vector<int>& parameters, int num_residuals,
                 std::shared_ptr<const Model> model);
  // Checks and records a new block; returns its weighting for the cost function.
  const Weighting* NewBlock(int group, const std::vector<int>& parameters, int num_residuals,
                            RawEvaluation evaluate, BlockCopier copier);
  void AttachCost(ceres::CostFunction* cost);  // to the block NewBlock made last
  std::vector<Eigen::VectorXd> RawResiduals(bool with_offsets, bool* evaluated) const;
  double WeightedCost(bool* evaluated) const;  // Σ_g ‖r_g‖²/σ_g² at the current values

  // Solving (solve.cc), the covariance step (analysis.cc) and the result (report.cc).
  std::vector<int> EstimatedParameters() const;
  std::vector<double*> BlocksOf(const std::vector<int>& parameters) const;
  std::string StartOutsideBounds() const;
  ceres::Solver::Summary Minimise(const SolveOptions& options);
  SolveRun SolveWithActiveBounds(const SolveOptions& options, const std::vector<int>& estimated);
  std::vector<int> OnBound(const std::vector<int>& parameters) const;
  std::vector<int> BoundNoLongerActive(const std::vector<int>& held);
  int Refine(const std::vector<int>& free);
  std::vector<GroupEvaluation> EvaluateGroups(const std::vector<int>& estimated);
  std::optional<Eigen::MatrixXd> CeresInverseInformation(const std::vector<int>& estimated,
                                                         double rank_tolerance);
  FitAnalysis Analyse(const SolveOptions& options, const std::vector<int>& estimated);
  bool RescaleGroupSigmas(const FitAnalysis& analysis);
  // Input-noise bias correction (input_noise_bias.cc): the step ½·C·∇A in x, empty
  // when no group models its input noise; and its application (within the bounds).
  Eigen::VectorXd InputNoiseBiasStep(const std::vector<int>& estimated, const FitAnalysis& analysis) const;
  bool CorrectInputNoiseBias(const std::vector<int>& estimated, const FitAnalysis& analysis);
  FitResult Report(const SolveOptions& options, const std::vector<int>& estimated, const SolveRun& run,
                   const FitAnalysis& analysis) const;

  std::unique_ptr<ceres::Problem> problem_;
  std::vector<std::unique_ptr<Parameter>> parameters_;
  std::vector<std::unique_ptr<Group>> groups_;
  std::vector<std::unique_ptr<Block>> blocks_;  // in order of addition
  RobustLoss loss_ = RobustLoss::kSquared;      // set by each Solve from its options
  Progress progress_;                           // SetProgress
  std::string unusable_;  // why Solve refuses: the first number from data it cannot use (see AddParameter)
  void MarkUnusable(const std::string& why);
};

template <class Model>
void LeastSquaresProblem::AddResiduals(int group, const std::vector<int>& parameters,
                                       int num_residuals, Model model) {
  AddShared(group, parameters, num_residuals, std::make_shared<const Model>(std::move(model)));
}

template <class Model>
void LeastSquaresProblem::AddShared(int group, const std::vector<int>& parameters, int num_residuals,
                                    std::shared_ptr<const Model> model) {
  constexpr int kStride = 4;
  const RawEvaluation evaluate = [model](const double* const* p, double* r) { return (*model)(p, r); };
  const BlockCopier copier = [group, parameters, num_residuals, model](LeastSquaresProblem& target) {
    target.AddShared(group, parameters, num_residuals, model);
  };
  const Weighting* weighting = NewBlock(group, parameters, num_residuals, evaluate, copier);
  std::vector<double> scales;
  for (int index : parameters) scales.push_back(ScaleOf(index));
  auto* functor = new Scaled<Model>{model, scales, weighting, num_residuals};
  auto* cost = new ceres::DynamicAutoDiffCostFunction<Scaled<Model>, kStride>(functor);
  for (std::size_t k = 0; k < parameters.size(); ++k) cost->AddParameterBlock(1);
  cost->SetNumResiduals(num_residuals);
  AttachCost(cost);
}

// Student-t quantile t_{q, ν} (Boost.Math); ν = ∞ gives the normal quantile.
// NaN when ν is not > 0 (no residual degrees of freedom are left: there is no
// t interval), which the caller reports; a probability outside (0, 1) is misuse.
double StudentTQuantile(double probability, double degrees_of_freedom);

}  // namespace coilspin::core
