#include "fitters/no_load/no_load_fit.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <numeric>

#include "fitters/no_load/no_load_residual.h"
#include "src/model/sensor_offsets.h"
#include "src/model/copper_resistance.h"

namespace coilspin::no_load {
namespace {

constexpr const char* kTest = "no-load";
// A plateau's speed must exceed this many noise σ to count as turning.
constexpr double kTurningSpeedSigmas = 5.0;
constexpr std::size_t kMinBackEmfPlateaus = 2;
constexpr std::size_t kMinFrictionPlateaus = 3;
constexpr double kMinResistance_ohm = 1e-9;

double Sign(double x) { return x > 0.0 ? 1.0 : -1.0; }

// Least squares y ≈ X·β (closed form start); empty when X is rank deficient.
std::optional<Eigen::VectorXd> Solve(const Eigen::MatrixXd& x, const Eigen::VectorXd& y) {
  Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(x);
  if (qr.rank() < x.cols()) return std::nullopt;
  return Eigen::VectorXd(qr.solve(y));
}

}  // namespace

NoLoadPlan PlanNoLoad(const std::vector<const BenchLog*>& logs, const std::vector<SpeedTrace>& speeds,
                      std::optional<double> resistance_ohm, double brush_drop_V, const NoLoadTemperatures& temperatures,
                      std::optional<double> back_emf_elsewhere, const PlateauOptions& options,
                      MotorEstimate* estimate) {
  NoLoadPlan plan;
  plan.resistance_from_here = !resistance_ohm.has_value();
  for (std::size_t k = 0; k < logs.size(); ++k) {
    NoLoadLog nl;
    nl.log = logs[k];
    std::optional<double> theta_degC = MeanLoggedTemperature(*logs[k]);
    if (!theta_degC) theta_degC = temperatures.winding_degC;
    if (temperatures.reference_degC && theta_degC)
      nl.temperature_factor = model::CopperResistanceAt(1.0, *temperatures.reference_degC, *theta_degC);
    const std::vector<double>& speed = *speeds[k].speed_rad_s;
    const double speed_noise = NoiseFromDifferences(speed);
    for (const auto& p : FindPlateaus(logs[k]->voltage_V, {&logs[k]->voltage_V, &logs[k]->current_A, &speed}, options)) {
      NoLoadPlateau q{p.channels[0].mean,    p.channels[1].mean,    p.channels[2].mean,
                      p.channels[0].std_dev, p.channels[1].std_dev, p.channels[2].std_dev, p.size()};
      if (std::fabs(q.mean_speed_rad_s) > kTurningSpeedSigmas * std::max(speed_noise, q.speed_std_rad_s))
        nl.plateaus.push_back(q);
    }
    plan.plateau_count += nl.plateaus.size();
    plan.summary_index.push_back(estimate->tests.size());
    estimate->tests.push_back({kTest, logs[k]->path, static_cast<long>(logs[k]->size()),
                               "plateaus: " + std::to_string(nl.plateaus.size()) + " settled levels turning; speed: " +
                                   speeds[k].method,
                               {}, {}, {}, {}});
    plan.logs.push_back(nl);
  }
  // Friction start: Kt·ī = B·ω̄ + Tc·sgn(ω̄) by least squares, with Kt = Ke at its start.
  const auto start_friction = [&plan]() {
    const int n = static_cast<int>(plan.plateau_count);
    Eigen::MatrixXd friction(n, 2);
    Eigen::VectorXd torque(n);
    int row = 0;
    for (const auto& nl : plan.logs)
      for (const auto& p : nl.plateaus) {
        friction(row, 0) = p.mean_speed_rad_s;
        friction(row, 1) = Sign(p.mean_speed_rad_s);
        torque(row) = plan.back_emf_start * p.mean_current_A;
        ++row;
      }
    const auto f = Solve(friction, torque);
    plan.viscous_start = f ? std::max((*f)(0), 0.0) : 0.0;
    plan.coulomb_start = f ? std::max((*f)(1), 0.0) : 0.0;
  };
  if (plan.resistance_from_here && back_emf_elsewhere) {
    // No R for the voltage equation, but Ke (hence Kt = Ke) comes from another
    // test: the plateaus still give friction through Kt·ī = B·ω̄ + Tc.
    plan.back_emf_start = *back_emf_elsewhere;
    plan.friction_identified = plan.plateau_count >= kMinFrictionPlateaus;
    if (plan.friction_identified) start_friction();
    return plan;
  }
  if (plan.resistance_from_here) {
    // Under the model the plateau currents follow speed, ī = (B·ω̄ + Tc)/Kt, so
    // R·ī + Vb is itself affine in ω̄: the voltage equation fixes only
    // Ke + R·B/Kt and R·Tc/Kt + Vb. Fitting R anyway gives a number set by
    // noise with an interval that does not show it.
    estimate->not_identified.push_back(
        {"back_emf_constant", "no-load plateaus alone fix only Ke + R·B/Kt (the current follows speed through "
                              "friction); Ke needs R from a locked-rotor test, or the coast voltage of a spin-down"});
    return plan;
  }
  plan.back_emf_identified = plan.plateau_count >= kMinBackEmfPlateaus;
  plan.friction_identified = plan.back_emf_identified && plan.plateau_count >= kMinFrictionPlateaus;
  if (!plan.back_emf_identified) {
    estimate->not_identified.push_back(
        {"back_emf_constant", "needs no-load plateaus at " + std::to_string(kMinBackEmfPlateaus) +
                                  " or more supply levels with the shaft turning; found " +
                                  std::to_string(plan.plateau_count)});
    return plan;
  }

  // Closed-form start:  v̄ − R·f·ī − Vb·sgn(ī) = Ke·ω̄.
  const int n = static_cast<int>(plan.plateau_count);
  Eigen::MatrixXd x(n, 1);
  Eigen::VectorXd y(n);
  int row = 0;
  for (const auto& nl : plan.logs) {
    for (const auto& p : nl.plateaus) {
      x(row, 0) = p.mean_speed_rad_s;
      y(row) = p.mean_voltage_V - brush_drop_V * Sign(p.mean_current_A) -
               *resistance_ohm * nl.temperature_factor * p.mean_current_A;
      ++row;
    }
  }
  const auto electrical = Solve(x, y);
  if (!electrical || !((*electrical)(0) > 0.0)) {
    plan.back_emf_identified = plan.friction_identified = false;
    estimate->not_identified.push_back(
        {"back_emf_constant", "the no-load plateaus give no positive back-EMF slope (speed does not rise with voltage)"});
    return plan;
  }
  plan.back_emf_start = (*electrical)(0);
  plan.resistance_start_ohm = *resistance_ohm;
  if (plan.friction_identified) start_friction();
  return plan;
}

void AddNoLoad(NoLoadPlan* plan, const std::string& torque_constant_name, core::SharedParameters* parameters) {
  if (!plan->back_emf_identified && !plan->friction_identified) return;
  core::LeastSquaresProblem& problem = parameters->problem();
  int r = -1, vb = -1, ke = -1;
  if (plan->back_emf_identified) {
    r = parameters->Ensure({"resistance", plan->resistance_start_ohm, 0.0, kMinResistance_ohm, {}, false});
    vb = parameters->Ensure({"brush_drop", 0.0, 1.0, 0.0, {}, true});
    ke = parameters->Ensure({"back_emf_constant", plan->back_emf_start, 0.0, 0.0, {}, false});
    parameters->Use("resistance", kTest);
    parameters->Use("back_emf_constant", kTest);
  }
  // The current sensor's zero reading (src/model/sensor_offsets.h): added first by the joint fit.
  const int zero = parameters->Ensure({model::kCurrentOffsetKey, 0.0, 1.0, {}, {}, true});
  if (!problem.Spec(zero).fixed) parameters->Use(model::kCurrentOffsetKey, kTest);
  int kt = -1, b = -1, tc = -1;
  if (plan->friction_identified) {
    kt = parameters->Ensure({torque_constant_name, plan->back_emf_start, 0.0, 0.0, {}, false});
    // Scales: B·ω and Tc are both of the order of the friction torque at the top speed.
    double top_speed = 0.0, top_current = 0.0;
    for (const auto& nl : plan->logs)
      for (const auto& p : nl.plateaus) {
        top_speed = std::max(top_speed, std::fabs(p.mean_speed_rad_s));
        top_current = std::max(top_current, std::fabs(p.mean_current_A));
      }
    const double torque_scale = plan->back_emf_start * top_current;
    b = parameters->Ensure({"viscous_friction", plan->viscous_start, torque_scale / top_speed, 0.0, {}, false});
    tc = parameters->Ensure({"coulomb_friction", plan->coulomb_start, torque_scale, 0.0, {}, false});
    parameters->Use(torque_constant_name, kTest);
    parameters->Use("viscous_friction", kTest);
    parameters->Use("coulomb_friction", kTest);
  }
  for (auto& nl : plan->logs) {
    if (nl.plateaus.empty()) continue;
    NoLoadVoltageResidual voltage;
    voltage.temperature_factor = nl.temperature_factor;
    NoLoadCurrentResidual current;
    double sigma_V = 0.0, sigma_A = 0.0;
    for (const auto& p : nl.plateaus) {
      voltage.mean_voltage_V.push_back(p.mean_voltage_V);
      voltage.mean_current_A.push_back(p.mean_current_A);
      voltage.mean_speed_rad_s.push_back(p.mean_speed_rad_s);
      current.mean_current_A.push_back(p.mean_current_A);
      current.mean_speed_rad_s.push_back(p.mean_speed_rad_s);
      const double root_n = std::sqrt(static_cast<double>(p.samples));
      sigma_V = std::max(sigma_V, std::hypot(p.voltage_std_V, plan->back_emf_start * p.speed_std_rad_s) / root_n);
      sigma_A = std::max(sigma_A, p.current_std_A / root_n);
    }
    const int count = static_cast<int>(nl.plateaus.size());
    if (plan->back_emf_identified) {
      nl.voltage_group = problem.AddGroup({nl.log->path + " no-load voltage", sigma_V > 0.0 ? sigma_V : 1.0});
      problem.AddResiduals(nl.voltage_group, {r, vb, ke, zero}, count, voltage);
    }
    if (plan->friction_identified) {
      nl.current_group = problem.AddGroup({nl.log->path + " no-load current", sigma_A > 0.0 ? sigma_A : 1.0});
      problem.AddResiduals(nl.current_group, {kt, b, tc, zero}, count, current);
    }
  }
}

void ReportNoLoad(const NoLoadPlan& plan, const core::FitResult& fit, MotorEstimate* estimate) {
  for (std::size_t k = 0; k < plan.logs.size(); ++k) {
    const NoLoadLog& nl = plan.logs[k];
    TestSummary& summary = estimate->tests[plan.summary_index[k]];
    for (const auto& [group, channel, unit] : {std::tuple{nl.voltage_group, "voltage", "V"},
                                               std::tuple{nl.current_group, "current", "A"}}) {
      if (group < 0) continue;
      const core::GroupStatistics& g = fit.groups[group];
      summary.residuals.push_back({channel, unit, g.rms, g.sigma, g.lag1_autocorrelation, g.num_residuals});
    }
  }
  if (plan.back_emf_identified && !plan.friction_identified)
    estimate->warnings.push_back("friction from the no-load test needs 3 or more turning plateaus; found " +
                                 std::to_string(plan.plateau_count));
}

}  // namespace coilspin::no_load
