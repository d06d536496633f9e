#include "fitters/joint/motor_fit.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <deque>

#include "fitters/core/estimate_from_fit.h"
#include "fitters/core/shared_parameters.h"
#include "fitters/joint/consistency.h"
#include "fitters/joint/assumptions.h"
#include "fitters/joint/derived.h"
#include "fitters/joint/residual_groups.h"
#include "fitters/joint/sensor_offsets.h"
#include "fitters/locked_rotor/input_noise.h"
#include "fitters/no_load/no_load_fit.h"
#include "fitters/spin_down/spin_down_fit.h"
#include "fitters/step/input_noise.h"
#include "fitters/step/step_fit.h"
#include "src/ingest/encoder_speed.h"
#include "src/units/constants.h"
#include "src/ingest/small_text_and_statistics.h"

namespace coilspin::joint {
namespace {

constexpr int kTorqueSpeedPoints = 11;
const char* const kTiedBasis = "equal-to-Ke";

bool Has(const MotorEstimate& e, const std::string& key) {
  if (e.Find(key)) return true;
  for (const auto& q : e.ratios)
    if (q.key == key) return true;
  return std::any_of(e.not_identified.begin(), e.not_identified.end(),
                     [&](const auto& entry) { return entry.first == key; });
}

// Why a model parameter is undetermined when no test of the set informs it.
void AddMissingReasons(MotorEstimate* e) {
  const std::pair<const char*, const char*> reasons[] = {
      {"resistance", "needs a locked-rotor test"},
      {"inductance", "needs a locked-rotor step capture or a free-shaft step test"},
      {"back_emf_constant", "needs a no-load test, a step test, or a spin-down with the terminal voltage logged"},
      {"torque_constant", "needs a torque column in a locked-rotor log, or a back-EMF measurement to assume Kt = Ke"},
      {"inertia", "needs a step test, or a spin-down test together with a no-load test (or --known-inertia)"},
      {"viscous_friction", "needs a no-load or step test, or a spin-down with --known-inertia"},
      {"coulomb_friction", "needs a no-load or step test, or a spin-down with --known-inertia"},
      {"brush_drop", "needs locked-rotor plateaus at 2 or more current levels"},
  };
  for (const auto& [key, reason] : reasons)
    if (!Has(*e, key)) e->not_identified.push_back({key, reason});
}

// A test's own report may have listed a parameter as not identified that another test determined.
void DropAnsweredReasons(MotorEstimate* e) {
  auto& list = e->not_identified;
  list.erase(std::remove_if(list.begin(), list.end(), [&](const auto& entry) { return e->Find(entry.first) != nullptr; }),
             list.end());
}

struct ParameterInfo {
  const char* key;
  const char* symbol;
  const char* unit;
};
const ParameterInfo kPhysical[] = {
    {"resistance", "R", "ohm"},           {"inductance", "L", "H"},
    {"back_emf_constant", "Ke", "V*s/rad"}, {"torque_constant", "Kt", "N*m/A"},
    {"inertia", "J", "kg*m^2"},           {"viscous_friction", "B", "N*m*s/rad"},
    {"coulomb_friction", "Tc", "N*m"},    {"brush_drop", "Vb", "V"},
};

// The highest settled supply level of the plateau logs: the default operating voltage.
double HighestLevel(const locked_rotor::LockedRotorPlan& lr, const no_load::NoLoadPlan& nl) {
  double level_V = 0.0;
  for (const auto& pl : lr.plateau_logs)
    for (const auto& p : pl.plateaus) level_V = std::max(level_V, std::fabs(p.mean_voltage_V));
  for (const auto& l : nl.logs)
    for (const auto& p : l.plateaus) level_V = std::max(level_V, std::fabs(p.mean_voltage_V));
  return level_V;
}

// A free shaft settles with the mechanical time constant, far slower than the
// current of a locked rotor: half of each no-load level is dropped as transient.
constexpr double kNoLoadSettleFraction = 0.5;

PlateauOptions NoLoadPlateauOptions(PlateauOptions options) {
  options.settle_fraction = std::max(options.settle_fraction, kNoLoadSettleFraction);
  return options;
}

// Above this |ρ| two parameters are nearly one direction for the data.
constexpr double kStrongCorrelation = 0.99;

// Each test's share of each estimated parameter's information.
void AddInformationShares(const std::vector<ResidualGroup>& groups, const core::SharedParameters& parameters,
                          const core::FitResult& fit, MotorEstimate* e) {
  for (const auto& key : e->correlation_names) {
    const int index = parameters.Index(key);
    std::vector<double> share(e->tests.size(), 0.0);
    for (const auto& g : groups)
      if (g.group >= 0) share[g.summary] += fit.groups[g.group].information_share[index];
    for (std::size_t t = 0; t < e->tests.size(); ++t)  // shares sum to 1 up to rounding
      if (share[t] > 0.0) e->tests[t].information_share.push_back({key, std::min(share[t], 1.0)});
  }
}

// Given noise levels replace the estimated ones of the sample-by-sample channels.
void ApplyNoiseOverrides(const std::vector<NoiseOverride>& overrides, const std::vector<ResidualGroup>& groups,
                         core::LeastSquaresProblem* problem, MotorEstimate* e) {
  for (const auto& o : overrides) {
    int matched = 0;
    std::string unit;
    for (const auto& g : groups)
      if (g.group >= 0 && g.sample_by_sample && o.channel == g.channel) {
        problem->GiveGroupSigma(g.group, o.sigma);
        unit = g.unit;
        ++matched;
      }
    if (matched == 0)
      e->warnings.push_back("--noise " + o.channel + ": no test fits a " + o.channel +
                            " channel sample by sample, so the given noise level was not used");
    else
      e->intervals.notes.push_back(o.channel + " noise given as " + Format("%g", o.sigma) + " " + unit + " for " +
                                   std::to_string(matched) + " channel(s), not estimated from the data");
  }
}

// Near-singular directions: pairs of parameters the tests barely tell apart.
void WarnStrongCorrelations(MotorEstimate* e) {
  const auto& names = e->correlation_names;
  for (std::size_t a = 0; a < names.size(); ++a)
    for (std::size_t b = a + 1; b < names.size(); ++b)
      if (std::fabs(e->correlation[a][b]) > kStrongCorrelation)
        e->warnings.push_back(names[a] + " and " + names[b] + " move together in these tests (correlation " +
                              Format("%.4f", e->correlation[a][b]) +
                              "): the logs fix their combination far better than either one, and each interval "
                              "is wide for that reason; a test that moves one without the other would separate them");
}

}  // namespace

bool MotorFitOptions::IsValid(std::string* error) const {
  if (!(confidence > 0.0 && confidence < 1.0)) {
    *error = "confidence must lie between 0 and 1 (exclusive)";
    return false;
  }
  if (known_inertia_kg_m2 && !(*known_inertia_kg_m2 > 0.0)) {
    *error = "--known-inertia must be positive";
    return false;
  }
  if (at_voltage_V && !(*at_voltage_V > 0.0)) {
    *error = "--at-voltage must be positive";
    return false;
  }
  if (max_solver_iterations < 1 || group_sigma_rounds < 0) {
    *error = "the solver needs at least 1 iteration and 0 or more noise re-estimation rounds";
    return false;
  }
  for (const auto& o : noise) {
    if (o.channel != "current" && o.channel != "voltage" && o.channel != "speed" && o.channel != "position") {
      *error = "--noise: channel must be current, voltage, speed or position, got '" + o.channel + "'";
      return false;
    }
    if (!(std::isfinite(o.sigma) && o.sigma > 0.0)) {
      *error = "--noise " + o.channel + ": sigma must be a positive number (SI units)";
      return false;
    }
  }
  return locked_rotor.IsValid(error);
}

std::vector<std::string> RequirableKeys() {
  std::vector<std::string> keys;
  for (const auto& info : kPhysical) keys.push_back(info.key);
  for (const char* ratio : {"viscous_over_inertia", "coulomb_over_inertia", "torque_constant_over_inertia"})
    keys.push_back(ratio);
  for (const auto& key : model::DerivedKeys()) keys.push_back(key);
  return keys;
}

MotorEstimate FitMotor(const std::vector<TestLog>& tests, const MotorFitOptions& options) {
  MotorEstimate e;
  e.motor_label = options.motor_label;
  e.confidence = options.confidence;
  std::vector<const BenchLog*> locked, free_plateaus, coasts, steps;
  for (const auto& t : tests) {
    if (t.kind == TestKind::kLockedRotor) locked.push_back(&t.log);
    if (t.kind == TestKind::kNoLoad) free_plateaus.push_back(&t.log);
    if (t.kind == TestKind::kSpinDown) coasts.push_back(&t.log);
    if (t.kind == TestKind::kStep) steps.push_back(&t.log);
  }

  // Speed of no-load logs: the logged column, or derived from encoder position.
  std::deque<std::vector<double>> derived_speeds;
  std::vector<no_load::SpeedTrace> speeds;
  for (const BenchLog* log : free_plateaus) {
    if (!log->speed_rad_s.empty()) {
      speeds.push_back({&log->speed_rad_s, "logged speed column"});
    } else {
      SpeedFromPositionOptions differentiation;  // counts per motor revolution: CPR / gear ratio
      if (options.counts_per_rev) differentiation.counts_per_rev = *options.counts_per_rev / options.gear_ratio;
      DerivedSpeed d = SpeedFromPosition(log->time_s, log->position_rad, differentiation);
      derived_speeds.push_back(std::move(d.speed_rad_s));
      speeds.push_back({&derived_speeds.back(), d.method});
    }
  }

  // 1. Each test plans what it can determine.
  const int num_tests = static_cast<int>(tests.size());
  core::ReportProgress(options.progress, core::ProgressStage::kPlanning, 0, num_tests);
  locked_rotor::LockedRotorOptions lr_options = options.locked_rotor;
  lr_options.confidence = options.confidence;
  locked_rotor::LockedRotorPlan lr;
  if (!locked.empty()) lr = locked_rotor::PlanLockedRotor(locked, lr_options, &e);
  int planned = static_cast<int>(locked.size());
  core::ReportProgress(options.progress, core::ProgressStage::kPlanning, planned, num_tests);
  std::optional<double> count_rad;  // one encoder count at the motor shaft
  if (options.counts_per_rev) count_rad = units::kRadiansPerRevolution * options.gear_ratio / *options.counts_per_rev;
  spin_down::SpinDownPlan sd;
  if (!coasts.empty()) sd = spin_down::PlanSpinDown(coasts, count_rad, &e);
  planned += static_cast<int>(coasts.size());
  core::ReportProgress(options.progress, core::ProgressStage::kPlanning, planned, num_tests);
  step::StepTestPlan st;
  if (!steps.empty()) {
    const std::optional<double> reference_degC =
        !locked.empty() ? lr.reference_degC : lr_options.reference_temperature_degC;
    st = step::PlanStep(steps, count_rad, {reference_degC, lr_options.winding_temperature_degC},
                        lr.brush_drop_start_V, &e);
  }
  planned += static_cast<int>(steps.size());
  core::ReportProgress(options.progress, core::ProgressStage::kPlanning, planned, num_tests);
  no_load::NoLoadPlan nl;
  if (!free_plateaus.empty())
    nl = no_load::PlanNoLoad(free_plateaus, speeds,
                             lr.resistance_identified ? std::optional<double>(lr.resistance_start_ohm) : std::nullopt,
                             lr.brush_drop_start_V, {lr.reference_degC, lr_options.winding_temperature_degC},
                             sd.measures_back_emf ? std::optional<double>(sd.back_emf_start) : std::nullopt,
                             NoLoadPlateauOptions(lr_options.plateaus), &e);
  core::ReportProgress(options.progress, core::ProgressStage::kPlanning, num_tests, num_tests);

  // Readings each log had set aside at ingest, on its test's summary.
  for (auto& summary : e.tests)
    for (const auto& t : tests)
      if (t.log.path == summary.file && summary.set_aside.empty())
        for (const auto& s : t.log.set_aside)
          summary.set_aside.push_back({std::string(units::QuantityName(s.quantity)), s.lines});

  // 2. The mechanical basis.
  const bool has_back_emf = nl.back_emf_identified || sd.measures_back_emf || st.usable;
  const bool inertia_known = options.known_inertia_kg_m2.has_value();
  // A step measures Kt/J: with the inertia given, Kt itself.
  const bool kt_from_step = !lr.measures_torque_constant && inertia_known && st.usable;
  const bool kt_measured = lr.measures_torque_constant || kt_from_step;
  const std::string kt_name = kt_measured ? "torque_constant" : "back_emf_constant";
  const bool friction_from_no_load = nl.friction_identified;
  const spin_down::Mechanics mechanics = (friction_from_no_load || inertia_known || st.usable)
                                             ? spin_down::Mechanics::kAbsolute
                                             : spin_down::Mechanics::kRatios;
  double inertia_start = options.known_inertia_kg_m2.value_or(0.0);
  if (!inertia_known && sd.usable && friction_from_no_load) {
    inertia_start = (nl.coulomb_start > 0.0 && sd.coulomb_over_inertia_start > 0.0)
                        ? nl.coulomb_start / sd.coulomb_over_inertia_start
                        : nl.viscous_start / sd.viscous_over_inertia_start;
  } else if (!inertia_known && st.usable) {
    inertia_start = step::InertiaStart(st, lr.measures_torque_constant ? lr.torque_constant_start : st.back_emf_start);
  }

  // 3. One problem.
  core::LeastSquaresProblem problem;
  problem.SetProgress(options.progress);
  core::SharedParameters parameters(&problem);
  double peak_current_A = 0.0;
  for (const auto& t : tests)
    for (double i : t.log.current_A) peak_current_A = std::max(peak_current_A, std::fabs(i));
  const CurrentZero current_zero = FindCurrentZero(lr, sd, st, peak_current_A, options.one_current_sensor);
  AddCurrentZero(current_zero, &parameters);
  locked_rotor::AddLockedRotor(&lr, &parameters);
  no_load::AddNoLoad(&nl, kt_name, &parameters);
  if (sd.usable && mechanics == spin_down::Mechanics::kAbsolute && !(inertia_start > 0.0)) sd.usable = false;
  spin_down::AddSpinDown(&sd, mechanics, inertia_start, inertia_known, &parameters);
  step::AddStep(&st, kt_name, inertia_start, inertia_known, &parameters);
  const bool anything = lr.resistance_identified || nl.back_emf_identified || sd.usable || st.usable;
  if (!anything) {
    AddMissingReasons(&e);
    return e;
  }
  const std::vector<ResidualGroup> residual_groups = ResidualGroups(lr, nl, sd, st);
  for (const auto& g : residual_groups)
    if (g.group >= 0) e.tests[g.summary].contributed = true;
  ApplyNoiseOverrides(options.noise, residual_groups, &problem, &e);
  core::SolveOptions solve;
  solve.confidence = options.confidence;
  solve.estimate_group_sigmas = true;
  solve.group_sigma_rounds = options.group_sigma_rounds;
  solve.max_iterations = options.max_solver_iterations;
  solve.loss = options.loss;
  core::FitResult fit = problem.Solve(solve);
  if (options.keep_model_traces)  // at the solution, before any interval method moves the problem
    if (const auto residuals = problem.Residuals()) e.model_traces = ModelTraces(residual_groups, *residuals);
  const Eigen::MatrixXd output_covariance = fit.covariance;
  locked_rotor::AddVoltageNoiseCovariance(lr, parameters, &fit);
  step::AddStepVoltageNoiseCovariance(st, &fit);
  const Eigen::MatrixXd input_covariance =
      fit.usable ? Eigen::MatrixXd(fit.covariance - output_covariance) : Eigen::MatrixXd();
  e.intervals.method = IntervalMethodName(options.intervals.method);
  e.intervals.robust_loss = options.loss == core::RobustLoss::kSquared ? "none" : core::RobustLossToString(options.loss);
  std::optional<core::BootstrapResult> bootstrap;
  if (fit.usable && options.intervals.method == IntervalMethod::kProfile) {
    std::vector<std::string> names;
    for (const auto& info : kPhysical) names.push_back(info.key);
    ApplyProfileIntervals(problem, names, &fit, &e.intervals.notes, options.progress);
  }
  if (fit.usable && options.intervals.method == IntervalMethod::kBootstrap) {
    // Resampled residuals cannot redraw an encoder's phase (one per log), nor the logged voltage's noise that
    // drives the models: both terms are added to the replicates' covariance (core/quantisation.h, input_noise.h).
    bootstrap = ApplyBootstrapIntervals(problem, options.intervals, input_covariance + fit.counted_covariance, &fit,
                                        &e.intervals.notes, options.progress);
    e.intervals.seed = options.intervals.seed;
    if (bootstrap) {
      e.intervals.replicates = static_cast<int>(bootstrap->replicates.size());
      e.intervals.failed_replicates = bootstrap->failed;
    }
  }
  for (const auto& g : fit.groups)
    if (g.widened_for_autocorrelation)
      e.intervals.notes.push_back(g.name + ": residuals autocorrelated (lag-1 " + Format("%.2f", g.lag1_autocorrelation) +
                                  "): its share of the variance widened by " + Format("%.2f", g.variance_inflation) +
                                  " (effective sample size " + Format("%.0f", g.effective_num_residuals) + " of " +
                                  std::to_string(g.num_residuals) + "); --intervals bootstrap resamples blocks instead");
  if (fit.usable) {
    // The errors-in-variables correction of the models driven by the logged voltage (core::input_noise_bias.cc).
    // Shifts are given in standard errors to two decimals; smaller ones are summed up as such.
    std::string shifts;
    bool corrected = false, small = false;
    for (const auto& info : kPhysical) {
      const int index = parameters.Index(info.key);
      if (index < 0 || fit.parameters[index].fixed) continue;
      const double shift = fit.input_noise_correction[static_cast<std::size_t>(index)];
      if (shift == 0.0 || !(fit.parameters[index].std_error > 0.0)) continue;
      corrected = true;
      const std::string in_se = Format("%+.2f", shift / fit.parameters[index].std_error);
      if (in_se == "+0.00" || in_se == "-0.00") {
        small = true;
        continue;
      }
      shifts += std::string(shifts.empty() ? "" : ", ") + info.symbol + " " + in_se + " se";
    }
    if (corrected)
      e.intervals.notes.push_back(
          "estimates corrected for the bias that the logged voltage's noise puts into the step models (errors in "
          "variables): " + (shifts.empty() ? std::string("every parameter") : shifts) +
          (small ? (shifts.empty() ? " by less than 0.005 se" : "; the others by less than 0.005 se") : ""));
  }
  e.solver.push_back(core::ToSolverSummary(fit));

  // 4. Each test reports its residuals (and the locked-rotor test its own notes).
  if (lr.resistance_identified) locked_rotor::ReportLockedRotor(lr, fit, &e);
  no_load::ReportNoLoad(nl, fit, &e);
  spin_down::ReportSpinDown(sd, fit, &e);
  step::ReportStep(st, fit, &e);
  if (!fit.usable) {
    std::string involved;
    for (const auto& direction : fit.not_identifiable)
      for (const auto& name : direction) involved += (involved.empty() ? "" : ", ") + name;
    e.warnings.push_back("the joint fit has no usable covariance: " + fit.message +
                         (involved.empty() ? "" : " (parameters involved: " + involved + ")"));
    AddMissingReasons(&e);
    return e;
  }

  // 5. Parameters, each with every test that informed it.
  std::vector<std::string> covariance_names;
  for (const auto& info : kPhysical) {
    const int index = parameters.Index(info.key);
    if (index < 0 || fit.parameters[index].fixed) continue;
    covariance_names.push_back(info.key);
    QuantityEstimate* existing = nullptr;
    for (auto& q : e.parameters)
      if (q.key == info.key) existing = &q;
    if (existing) {
      existing->tests = parameters.TestsFor(info.key);
      continue;
    }
    e.parameters.push_back(core::ToQuantity(fit, info.key, info.symbol, info.unit, parameters.TestsFor(info.key)));
  }
  if (inertia_known && parameters.Has("inertia")) {
    QuantityEstimate j = core::ToQuantity(fit, "inertia", "J", "kg*m^2", {});
    j.basis = "given";
    j.note = "given with --known-inertia, not estimated";
    e.parameters.push_back(j);
  }
  if (!kt_measured && parameters.Has("back_emf_constant") && (friction_from_no_load || has_back_emf)) {
    QuantityEstimate kt = core::ToQuantity(fit, "back_emf_constant", "Kt", "N*m/A", parameters.TestsFor("back_emf_constant"));
    kt.key = "torque_constant";
    kt.basis = kTiedBasis;  // the assumption is stated by NoteTorqueConstantTakenAsBackEmf
    e.parameters.push_back(kt);
  }
  core::CopyCovariance(fit, covariance_names, &e);
  if (kt_from_step)
    for (auto& q : e.parameters)
      if (q.key == "torque_constant") {
        q.basis = "measured";
        q.note = "from the step's Kt/J with the inertia given by --known-inertia";
      }
  AddInformationShares(residual_groups, parameters, fit, &e);
  ReportCurrentZero(current_zero, parameters, fit, &e);
  NoteBrushDropHeldAtZero(lr, st, &e);
  NoteTorqueConstantTakenAsBackEmf(&e);
  CutIntervalsAtPhysicalBounds(&e);
  WarnStrongCorrelations(&e);

  // Bootstrap replicates in the covariance order, for derived quantities.
  Replicates replicates;
  if (bootstrap) {
    replicates.result = &*bootstrap;
    for (const auto& p : fit.parameters) replicates.full_fit_values.push_back(p.value);
    for (const auto& name : e.correlation_names) replicates.theta_index.push_back(parameters.Index(name));
    const Eigen::MatrixXd added = input_covariance + fit.counted_covariance;  // as ApplyBootstrapIntervals adds
    for (int a : replicates.theta_index) {
      replicates.added_covariance.emplace_back();
      for (int b : replicates.theta_index) replicates.added_covariance.back().push_back(added(a, b));
    }
  }
  const auto derive = [&](const model::DerivedFormula& f, double voltage_V) {
    return DeriveFromReplicates(f, e, voltage_V, replicates);  // the delta method when there are none
  };

  // 6. Ratios the coast (or a step) determines on its own.
  if (sd.usable || st.usable) {
    if (mechanics == spin_down::Mechanics::kRatios) {
      e.ratios.push_back(core::ToQuantity(fit, "viscous_over_inertia", "B/J", "1/s", {"spin-down"}));
      e.ratios.push_back(core::ToQuantity(fit, "coulomb_over_inertia", "Tc/J", "rad/s^2", {"spin-down"}));
      const char* reason = "a spin-down alone fixes only B/J and Tc/J; absolute values need a no-load test "
                           "(Kt-scaled friction) or --known-inertia";
      for (const char* key : {"inertia", "viscous_friction", "coulomb_friction"})
        if (!e.Find(key)) e.not_identified.push_back({key, reason});
    } else {
      const model::DerivedFormula ratios[] = {
          {"viscous_over_inertia", "B/J", "1/s", {"viscous_friction", "inertia"}, false,
           [](const model::ParameterValues& p) { return p.at("viscous_friction") / p.at("inertia"); }},
          {"coulomb_over_inertia", "Tc/J", "rad/s^2", {"coulomb_friction", "inertia"}, false,
           [](const model::ParameterValues& p) { return p.at("coulomb_friction") / p.at("inertia"); }},
          {"torque_constant_over_inertia", "Kt/J", "rad/(s^2*A)", {"torque_constant", "inertia"}, false,
           [](const model::ParameterValues& p) { return p.at("torque_constant") / p.at("inertia"); }}};
      for (const auto& f : ratios) {
        if (f.key == std::string("torque_constant_over_inertia") && !st.usable) continue;
        if (auto q = derive(f, 0.0)) e.ratios.push_back(*q);
      }
    }
  } else if (!coasts.empty()) {
    e.not_identified.push_back({"viscous_over_inertia", "no usable coast in the spin-down logs"});
  }
  DropAnsweredReasons(&e);
  AddMissingReasons(&e);

  // 7. Derived quantities at the operating voltage, and the torque–speed line.
  const double at_voltage_V = options.at_voltage_V.value_or(HighestLevel(lr, nl));
  for (const auto& formula : model::DerivedFormulas(ValuesOf(e), at_voltage_V)) {
    if (formula.at_voltage && !(at_voltage_V > 0.0)) continue;
    if (auto q = derive(formula, at_voltage_V)) e.derived.push_back(*q);
  }
  if (at_voltage_V > 0.0) e.torque_speed = TorqueSpeed(e, at_voltage_V, kTorqueSpeedPoints);

  // 8. Kt/Ke consistency and the notes the result must carry.
  e.consistency = CheckConsistency(e, kt_measured, options.consistency_tolerance);
  if (options.gear_ratio != 1.0 && (!free_plateaus.empty() || !coasts.empty()))
    e.warnings.push_back("speed was read through a gearbox (ratio " + Format("%g", options.gear_ratio) +
                         "): speeds refer to the motor shaft, and J, B, Tc describe motor and gearbox together");
  return e;
}

}  // namespace coilspin::joint
