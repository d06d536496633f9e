#include "fitters/spin_down/spin_down_fit.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>

#include "src/ingest/whole_count_step.h"
#include "src/ingest/coast_segmentation.h"
#include "src/ingest/segmentation.h"
#include "src/ingest/encoder_speed.h"
#include "src/units/constants.h"
#include "src/model/sensor_offsets.h"
#include "src/ingest/small_text_and_statistics.h"

namespace coilspin::spin_down {
namespace {

constexpr const char* kTest = "spin-down";
// A coast needs this many samples between power-off and rest to fit ω₀, b, c with a margin.
// After power off the current is read as zero from this many samples on: opening
// the circuit ends it within a sample, and one more keeps the switching edge out
// (common practice).
constexpr std::size_t kZeroCurrentSettleSamples = 2;
// Uniform quantisation of step q has σ = q/√12 (statistics handbook: variance of a uniform distribution).
const double kUniformSigmaPerStep = 1.0 / std::sqrt(12.0);

// Closed-form start: dω/dt = −b·ω − c over the coast, by least squares on
// central differences of the speed (derived from position when needed).
bool StartRatios(const std::vector<double>& time_s, const std::vector<double>& speed_rad_s, double* b, double* c) {
  const std::size_t n = time_s.size();
  if (n < 3) return false;
  Eigen::MatrixXd x(n - 2, 2);
  Eigen::VectorXd y(n - 2);
  for (std::size_t k = 1; k + 1 < n; ++k) {
    x(k - 1, 0) = -speed_rad_s[k];
    x(k - 1, 1) = -1.0;
    y(k - 1) = (speed_rad_s[k + 1] - speed_rad_s[k - 1]) / (time_s[k + 1] - time_s[k - 1]);
  }
  const Eigen::VectorXd solution = x.colPivHouseholderQr().solve(y);
  // Negative values are noise around a term that is absent: start it small and positive.
  const double scale = speed_rad_s.front() / (time_s.back() - time_s.front());
  *b = solution(0) > 0.0 ? solution(0) : 1.0 / (time_s.back() - time_s.front());
  *c = solution(1) > 0.0 ? solution(1) : 1e-3 * scale;
  return true;
}

}  // namespace

SpinDownPlan PlanSpinDown(const std::vector<const BenchLog*>& logs, std::optional<double> position_step_rad,
                          MotorEstimate* estimate) {
  SpinDownPlan plan;
  std::vector<double> all_b, all_c;
  for (const BenchLog* log : logs) {
    plan.summary_index.push_back(estimate->tests.size());
    estimate->tests.push_back({kTest, log->path, static_cast<long>(log->size()), "", {}, {}, {}, {}});
    TestSummary& summary = estimate->tests.back();
    const auto warn = [&](const std::string& text) {
      summary.warnings.push_back(log->path + ": " + text);
      estimate->warnings.push_back(log->path + ": " + text);
    };
    const bool fit_position = log->speed_rad_s.empty();
    std::vector<double> speed;  // for segmentation, start values and the direction
    std::optional<CoastSegment> segment;
    NoCoast why;
    if (fit_position) {
      SpeedFromPositionOptions differentiation;
      if (position_step_rad) differentiation.counts_per_rev = units::kRadiansPerRevolution / *position_step_rad;
      DerivedSpeed derived = SpeedFromPosition(log->time_s, log->position_rad, differentiation);
      speed = std::move(derived.speed_rad_s);
      segment = FindCoast(*log, speed, derived.noise_sigma_rad_s, &why);
    } else {
      speed = log->speed_rad_s;
      segment = FindCoast(*log, &why);
    }
    if (segment && segment->rest <= segment->power_off + kMinCoastSamples)
      why = {NoCoastRule::kCoastTooShort, segment->rest - segment->power_off, kMinCoastSamples + 1, 0.0, 0.0};
    if (!segment || segment->rest <= segment->power_off + kMinCoastSamples) {
      warn(NoCoastText(why));
      summary.method = "not used: no coast found";
      continue;
    }
    CoastLog c;
    c.log = log;
    c.summary = plan.summary_index.back();
    c.power_off = segment->power_off;
    c.rest = segment->rest;
    c.direction = segment->direction;
    const double t0 = log->time_s[c.power_off];
    std::vector<double> coast_speed;
    for (std::size_t k = c.power_off; k < c.rest; ++k) {
      c.time_s.push_back(log->time_s[k] - t0);
      coast_speed.push_back(c.direction * speed[k]);
      if (fit_position) c.position_rad.push_back(c.direction * log->position_rad[k]);
      else c.speed_rad_s.push_back(c.direction * log->speed_rad_s[k]);
      if (!log->voltage_V.empty()) c.voltage_V.push_back(c.direction * log->voltage_V[k]);
    }
    c.speed_start_rad_s = coast_speed.front();
    if (fit_position) {
      c.position_start_rad = c.position_rad.front();
      c.position_sigma_rad = position_step_rad.value_or(0.0) * kUniformSigmaPerStep;
      // Given counts per revolution, or whole counts found in the readings (whole_count_step.h).
      c.count_rad = position_step_rad ? *position_step_rad : WholeCountStep(c.position_rad).value_or(0.0);
    }
    double b = 0.0, cc = 0.0;
    if (!StartRatios(c.time_s, coast_speed, &b, &cc)) continue;
    all_b.push_back(b);
    all_c.push_back(cc);
    summary.method = "coast from sample " + std::to_string(c.power_off + 1) + " (" + segment->how + ") to " +
                     (segment->reached_rest ? "rest" : "the end of the log") + "; " +
                     (fit_position ? "encoder position fitted directly (quantisation is the noise)"
                                   : "logged speed fitted") +
                     (c.voltage_V.empty() ? "" : "; terminal voltage fitted as back-EMF");
    const CoastWarnings coast_warnings = CheckCoast(*log, speed, *segment);
    for (const auto& message : coast_warnings.messages) warn(message);
    if (!log->current_A.empty() && !coast_warnings.current_flows && c.power_off + kZeroCurrentSettleSamples < log->size())
      c.zero_current_A.assign(log->current_A.begin() + static_cast<std::ptrdiff_t>(c.power_off + kZeroCurrentSettleSamples),
                              log->current_A.end());
    if (!c.voltage_V.empty() && !plan.measures_back_emf && c.speed_start_rad_s > 0.0)
      plan.back_emf_start = c.voltage_V.front() / c.speed_start_rad_s;  // v = Ke·ω at power-off
    plan.measures_back_emf = plan.measures_back_emf || !c.voltage_V.empty();
    plan.logs.push_back(std::move(c));
  }
  plan.usable = !plan.logs.empty();
  std::vector<double> zero_readings;
  for (const auto& c : plan.logs) zero_readings.insert(zero_readings.end(), c.zero_current_A.begin(), c.zero_current_A.end());
  plan.shows_current_at_zero = !zero_readings.empty();
  if (plan.shows_current_at_zero) plan.zero_current_start_A = Median(std::move(zero_readings));
  if (plan.usable) {
    std::sort(all_b.begin(), all_b.end());
    std::sort(all_c.begin(), all_c.end());
    plan.viscous_over_inertia_start = all_b[all_b.size() / 2];
    plan.coulomb_over_inertia_start = all_c[all_c.size() / 2];
  }
  return plan;
}

void AddSpinDown(SpinDownPlan* plan, Mechanics mechanics, double inertia_start_kg_m2, bool inertia_known,
                 core::SharedParameters* parameters) {
  if (!plan->usable) return;
  core::LeastSquaresProblem& problem = parameters->problem();
  std::vector<int> friction;
  const double b0 = plan->viscous_over_inertia_start, c0 = plan->coulomb_over_inertia_start;
  if (mechanics == Mechanics::kRatios) {
    friction.push_back(parameters->Ensure({"viscous_over_inertia", b0, 0.0, 0.0, {}, false}));
    friction.push_back(parameters->Ensure({"coulomb_over_inertia", c0, 0.0, 0.0, {}, false}));
    parameters->Use("viscous_over_inertia", kTest);
    parameters->Use("coulomb_over_inertia", kTest);
  } else {
    const double j0 = inertia_start_kg_m2;
    friction.push_back(parameters->Ensure({"viscous_friction", b0 * j0, 0.0, 0.0, {}, false}));
    friction.push_back(parameters->Ensure({"coulomb_friction", c0 * j0, 0.0, 0.0, {}, false}));
    friction.push_back(parameters->Ensure({"inertia", j0, 0.0, 0.0, {}, inertia_known}));
    for (const char* key : {"viscous_friction", "coulomb_friction", "inertia"}) parameters->Use(key, kTest);
  }
  // The current sensor's zero reading (src/model/sensor_offsets.h): added first by the joint fit.
  const int zero = parameters->Ensure({model::kCurrentOffsetKey, 0.0, 1.0, {}, {}, true});
  const bool zero_estimated = !problem.Spec(zero).fixed;
  for (std::size_t k = 0; k < plan->logs.size(); ++k) {
    CoastLog& c = plan->logs[k];
    const std::string tag = std::to_string(k);
    if (zero_estimated && !c.zero_current_A.empty()) {
      parameters->Use(model::kCurrentOffsetKey, kTest);
      const double sigma = NoiseFromDifferences(c.zero_current_A);
      c.zero_current_group = problem.AddGroup({c.log->path + " coast current at zero", sigma > 0.0 ? sigma : 1.0});
      problem.AddResiduals(c.zero_current_group, {zero}, static_cast<int>(c.zero_current_A.size()),
                           ZeroReadingResidual{c.zero_current_A});
    }
    const double speed_scale = std::max(std::fabs(c.speed_start_rad_s), 1.0);
    const int w0 = parameters->Ensure({"coast_speed_" + tag, c.speed_start_rad_s, speed_scale, 0.0, {}, false});
    std::vector<int> motion = {w0};
    motion.insert(motion.end(), friction.begin(), friction.end());
    const int n = static_cast<int>(c.time_s.size());
    if (!c.position_rad.empty()) {
      const int theta0 = parameters->Ensure({"coast_angle_" + tag, c.position_start_rad,
                                             std::max(std::fabs(c.position_start_rad), 1.0), {}, {}, false});
      motion.insert(motion.begin(), theta0);
      const double sigma = c.position_sigma_rad > 0.0 ? c.position_sigma_rad : NoiseFromDifferences(c.position_rad);
      core::GroupSpec position_spec{c.log->path + " coast position", sigma > 0.0 ? sigma : 1.0};
      const CoastPositionResidual residual{c.time_s, c.position_rad, mechanics};
      if (c.count_rad > 0.0) {  // the encoder's error counted exactly (core/quantisation.h)
        position_spec.quantisation_step = c.count_rad;
        position_spec.modelled_reading = core::ModelledReadingOf(residual, motion, &c.position_rad);
      }
      c.motion_group = problem.AddGroup(position_spec);
      problem.AddResiduals(c.motion_group, motion, n, residual);
    } else {
      const double sigma = NoiseFromDifferences(c.speed_rad_s);
      c.motion_group = problem.AddGroup({c.log->path + " coast speed", sigma > 0.0 ? sigma : 1.0});
      problem.AddResiduals(c.motion_group, motion, n, CoastSpeedResidual{c.time_s, c.speed_rad_s, mechanics});
    }
    if (!c.voltage_V.empty()) {
      const double ke0 = c.voltage_V.front() / c.speed_start_rad_s;
      const int ke = parameters->Ensure({"back_emf_constant", ke0, 0.0, 0.0, {}, false});
      parameters->Use("back_emf_constant", kTest);
      std::vector<int> voltage = {ke, w0};
      voltage.insert(voltage.end(), friction.begin(), friction.end());
      const double sigma = NoiseFromDifferences(c.voltage_V);
      c.voltage_group = problem.AddGroup({c.log->path + " coast voltage", sigma > 0.0 ? sigma : 1.0});
      problem.AddResiduals(c.voltage_group, voltage, n, CoastVoltageResidual{c.time_s, c.voltage_V, mechanics});
    }
  }
}

void ReportSpinDown(const SpinDownPlan& plan, const core::FitResult& fit, MotorEstimate* estimate) {
  std::size_t used = 0;
  for (std::size_t k = 0; k < plan.summary_index.size() && used < plan.logs.size(); ++k) {
    TestSummary& summary = estimate->tests[plan.summary_index[k]];
    if (summary.file != plan.logs[used].log->path) continue;
    const CoastLog& c = plan.logs[used++];
    const auto add = [&](int group, const char* channel, const char* unit) {
      if (group < 0) return;
      const core::GroupStatistics& g = fit.groups[group];
      summary.residuals.push_back({channel, unit, g.rms, g.sigma, g.lag1_autocorrelation, g.num_residuals});
    };
    add(c.motion_group, c.position_rad.empty() ? "speed" : "position", c.position_rad.empty() ? "rad/s" : "rad");
    add(c.voltage_group, "voltage", "V");
    add(c.zero_current_group, "current", "A");
  }
}

}  // namespace coilspin::spin_down
