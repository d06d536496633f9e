#include "fitters/locked_rotor/locked_rotor_fit.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

#include "fitters/core/estimate_from_fit.h"
#include "fitters/core/least_squares.h"
#include "fitters/locked_rotor/torque_residual.h"
#include "fitters/locked_rotor/capture.h"
#include "fitters/locked_rotor/heating_drift.h"
#include "fitters/locked_rotor/initial_estimates.h"
#include "fitters/locked_rotor/input_noise.h"
#include "fitters/locked_rotor/plateau_residual.h"
#include "fitters/locked_rotor/step_residual.h"
#include "src/units/constants.h"
#include "src/model/copper_resistance.h"
#include "src/model/sensor_offsets.h"
#include "src/ingest/noise_level.h"
#include "src/ingest/small_text_and_statistics.h"

namespace coilspin::locked_rotor {
namespace {

constexpr const char* kTest = "locked-rotor";
// Two plateau currents are distinct levels when their magnitudes differ by more than this fraction.
constexpr double kDistinctCurrentFraction = 0.05;
// Lower bounds that keep R and L positive (their model divides by them).
constexpr double kMinResistance_ohm = 1e-9;
constexpr double kMinInductance_H = 1e-12;
// Rounds of noise re-estimation between logs (enough for the σ ratio to settle).
constexpr int kGroupSigmaRounds = 3;
// "At rest" is within this many noise σ of zero voltage and current (a Gaussian
// sample falls outside 5 σ with a chance of 6·10⁻⁷).
constexpr double kRestBandSigmas = 5.0;
// A capture shows the current at zero when it rests at 0 V for this many samples before the step (common practice).
constexpr std::size_t kMinRestSamples = 8;
// Kt from a torque column needs this many plateaus (two unknowns, Kt and τ0, and one degree of freedom).
constexpr std::size_t kMinTorquePlateaus = 3;

// Distinct current magnitudes among the plateaus of all logs.
int DistinctCurrentLevels(const std::vector<PlateauLog>& logs) {
  std::vector<double> magnitudes;
  for (const auto& pl : logs)
    for (const auto& p : pl.plateaus) magnitudes.push_back(std::fabs(p.mean_current_A));
  std::sort(magnitudes.begin(), magnitudes.end());
  int levels = 0;
  double last = -1.0;
  for (double m : magnitudes) {
    if (levels == 0 || m > last * (1.0 + kDistinctCurrentFraction)) {
      ++levels;
      last = m;
    }
  }
  return levels;
}

// Mean winding temperature of a log: logged channel, else the option.
std::optional<double> LogTemperature(const BenchLog& log, const LockedRotorOptions& options) {
  if (auto logged = MeanLoggedTemperature(log)) return logged;
  return options.winding_temperature_degC;
}

}  // namespace

StepCurrentResidual StepResidualOf(const StepLog& sl) {
  StepCurrentResidual residual{&sl.log->time_s, &sl.log->voltage_V, &sl.log->current_A, sl.factor, {}};
  residual.rest.voltage_V = kRestBandSigmas * sl.voltage_noise_V;
  residual.rest.current_A = kRestBandSigmas * sl.current_noise_A;
  return residual;
}

bool LockedRotorOptions::IsValid(std::string* error) const {
  const double lowest = -units::kCopperTemperatureConstant_degC;
  if (!(confidence > 0.0 && confidence < 1.0)) {
    *error = "confidence must lie between 0 and 1 (exclusive), got " + Format("%g", confidence);
    return false;
  }
  for (const auto& t : {winding_temperature_degC, reference_temperature_degC}) {
    if (t && !(*t > lowest)) {
      *error = "a winding temperature must be above " + Format("%g", lowest) + " degC, got " + Format("%g", *t);
      return false;
    }
  }
  return true;
}

LockedRotorPlan PlanLockedRotor(const std::vector<const BenchLog*>& logs, const LockedRotorOptions& options,
                                MotorEstimate* estimate) {
  LockedRotorPlan plan;

  // 1. Sort the logs into plateau logs and step captures.
  for (const BenchLog* log : logs) {
    const CaptureClassification c = ClassifyCapture(*log);
    if (c.kind == CaptureKind::kStep) {
      StepLog sl;
      sl.log = log;
      sl.classification = c;
      sl.current_noise_A = NoiseFromDifferences(log->current_A);
      const ChannelNoise voltage_noise = EstimateChannelNoise(log->voltage_V);
      sl.voltage_noise_V = voltage_noise.sigma;
      sl.voltage_noise_lag1 = voltage_noise.lag1;
      if (c.onset >= kMinRestSamples) {
        std::vector<double> before(log->voltage_V.begin(), log->voltage_V.begin() + static_cast<std::ptrdiff_t>(c.onset));
        sl.from_rest = std::fabs(Median(std::move(before))) <= kRestBandSigmas * sl.voltage_noise_V;
      }
      plan.step_logs.push_back(sl);
    } else {
      PlateauLog pl;
      pl.log = log;
      pl.classification = c;
      pl.plateaus = FindLockedPlateaus(*log, options.plateaus);
      plan.plateau_logs.push_back(pl);
    }
  }
  auto& plateau_logs = plan.plateau_logs;
  auto& step_logs = plan.step_logs;

  // 2. Temperatures: θ_ref is the requested reference, else the mean test temperature.
  std::vector<double> known_temperatures;
  for (const auto& pl : plateau_logs)
    for (const auto& p : pl.plateaus)
      if (p.has_temperature) known_temperatures.push_back(p.temperature_degC);
  for (const auto& sl : step_logs)
    if (auto t = LogTemperature(*sl.log, options)) known_temperatures.push_back(*t);
  if (options.winding_temperature_degC) known_temperatures.push_back(*options.winding_temperature_degC);
  if (!known_temperatures.empty()) {
    plan.reference_degC = options.reference_temperature_degC
                              ? *options.reference_temperature_degC
                              : std::accumulate(known_temperatures.begin(), known_temperatures.end(), 0.0) /
                                    static_cast<double>(known_temperatures.size());
    plan.reference_requested = options.reference_temperature_degC.has_value();
  } else if (options.reference_temperature_degC) {
    estimate->warnings.push_back(
        "resistance not corrected to " + Format("%g", *options.reference_temperature_degC) +
        " degC: the winding temperature is unknown (give --winding-temperature or log a temperature column)");
  }
  const std::optional<double> reference_degC = plan.reference_degC;
  auto factor_at = [&](std::optional<double> theta_degC) {
    if (!reference_degC || !theta_degC) return 1.0;
    return model::CopperResistanceAt(1.0, *reference_degC, *theta_degC);  // f = (k + θ)/(k + θ_ref)
  };
  for (auto& pl : plateau_logs)
    for (const auto& p : pl.plateaus)
      pl.factors.push_back(factor_at(p.has_temperature ? std::optional<double>(p.temperature_degC)
                                                       : options.winding_temperature_degC));
  for (auto& sl : step_logs) sl.factor = factor_at(LogTemperature(*sl.log, options));
  if (reference_degC) {
    std::vector<const BenchLog*> without_temperature;
    for (const auto& pl : plateau_logs)
      if (pl.log->temperature_degC.empty() && !options.winding_temperature_degC) without_temperature.push_back(pl.log);
    for (const auto& sl : step_logs)
      if (!LogTemperature(*sl.log, options)) without_temperature.push_back(sl.log);
    for (const BenchLog* log : without_temperature)
      estimate->warnings.push_back(log->path + ": no winding temperature (no temperature column, no "
                                   "--winding-temperature); taken as " + Format("%g", *reference_degC) + " degC");
  }

  // 3. What the data can determine.
  std::size_t plateau_count = 0;
  for (const auto& pl : plateau_logs) plateau_count += pl.plateaus.size();
  // Settled levels inside step captures count too: the sample-by-sample model
  // holds Vb·sgn(i) on every one of them (they are counted, not fitted twice).
  std::vector<PlateauLog> level_sources = plateau_logs;
  plan.level_count = plateau_count;
  for (const auto& sl : step_logs) {
    PlateauLog levels;
    levels.log = sl.log;
    levels.plateaus = FindLockedPlateaus(*sl.log, options.plateaus);
    plan.level_count += levels.plateaus.size();
    level_sources.push_back(levels);
  }
  plan.current_levels = DistinctCurrentLevels(level_sources);
  plan.estimate_brush_drop = plan.level_count >= 3 && plan.current_levels >= 2;
  plan.resistance_identified = !step_logs.empty() || plateau_count >= (plan.estimate_brush_drop ? 3u : 2u);
  for (const auto& pl : plateau_logs) {
    std::size_t torque_plateaus = 0;
    for (const auto& p : pl.plateaus) torque_plateaus += p.has_torque ? 1 : 0;
    if (torque_plateaus >= kMinTorquePlateaus) plan.measures_torque_constant = true;
  }
  for (const auto& pl : plateau_logs) {
    plan.summary_index.push_back(estimate->tests.size());
    estimate->tests.push_back({kTest, pl.log->path, static_cast<long>(pl.log->size()),
                               "plateaus: " + std::to_string(pl.plateaus.size()) + " settled levels with current" +
                                   (pl.plateaus.empty() || !pl.plateaus.front().has_torque ? "" : ", torque logged") +
                                   " (" + PlateauRuleText(pl.classification) + ")",
                               {}, {}, {}, {}});
    if (pl.plateaus.empty()) {
      const std::string text = pl.log->path + ": no settled plateau with current was found";
      estimate->tests.back().warnings.push_back(text);
      estimate->warnings.push_back(text);
    }
  }
  for (const auto& sl : step_logs) {
    plan.summary_index.push_back(estimate->tests.size());
    estimate->tests.push_back(
        {kTest, sl.log->path, static_cast<long>(sl.log->size()),
         "step capture: current rise resolved by " + Format("%.0f", sl.classification.rise_samples) +
             " samples per time constant; fitted sample by sample with the logged voltage as input",
         {}, {}, {}, {}});
  }
  if (!plan.resistance_identified) {
    estimate->not_identified.push_back(
        {"resistance", "needs at least 2 settled locked-rotor plateaus with current, or a step capture; found " +
                           std::to_string(plateau_count)});
    estimate->not_identified.push_back({"inductance", "needs a locked-rotor step capture"});
    estimate->not_identified.push_back({"brush_drop", "needs locked-rotor plateaus at 2 or more current levels"});
    return plan;
  }

  // 4. Starting point: closed form.
  std::vector<LockedPlateau> all_plateaus;
  std::vector<double> all_factors;
  for (const auto& pl : plateau_logs) {
    all_plateaus.insert(all_plateaus.end(), pl.plateaus.begin(), pl.plateaus.end());
    all_factors.insert(all_factors.end(), pl.factors.begin(), pl.factors.end());
  }
  const std::optional<PlateauLine> line = FitPlateauLine(all_plateaus, all_factors, plan.estimate_brush_drop);
  plan.brush_drop_start_V = line ? std::max(0.0, line->brush_drop_V) : 0.0;
  for (auto& sl : step_logs) {
    auto start = EstimateStepStart(*sl.log, plan.brush_drop_start_V,
                                   line ? std::optional<double>(line->resistance_ohm * sl.factor) : std::nullopt);
    if (!start) {
      plan.resistance_identified = false;
      estimate->not_identified.push_back({"resistance", "the step capture " + sl.log->path +
                                                            " gives no usable current rise (no starting estimate)"});
      estimate->not_identified.push_back({"inductance", "the step capture " + sl.log->path +
                                                            " gives no usable current rise (no starting estimate)"});
      return plan;
    }
    sl.initial_current_A = start->initial_current_A;
    sl.inductance_start_H = start->inductance_H;
    if (!line && &sl == &step_logs.front()) plan.resistance_start_ohm = start->resistance_ohm / sl.factor;
  }
  if (line) plan.resistance_start_ohm = line->resistance_ohm;
  // Vb's scale is R·|i| of a typical level, since Vb may start at 0.
  double typical_current_A = 0.0;
  for (const auto& pl : level_sources)
    for (const auto& p : pl.plateaus) typical_current_A = std::max(typical_current_A, std::fabs(p.mean_current_A));
  const double scale_V = std::max(plan.brush_drop_start_V, plan.resistance_start_ohm * typical_current_A);
  plan.brush_drop_scale_V = scale_V > 0.0 ? scale_V : 1.0;
  if (plan.measures_torque_constant) {
    double sum_ti = 0.0, sum_ii = 0.0;  // Kt ≈ Σ τ̄·ī / Σ ī² (through the origin, as a start)
    for (const auto& p : all_plateaus)
      if (p.has_torque) {
        sum_ti += p.mean_torque_N_m * p.mean_current_A;
        sum_ii += p.mean_current_A * p.mean_current_A;
      }
    plan.torque_constant_start = sum_ii > 0.0 ? sum_ti / sum_ii : 0.0;
  }
  return plan;
}

void AddLockedRotor(LockedRotorPlan* plan, core::SharedParameters* parameters) {
  if (!plan->resistance_identified) return;
  core::LeastSquaresProblem& problem = parameters->problem();
  const int r = parameters->Ensure({"resistance", plan->resistance_start_ohm, 0.0, kMinResistance_ohm, {}, false});
  // Vb ≥ 0: a contact drop cannot aid the current. (Heating that no temperature
  // explains would otherwise hide in a negative Vb instead of showing as drift.)
  const int vb = parameters->Ensure({"brush_drop", plan->estimate_brush_drop ? plan->brush_drop_start_V : 0.0,
                                     plan->brush_drop_scale_V, 0.0, {}, !plan->estimate_brush_drop});
  // The current sensor's zero reading: the joint fit adds it first (estimated where a log
  // shows the current at zero); on its own this test holds it at 0.
  const int zero = parameters->Ensure({model::kCurrentOffsetKey, 0.0, 1.0, {}, {}, true});
  if (!problem.Spec(zero).fixed) parameters->Use(model::kCurrentOffsetKey, kTest);
  parameters->Use("resistance", kTest);
  if (plan->estimate_brush_drop) parameters->Use("brush_drop", kTest);
  if (plan->measures_torque_constant) parameters->Use("torque_constant", kTest);
  int l = -1;
  if (!plan->step_logs.empty()) {
    parameters->Use("inductance", kTest);
    double inductance_start_H = 0.0;
    for (const auto& s : plan->step_logs) inductance_start_H += s.inductance_start_H / static_cast<double>(plan->step_logs.size());
    l = parameters->Ensure({"inductance", inductance_start_H, 0.0, kMinInductance_H, {}, false});
  }
  for (std::size_t k = 0; k < plan->plateau_logs.size(); ++k) {
    PlateauLog& pl = plan->plateau_logs[k];
    if (pl.plateaus.empty()) continue;
    // Starting σ: the spread of the plateau means expected from their sample noise.
    double sigma_V = 0.0;
    for (const auto& p : pl.plateaus)
      sigma_V = std::max(sigma_V, std::hypot(p.voltage_std_V, plan->resistance_start_ohm * p.current_std_A) /
                                      std::sqrt(static_cast<double>(p.samples)));
    pl.voltage_group = problem.AddGroup({pl.log->path + " plateau voltage", sigma_V > 0.0 ? sigma_V : 1.0});
    PlateauVoltageResidual residual;
    for (std::size_t j = 0; j < pl.plateaus.size(); ++j) {
      residual.mean_voltage_V.push_back(pl.plateaus[j].mean_voltage_V);
      residual.mean_current_A.push_back(pl.plateaus[j].mean_current_A);
      residual.temperature_factor.push_back(pl.factors[j]);
    }
    problem.AddResiduals(pl.voltage_group, {r, vb, zero}, static_cast<int>(pl.plateaus.size()), residual);
    if (!plan->measures_torque_constant || !pl.plateaus.front().has_torque) continue;
    PlateauTorqueResidual torque;
    double sigma_N_m = 0.0;
    for (const auto& p : pl.plateaus) {
      torque.mean_torque_N_m.push_back(p.mean_torque_N_m);
      torque.mean_current_A.push_back(p.mean_current_A);
      sigma_N_m = std::max(sigma_N_m, p.torque_std_N_m / std::sqrt(static_cast<double>(p.samples)));
    }
    const int kt = parameters->Ensure({"torque_constant", plan->torque_constant_start, 0.0, 0.0, {}, false});
    double torque_scale_N_m = 0.0;
    for (double t : torque.mean_torque_N_m) torque_scale_N_m = std::max(torque_scale_N_m, std::fabs(t));
    const int offset = parameters->Ensure({"torque_offset_" + std::to_string(k), 0.0,
                                           torque_scale_N_m > 0.0 ? torque_scale_N_m : 1.0, {}, {}, false});
    pl.torque_group = problem.AddGroup({pl.log->path + " plateau torque", sigma_N_m > 0.0 ? sigma_N_m : 1.0});
    problem.AddResiduals(pl.torque_group, {kt, offset}, static_cast<int>(pl.plateaus.size()), torque);
  }
  for (std::size_t s = 0; s < plan->step_logs.size(); ++s) {
    StepLog& sl = plan->step_logs[s];
    double peak_A = std::fabs(sl.initial_current_A);
    for (double i : sl.log->current_A) peak_A = std::max(peak_A, std::fabs(i));
    const int i0 = parameters->Ensure({"initial_current_" + std::to_string(s), sl.initial_current_A,
                                       peak_A > 0.0 ? peak_A : 1.0, {}, {}, false});
    core::GroupSpec spec{sl.log->path + " step current", sl.current_noise_A > 0.0 ? sl.current_noise_A : 1.0};
    const int n = static_cast<int>(sl.log->size());
    spec.input_noise = core::ProbedInputNoise(StepResidualOf(sl), &StepCurrentResidual::voltage_V,
                                              {r, l, vb, i0, zero}, n,
                                              {sl.voltage_noise_V, sl.voltage_noise_lag1});  // counted by input_noise.h
    sl.group = problem.AddGroup(spec);
    problem.AddResiduals(sl.group, {r, l, vb, i0, zero}, n, StepResidualOf(sl));
  }
}

std::vector<std::string> LockedRotorParameterNames(const LockedRotorPlan& plan) {
  std::vector<std::string> names;
  if (!plan.resistance_identified) return names;
  names.push_back("resistance");
  if (!plan.step_logs.empty()) names.push_back("inductance");
  if (plan.estimate_brush_drop) names.push_back("brush_drop");
  if (plan.measures_torque_constant) names.push_back("torque_constant");
  return names;
}

void ReportLockedRotor(const LockedRotorPlan& plan, const core::FitResult& fit, MotorEstimate* estimate) {
  if (!plan.resistance_identified) return;
  const auto channel = [&](int group, const char* name, const char* unit) {
    const core::GroupStatistics& g = fit.groups[group];
    return ChannelResidual{name, unit, g.rms, g.sigma, g.lag1_autocorrelation, g.num_residuals};
  };
  for (std::size_t k = 0; k < plan.plateau_logs.size(); ++k) {
    const PlateauLog& pl = plan.plateau_logs[k];
    TestSummary& summary = estimate->tests[plan.summary_index[k]];
    if (pl.voltage_group >= 0) summary.residuals.push_back(channel(pl.voltage_group, "voltage", "V"));
    if (pl.torque_group >= 0) summary.residuals.push_back(channel(pl.torque_group, "torque", "N*m"));
  }
  for (std::size_t s = 0; s < plan.step_logs.size(); ++s)
    estimate->tests[plan.summary_index[plan.plateau_logs.size() + s]].residuals.push_back(
        channel(plan.step_logs[s].group, "current", "A"));
  if (!fit.usable) {
    const std::string reason = "the fit did not give a usable solution: " + fit.message;
    for (const auto& key : LockedRotorParameterNames(plan)) estimate->not_identified.push_back({key, reason});
    if (plan.step_logs.empty()) estimate->not_identified.push_back({"inductance", "needs a locked-rotor step capture"});
    return;
  }
  const std::vector<std::string> tests = {kTest};
  QuantityEstimate resistance = core::ToQuantity(fit, "resistance", "R", "ohm", tests);
  if (plan.reference_degC) {
    resistance.at_temperature_degC = *plan.reference_degC;
    resistance.note = plan.reference_requested
                          ? "corrected to " + Format("%g", *plan.reference_degC) + " degC (copper, k = " +
                                Format("%g", units::kCopperTemperatureConstant_degC) + " degC, IEC 60028)"
                          : "at the mean test temperature, " + Format("%.1f", *plan.reference_degC) + " degC";
  } else {
    resistance.note = "at the (unrecorded) winding temperature of the test";
  }
  estimate->parameters.push_back(resistance);
  if (!plan.step_logs.empty()) {
    estimate->parameters.push_back(core::ToQuantity(fit, "inductance", "L", "H", tests));
  } else {
    estimate->not_identified.push_back(
        {"inductance", "needs a locked-rotor step capture that resolves the current rise (at least " +
                           Format("%.0f", kMinSamplesPerTimeConstant) +
                           " samples per L/R); the logs given are plateau logs"});
  }
  if (plan.estimate_brush_drop) {
    estimate->parameters.push_back(core::ToQuantity(fit, "brush_drop", "Vb", "V", tests));
  } else {
    estimate->not_identified.push_back(
        {"brush_drop", "needs locked-rotor plateaus at 2 or more current levels (3 levels at least); found " +
                           std::to_string(plan.level_count) + " settled levels at " +
                           std::to_string(plan.current_levels) +
                           " current magnitudes, so Vb was held at 0 V and R includes its effect"});
  }
  if (plan.measures_torque_constant) {
    QuantityEstimate kt = core::ToQuantity(fit, "torque_constant", "Kt", "N*m/A", tests);
    kt.basis = "measured";
    kt.note = "from the locked-rotor torque column";
    estimate->parameters.push_back(kt);
  }

  // Heating: R should not drift across plateaus once temperature is accounted for.
  for (std::size_t k = 0; k < plan.plateau_logs.size(); ++k) {
    const PlateauLog& pl = plan.plateau_logs[k];
    const int zero = fit.IndexOf(model::kCurrentOffsetKey);
    const double zero_A = zero >= 0 ? fit.parameters[static_cast<std::size_t>(zero)].value : 0.0;
    if (auto drift = DetectResistanceDrift(pl.plateaus, pl.factors, fit.Get("brush_drop").value, zero_A)) {
      const std::string text = pl.log->path + ": resistance " + (drift->relative_change > 0 ? "rose" : "fell") +
                               " by " + Format("%.1f", 100.0 * std::fabs(drift->relative_change)) +
                               " % from the first plateau to the last" +
                               (pl.plateaus.front().has_temperature ? " beyond what the logged temperature explains"
                                                                    : " (winding heating?)") +
                               "; use shorter pulses, let the winding cool between levels, or log its temperature";
      estimate->tests[plan.summary_index[k]].warnings.push_back(text);
      estimate->warnings.push_back(text);
    }
  }
}

MotorEstimate FitLockedRotor(const std::vector<const BenchLog*>& logs, const LockedRotorOptions& options) {
  MotorEstimate estimate;
  estimate.confidence = options.confidence;
  LockedRotorPlan plan = PlanLockedRotor(logs, options, &estimate);
  if (!plan.resistance_identified) return estimate;
  core::LeastSquaresProblem problem;
  core::SharedParameters parameters(&problem);
  AddLockedRotor(&plan, &parameters);
  core::SolveOptions solve;
  solve.confidence = options.confidence;
  solve.estimate_group_sigmas = true;
  solve.group_sigma_rounds = kGroupSigmaRounds;
  core::FitResult fit = problem.Solve(solve);
  AddVoltageNoiseCovariance(plan, parameters, &fit);
  estimate.solver.push_back(core::ToSolverSummary(fit));
  ReportLockedRotor(plan, fit, &estimate);
  if (fit.usable) core::CopyCovariance(fit, LockedRotorParameterNames(plan), &estimate);
  return estimate;
}

}  // namespace coilspin::locked_rotor
