#include "fitters/step/step_fit.h"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "src/ingest/encoder_speed.h"
#include "src/ingest/noise_level.h"
#include "src/ingest/segmentation.h"
#include "src/ingest/whole_count_step.h"
#include "src/ingest/small_text_and_statistics.h"
#include "src/model/copper_resistance.h"
#include "src/model/sensor_offsets.h"
#include "src/units/constants.h"

namespace coilspin::step {
namespace {

constexpr const char* kTest = "step";
// Rest bands: |v| and |i| within this many noise σ of zero count as "at rest" (as for
// the locked-rotor step capture; a Gaussian exceeds 5 σ about once in 3.5 million samples).
constexpr double kRestBandSigmas = 5.0;
// A log starts turning when its first samples' speed exceeds this many noise σ.
constexpr double kTurningSigmas = 5.0;
// The first samples that tell whether the log starts at rest.
constexpr std::size_t kLeadingSamples = 10;
// Positive lower bounds that keep R, L and J away from the divisions by zero of the model.
constexpr double kMinResistance_ohm = 1e-9;
constexpr double kMinInductance_H = 1e-12;
constexpr double kMinInertia_kg_m2 = 1e-15;
// L is resolved when the electrical time constant spans at least this many samples
// (the rule of the locked-rotor step capture, fitters/locked_rotor/capture.h); measured
// on 40 simulated steps at 10 samples per L/R, L's 95 % interval held the truth 37 times
// (tests/step/step_coverage_test.cc runs the check at 10).
constexpr double kMinSamplesPerTimeConstant = 10.0;
// A change of the logged voltage between two samples above this fraction of its range is a
// switched edge (held until the sample that shows it), not a sampled continuous change: a
// supply sags by a few per cent of the step over a sample interval at most (common practice).
constexpr double kJumpFraction = 0.25;
// Share of the starting friction at the top speed given to B·ω (the rest to Tc); the
// fit moves it, the start only needs both positive (common practice: Coulomb friction
// dominates a small PM motor's no-load loss).
constexpr double kViscousStartShare = 0.2;
// Uniform quantisation of step q has σ = q/√12 (statistics handbook: variance of a uniform distribution).
const double kUniformSigmaPerStep = 1.0 / std::sqrt(12.0);

double Leading(const std::vector<double>& x) {
  return Median(std::vector<double>(x.begin(), x.begin() + static_cast<std::ptrdiff_t>(std::min(kLeadingSamples, x.size()))));
}

double MedianInterval(const std::vector<double>& t) {
  std::vector<double> d;
  for (std::size_t k = 1; k < t.size(); ++k) d.push_back(t[k] - t[k - 1]);
  return d.empty() ? 0.0 : Median(d);
}

double PeakMagnitude(const std::vector<double>& x) {
  double peak = 0.0;
  for (double value : x) peak = std::max(peak, std::fabs(value));
  return peak;
}

std::optional<double> LogTemperature(const BenchLog& log, const StepTemperatures& temperatures) {
  if (auto logged = MeanLoggedTemperature(log)) return logged;
  return temperatures.winding_degC;
}

}  // namespace

StepResidual StepLog::Residual(StepChannel channel) const {
  const std::vector<double>* measured = channel == StepChannel::kCurrent  ? &log->current_A
                                        : channel == StepChannel::kSpeed ? &log->speed_rad_s
                                                                          : &log->position_rad;
  StepResidual r{&log->time_s, &log->voltage_V, measured, channel, torque_constant_is_back_emf, temperature_factor, {},
                 jump_V};
  r.rest.voltage_V = kRestBandSigmas * voltage_noise_V;
  r.rest.current_A = kRestBandSigmas * current_noise_A;
  return r;
}

StepTestPlan PlanStep(const std::vector<const BenchLog*>& logs, std::optional<double> position_step_rad,
                      const StepTemperatures& temperatures, double brush_drop_start_V, MotorEstimate* estimate) {
  StepTestPlan plan;
  std::vector<double> r, l, ke, a, b, c;
  for (const BenchLog* log : logs) {
    plan.summary_index.push_back(estimate->tests.size());
    estimate->tests.push_back({kTest, log->path, static_cast<long>(log->size()), "", {}, {}, {}, {}});
    TestSummary& summary = estimate->tests.back();
    StepLog s;
    s.log = log;
    s.summary = plan.summary_index.back();
    s.fit_position = log->speed_rad_s.empty();
    std::string speed_method = "logged speed fitted";
    if (s.fit_position) {
      SpeedFromPositionOptions differentiation;
      if (position_step_rad) differentiation.counts_per_rev = units::kRadiansPerRevolution / *position_step_rad;
      DerivedSpeed derived = SpeedFromPosition(log->time_s, log->position_rad, differentiation);
      s.speed_rad_s = std::move(derived.speed_rad_s);
      s.motion_noise = position_step_rad ? *position_step_rad * kUniformSigmaPerStep : derived.position_sigma_rad;
      // Given counts per revolution, or whole counts found in the readings (whole_count_step.h).
      s.count_rad = position_step_rad ? *position_step_rad : WholeCountStep(log->position_rad).value_or(0.0);
      speed_method = "encoder position fitted directly (quantisation is the noise)";
    } else {
      s.speed_rad_s = log->speed_rad_s;
      s.motion_noise = NoiseFromDifferences(log->speed_rad_s);
    }
    const double speed_noise = s.fit_position ? NoiseFromDifferences(s.speed_rad_s) : s.motion_noise;
    s.current_noise_A = NoiseFromDifferences(log->current_A);
    const ChannelNoise voltage_noise = EstimateChannelNoise(log->voltage_V);
    s.voltage_noise_V = voltage_noise.sigma;
    s.voltage_noise_lag1 = voltage_noise.lag1;
    const auto [low_V, high_V] = std::minmax_element(log->voltage_V.begin(), log->voltage_V.end());
    s.jump_V = kJumpFraction * (*high_V - *low_V);
    s.from_rest = std::fabs(Leading(s.speed_rad_s)) <= kTurningSigmas * speed_noise;
    const std::optional<double> theta_degC = LogTemperature(*log, temperatures);
    if (temperatures.reference_degC && theta_degC)
      s.temperature_factor = model::CopperResistanceAt(1.0, *temperatures.reference_degC, *theta_degC);

    StepSignals signals;
    signals.time_s = &log->time_s;
    signals.voltage_V = &log->voltage_V;
    signals.current_A = &log->current_A;
    signals.speed_rad_s = &s.speed_rad_s;
    signals.position_rad = s.fit_position ? &log->position_rad : nullptr;
    signals.brush_drop_V = brush_drop_start_V;
    signals.speed_noise_rad_s = speed_noise;
    std::string why;
    const std::optional<EquationErrorStart> start = EstimateStepStart(signals, &why);
    if (!start) {
      const std::string text = log->path + ": not used: " + why;
      summary.warnings.push_back(text);
      estimate->warnings.push_back(text);
      summary.method = "not used: " + why;
      continue;
    }
    s.start = *start;
    r.push_back(start->resistance_ohm / s.temperature_factor);
    l.push_back(start->inductance_H);
    ke.push_back(start->back_emf);
    a.push_back(start->torque_over_inertia);
    b.push_back(start->viscous_over_inertia);
    c.push_back(start->coulomb_over_inertia);
    summary.method = std::string(s.from_rest ? "step from rest" : "step between two levels (starts turning)") +
                     "; output error with the logged voltage as input; current and " + speed_method;
    plan.logs.push_back(std::move(s));
  }
  plan.usable = !plan.logs.empty();
  if (!plan.usable) return plan;
  plan.resistance_start_ohm = Median(r);
  plan.inductance_start_H = Median(l);
  plan.back_emf_start = Median(ke);
  plan.torque_over_inertia_start = Median(a);
  // The start carries all friction in c (b = 0, equation_error.h): give a share of it
  // to B at the top speed so that both start positive with the same friction there.
  const double top_speed = PeakMagnitude(plan.logs.front().speed_rad_s);
  const double friction = std::max(Median(c), 0.0) + Median(b) * top_speed;  // b·ω + c at the top speed
  const double duration_s = plan.logs.front().log->time_s.back() - plan.logs.front().log->time_s.front();
  const double total = friction > 0.0 ? friction : top_speed / duration_s;
  plan.viscous_over_inertia_start = kViscousStartShare * total / top_speed;
  plan.coulomb_over_inertia_start = (1.0 - kViscousStartShare) * total;
  return plan;
}

double InertiaStart(const StepTestPlan& plan, double torque_constant) {
  return torque_constant / plan.torque_over_inertia_start;  // J = Kt/(Kt/J)
}

void AddStep(StepTestPlan* plan, const std::string& torque_constant_name, double inertia_start_kg_m2,
             bool inertia_known, core::SharedParameters* parameters) {
  if (!plan->usable) return;
  core::LeastSquaresProblem& problem = parameters->problem();
  const bool tied = torque_constant_name == "back_emf_constant";
  std::vector<int> shared;
  shared.push_back(parameters->Ensure({"resistance", plan->resistance_start_ohm, 0.0, kMinResistance_ohm, {}, false}));
  shared.push_back(parameters->Ensure({"inductance", plan->inductance_start_H, 0.0, kMinInductance_H, {}, false}));
  shared.push_back(parameters->Ensure({"back_emf_constant", plan->back_emf_start, 0.0, 0.0, {}, false}));
  if (!tied) shared.push_back(parameters->Ensure({torque_constant_name, plan->back_emf_start, 0.0, 0.0, {}, false}));
  const double j0 = inertia_start_kg_m2 > 0.0 ? inertia_start_kg_m2 : InertiaStart(*plan, plan->back_emf_start);
  shared.push_back(parameters->Ensure({"inertia", j0, 0.0, kMinInertia_kg_m2, {}, inertia_known}));
  // Scales: B·ω and Tc are both of the order of the friction torque at the top speed.
  const double top_speed = PeakMagnitude(plan->logs.front().speed_rad_s);
  const double torque_scale = j0 * (plan->viscous_over_inertia_start * top_speed + plan->coulomb_over_inertia_start);
  shared.push_back(parameters->Ensure(
      {"viscous_friction", plan->viscous_over_inertia_start * j0, torque_scale / top_speed, 0.0, {}, false}));
  shared.push_back(
      parameters->Ensure({"coulomb_friction", plan->coulomb_over_inertia_start * j0, torque_scale, 0.0, {}, false}));
  shared.push_back(parameters->Ensure({"brush_drop", 0.0, 1.0, 0.0, {}, true}));
  for (const char* key : {"resistance", "inductance", "back_emf_constant", "inertia", "viscous_friction",
                          "coulomb_friction", "brush_drop"})
    parameters->Use(key, kTest);
  // The current sensor's zero reading (src/model/sensor_offsets.h): added first by the joint fit.
  const int zero = parameters->Ensure({model::kCurrentOffsetKey, 0.0, 1.0, {}, {}, true});
  if (!problem.Spec(zero).fixed) parameters->Use(model::kCurrentOffsetKey, kTest);
  if (!tied) parameters->Use(torque_constant_name, kTest);

  for (std::size_t k = 0; k < plan->logs.size(); ++k) {
    StepLog& s = plan->logs[k];
    const std::string tag = std::to_string(k);
    const BenchLog& log = *s.log;
    const int n = static_cast<int>(log.size());
    const double peak_A = PeakMagnitude(log.current_A);
    const double peak_speed = PeakMagnitude(s.speed_rad_s);
    std::vector<int> state = {
        parameters->Ensure({"step_initial_current_" + tag, log.current_A.front(), peak_A > 0.0 ? peak_A : 1.0, {}, {}, false}),
        parameters->Ensure({"step_initial_speed_" + tag, s.from_rest ? 0.0 : Leading(s.speed_rad_s),
                            peak_speed > 0.0 ? peak_speed : 1.0, {}, {}, s.from_rest})};
    s.torque_constant_is_back_emf = tied;
    std::vector<int> shared_and_state = shared;
    shared_and_state.insert(shared_and_state.end(), state.begin(), state.end());
    s.current_parameters = shared_and_state;
    s.current_parameters.push_back(zero);
    // The logged voltage's noise in each channel is counted by input_noise.h.
    core::GroupSpec current_spec{log.path + " step current", s.current_noise_A > 0.0 ? s.current_noise_A : 1.0};
    current_spec.input_noise = core::ProbedInputNoise(s.Residual(StepChannel::kCurrent), &StepResidual::voltage_V,
                                                      s.current_parameters, n, {s.voltage_noise_V, s.voltage_noise_lag1});
    s.current_group = problem.AddGroup(current_spec);
    problem.AddResiduals(s.current_group, s.current_parameters, n, s.Residual(StepChannel::kCurrent));
    s.motion_parameters = shared_and_state;
    if (s.fit_position) {
      const double theta0 = log.position_rad.front();
      s.motion_parameters.push_back(
          parameters->Ensure({"step_initial_angle_" + tag, theta0, std::max(std::fabs(theta0), 1.0), {}, {}, false}));
    }
    core::GroupSpec motion_spec{log.path + (s.fit_position ? " step position" : " step speed"),
                                s.motion_noise > 0.0 ? s.motion_noise : 1.0};
    if (s.fit_position && s.count_rad > 0.0) {  // the encoder's error counted exactly (core/quantisation.h)
      motion_spec.quantisation_step = s.count_rad;
      motion_spec.modelled_reading = core::ModelledReadingOf(s.Residual(StepChannel::kPosition), s.motion_parameters,
                                                             &log.position_rad);
    }
    motion_spec.input_noise = core::ProbedInputNoise(s.Residual(s.MotionChannel()), &StepResidual::voltage_V,
                                                     s.motion_parameters, n, {s.voltage_noise_V, s.voltage_noise_lag1});
    s.motion_group = problem.AddGroup(motion_spec);
    problem.AddResiduals(s.motion_group, s.motion_parameters, n, s.Residual(s.MotionChannel()));
  }
}

void ReportStep(const StepTestPlan& plan, const core::FitResult& fit, MotorEstimate* estimate) {
  for (const StepLog& s : plan.logs) {
    TestSummary& summary = estimate->tests[s.summary];
    const auto add = [&](int group, const char* channel, const char* unit) {
      if (group < 0) return;
      const core::GroupStatistics& g = fit.groups[group];
      summary.residuals.push_back({channel, unit, g.rms, g.sigma, g.lag1_autocorrelation, g.num_residuals});
    };
    add(s.current_group, "current", "A");
    add(s.motion_group, s.fit_position ? "position" : "speed", s.fit_position ? "rad" : "rad/s");
    if (!fit.usable) continue;
    const double tau_s = fit.Get("inductance").value / (fit.Get("resistance").value * s.temperature_factor);
    const double interval_s = MedianInterval(s.log->time_s);
    if (tau_s < kMinSamplesPerTimeConstant * interval_s) {
      const std::string text = s.log->path + ": the electrical time constant L/R = " + Format("%.3g", tau_s) +
                               " s spans only " + Format("%.1f", tau_s / interval_s) +
                               " samples; L and the current's rise are poorly resolved (log at least " +
                               Format("%g", kMinSamplesPerTimeConstant) + " samples per L/R)";
      summary.warnings.push_back(text);
      estimate->warnings.push_back(text);
    }
  }
}

}  // namespace coilspin::step
