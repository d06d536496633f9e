#include "fitters/locked_rotor/locked_rotor_fit.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

#include "fitters/core/estimate_from_fit.h"
#include "fitters/core/least_squares.h"
#include "fitters/locked_rotor/capture.h"
#include "fitters/locked_rotor/heating_drift.h"
#include "fitters/locked_rotor/initial_estimates.h"
#include "fitters/locked_rotor/plateau_residual.h"
#include "fitters/locked_rotor/step_residual.h"
#include "src/units/constants.h"
#include "src/model/copper_resistance.h"

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

std::string Format(const char* format, double value) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, format, value);
  return buffer;
}

struct PlateauLog {
  const BenchLog* log;
  std::vector<LockedPlateau> plateaus;
  std::vector<double> factors;  // f_j
};

struct StepLog {
  const BenchLog* log;
  CaptureClassification classification;
  double factor = 1.0;
  double current_noise_A = 0.0;
};

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
  if (!log.temperature_degC.empty())
    return std::accumulate(log.temperature_degC.begin(), log.temperature_degC.end(), 0.0) /
           static_cast<double>(log.temperature_degC.size());
  return options.winding_temperature_degC;
}

}  // namespace

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

MotorEstimate FitLockedRotor(const std::vector<const BenchLog*>& logs, const LockedRotorOptions& options) {
  MotorEstimate estimate;
  estimate.confidence = options.confidence;

  // 1. Sort the logs into plateau logs and step captures.
  std::vector<PlateauLog> plateau_logs;
  std::vector<StepLog> step_logs;
  for (const BenchLog* log : logs) {
    const CaptureClassification c = ClassifyCapture(*log);
    if (c.kind == CaptureKind::kStep) {
      step_logs.push_back({log, c, 1.0, NoiseFromDifferences(log->current_A)});
    } else {
      plateau_logs.push_back({log, FindLockedPlateaus(*log, options.plateaus), {}});
    }
  }

  // 2. Temperatures: θ_ref is the requested reference, else the mean test temperature.
  std::vector<double> known_temperatures;
  for (const auto& pl : plateau_logs)
    for (const auto& p : pl.plateaus)
      if (p.has_temperature) known_temperatures.push_back(p.temperature_degC);
  for (const auto& sl : step_logs)
    if (auto t = LogTemperature(*sl.log, options)) known_temperatures.push_back(*t);
  if (options.winding_temperature_degC) known_temperatures.push_back(*options.winding_temperature_degC);
  std::optional<double> reference_degC;
  if (!known_temperatures.empty()) {
    reference_degC = options.reference_temperature_degC
                         ? *options.reference_temperature_degC
                         : std::accumulate(known_temperatures.begin(), known_temperatures.end(), 0.0) /
                               static_cast<double>(known_temperatures.size());
  } else if (options.reference_temperature_degC) {
    estimate.warnings.push_back(
        "resistance not corrected to " + Format("%g", *options.reference_temperature_degC) +
        " degC: the winding temperature is unknown (give --winding-temperature or log a temperature column)");
  }
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
      estimate.warnings.push_back(log->path + ": no winding temperature (no temperature column, no "
                                  "--winding-temperature); taken as " + Format("%g", *reference_degC) + " degC");
  }

  // 3. What the data can determine.
  std::size_t plateau_count = 0;
  for (const auto& pl : plateau_logs) plateau_count += pl.plateaus.size();
  // Settled levels inside step captures count too: the sample-by-sample model
  // holds Vb·sgn(i) on every one of them (they are counted, not fitted twice).
  std::vector<PlateauLog> level_sources = plateau_logs;
  std::size_t level_count = plateau_count;
  for (const auto& sl : step_logs) {
    level_sources.push_back({sl.log, FindLockedPlateaus(*sl.log, options.plateaus), {}});
    level_count += level_sources.back().plateaus.size();
  }
  const int current_levels = DistinctCurrentLevels(level_sources);
  const bool estimate_brush_drop = level_count >= 3 && current_levels >= 2;
  const bool resistance_identified = !step_logs.empty() || plateau_count >= (estimate_brush_drop ? 3u : 2u);
  for (const auto& pl : plateau_logs) {
    TestSummary summary{kTest, pl.log->path, static_cast<long>(pl.log->size()),
                        "plateaus: " + std::to_string(pl.plateaus.size()) + " settled levels with current", {}, {}};
    estimate.tests.push_back(summary);
  }
  for (const auto& sl : step_logs) {
    TestSummary summary{kTest, sl.log->path, static_cast<long>(sl.log->size()),
                        "step capture: current rise resolved by " + Format("%.0f", sl.classification.rise_samples) +
                            " samples per time constant; fitted sample by sample with the logged voltage as input",
                        {}, {}};
    estimate.tests.push_back(summary);
  }
  if (!resistance_identified) {
    estimate.not_identified.push_back(
        {"resistance", "needs at least 2 settled locked-rotor plateaus with current, or a step capture; found " +
                           std::to_string(plateau_count)});
    estimate.not_identified.push_back({"inductance", "needs a locked-rotor step capture"});
    estimate.not_identified.push_back({"brush_drop", "needs locked-rotor plateaus at 2 or more current levels"});
    return estimate;
  }

  // 4. Starting point: closed form.
  std::vector<LockedPlateau> all_plateaus;
  std::vector<double> all_factors;
  for (const auto& pl : plateau_logs) {
    all_plateaus.insert(all_plateaus.end(), pl.plateaus.begin(), pl.plateaus.end());
    all_factors.insert(all_factors.end(), pl.factors.begin(), pl.factors.end());
  }
  std::optional<PlateauLine> line = FitPlateauLine(all_plateaus, all_factors, estimate_brush_drop);
  const double brush_drop_start_V = line ? std::max(0.0, line->brush_drop_V) : 0.0;
  std::vector<StepStart> step_starts;
  for (const auto& sl : step_logs) {
    auto start = EstimateStepStart(*sl.log, brush_drop_start_V,
                                   line ? std::optional<double>(line->resistance_ohm * sl.factor) : std::nullopt);
    if (!start) {
      estimate.not_identified.push_back({"inductance", "the step capture " + sl.log->path +
                                                           " gives no usable current rise (no starting estimate)"});
      return estimate;
    }
    step_starts.push_back(*start);
  }
  const double resistance_start_ohm = line ? line->resistance_ohm : step_starts.front().resistance_ohm / step_logs.front().factor;

  // 5. One problem, R and Vb shared by every log.
  core::LeastSquaresProblem problem;
  const int r = problem.AddParameter({"resistance", resistance_start_ohm, 0.0, kMinResistance_ohm, {}, false});
  // Vb's scale is R·|i| of a typical plateau, since Vb may start at 0.
  double typical_current_A = 0.0;
  for (const auto& p : all_plateaus) typical_current_A = std::max(typical_current_A, std::fabs(p.mean_current_A));
  const double brush_drop_scale_V = std::max(brush_drop_start_V, resistance_start_ohm * typical_current_A);
  const int vb = problem.AddParameter({"brush_drop", estimate_brush_drop ? brush_drop_start_V : 0.0,
                                       brush_drop_scale_V > 0.0 ? brush_drop_scale_V : 1.0, 0.0, {},
                                       !estimate_brush_drop});
  int l = -1;
  if (!step_logs.empty()) {
    double inductance_start_H = 0.0;
    for (const auto& s : step_starts) inductance_start_H += s.inductance_H / static_cast<double>(step_starts.size());
    l = problem.AddParameter({"inductance", inductance_start_H, 0.0, kMinInductance_H, {}, false});
  }
  std::vector<int> groups;
  for (const auto& pl : plateau_logs) {
    if (pl.plateaus.empty()) {
      groups.push_back(-1);
      continue;
    }
    // Starting σ: the spread of the plateau means expected from their sample noise.
    double sigma_V = 0.0;
    for (const auto& p : pl.plateaus)
      sigma_V = std::max(sigma_V, std::hypot(p.voltage_std_V, resistance_start_ohm * p.current_std_A) /
                                      std::sqrt(static_cast<double>(p.samples)));
    const int g = problem.AddGroup({pl.log->path + " plateau voltage", sigma_V > 0.0 ? sigma_V : 1.0});
    PlateauVoltageResidual residual;
    for (std::size_t j = 0; j < pl.plateaus.size(); ++j) {
      residual.mean_voltage_V.push_back(pl.plateaus[j].mean_voltage_V);
      residual.mean_current_A.push_back(pl.plateaus[j].mean_current_A);
      residual.temperature_factor.push_back(pl.factors[j]);
    }
    problem.AddResiduals(g, {r, vb}, static_cast<int>(pl.plateaus.size()), residual);
    groups.push_back(g);
  }
  for (std::size_t s = 0; s < step_logs.size(); ++s) {
    const StepLog& sl = step_logs[s];
    const double i0_scale_A = std::max(std::fabs(step_starts[s].initial_current_A),
                                       std::fabs(*std::max_element(sl.log->current_A.begin(), sl.log->current_A.end(),
                                                                   [](double a, double b) { return std::fabs(a) < std::fabs(b); })));
    const int i0 = problem.AddParameter({"initial_current_" + std::to_string(s), step_starts[s].initial_current_A,
                                         i0_scale_A > 0.0 ? i0_scale_A : 1.0, {}, {}, false});
    const int g = problem.AddGroup({sl.log->path + " step current", sl.current_noise_A > 0.0 ? sl.current_noise_A : 1.0});
    problem.AddResiduals(g, {r, l, vb, i0}, static_cast<int>(sl.log->size()),
                         StepCurrentResidual{&sl.log->time_s, &sl.log->voltage_V, &sl.log->current_A, sl.factor});
    groups.push_back(g);
  }

  core::SolveOptions solve;
  solve.confidence = options.confidence;
  solve.estimate_group_sigmas = true;
  solve.group_sigma_rounds = kGroupSigmaRounds;
  const core::FitResult fit = problem.Solve(solve);
  estimate.solver.push_back(core::ToSolverSummary(fit));

  // 6. Report.
  std::size_t summary_index = 0;
  for (std::size_t k = 0; k < groups.size(); ++k, ++summary_index) {
    if (groups[k] < 0) continue;
    const core::GroupStatistics& g = fit.groups[groups[k]];
    const bool plateau_group = k < plateau_logs.size();
    estimate.tests[summary_index].residuals.push_back(
        {plateau_group ? "voltage" : "current", plateau_group ? "V" : "A", g.rms, g.sigma, g.lag1_autocorrelation,
         g.num_residuals});
  }
  if (!fit.usable) {
    std::string reason = "the locked-rotor fit did not give a usable solution: " + fit.message;
    for (const char* key : {"resistance", "inductance", "brush_drop"}) {
      if (std::string(key) == "inductance" && l < 0) continue;
      estimate.not_identified.push_back({key, reason});
    }
    if (l < 0) estimate.not_identified.push_back({"inductance", "needs a locked-rotor step capture"});
    return estimate;
  }
  std::vector<std::string> tests = {kTest};
  QuantityEstimate resistance = core::ToQuantity(fit, "resistance", "R", "ohm", tests);
  if (reference_degC) {
    resistance.at_temperature_degC = *reference_degC;
    resistance.note = options.reference_temperature_degC
                          ? "corrected to " + Format("%g", *reference_degC) + " degC (copper, k = " +
                                Format("%g", units::kCopperTemperatureConstant_degC) + " degC, IEC 60028)"
                          : "at the mean test temperature, " + Format("%.1f", *reference_degC) + " degC";
  } else {
    resistance.note = "at the (unrecorded) winding temperature of the test";
  }
  estimate.parameters.push_back(resistance);
  std::vector<std::string> covariance_names = {"resistance"};
  if (l >= 0) {
    estimate.parameters.push_back(core::ToQuantity(fit, "inductance", "L", "H", tests));
    covariance_names.push_back("inductance");
  } else {
    estimate.not_identified.push_back(
        {"inductance", plateau_logs.empty()
                           ? "needs a locked-rotor step capture"
                           : "needs a locked-rotor step capture that resolves the current rise (at least " +
                                 Format("%.0f", kMinSamplesPerTimeConstant) +
                                 " samples per L/R); the logs given are plateau logs"});
  }
  if (estimate_brush_drop) {
    estimate.parameters.push_back(core::ToQuantity(fit, "brush_drop", "Vb", "V", tests));
    covariance_names.push_back("brush_drop");
  } else {
    estimate.not_identified.push_back(
        {"brush_drop", "needs locked-rotor plateaus at 2 or more current levels (3 plateaus at least); found " +
                           std::to_string(level_count) + " settled levels at " + std::to_string(current_levels) +
                           " levels, so Vb was held at 0 V and R includes its effect"});
  }
  core::CopyCovariance(fit, covariance_names, &estimate);

  // 7. Heating: R should not drift across plateaus once temperature is accounted for.
  for (std::size_t k = 0; k < plateau_logs.size(); ++k) {
    const PlateauLog& pl = plateau_logs[k];
    if (auto drift = DetectResistanceDrift(pl.plateaus, pl.factors, fit.Get("brush_drop").value)) {
      const std::string text = pl.log->path + ": resistance " + (drift->relative_change > 0 ? "rose" : "fell") +
                               " by " + Format("%.1f", 100.0 * std::fabs(drift->relative_change)) +
                               " % from the first plateau to the last" +
                               (pl.plateaus.front().has_temperature ? " beyond what the logged temperature explains"
                                                                    : " (winding heating?)") +
                               "; use shorter pulses, let the winding cool between levels, or log its temperature";
      estimate.tests[k].warnings.push_back(text);
      estimate.warnings.push_back(text);
    }
  }
  return estimate;
}

}  // namespace coilspin::locked_rotor
