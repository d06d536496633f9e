#include "src/model/simulate_locked_rotor.h"

#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <string>

#include "src/model/bench_noise.h"
#include "src/model/copper_resistance.h"
#include "src/model/locked_rotor_circuit.h"
#include "src/model/sample_plan.h"
#include "src/model/winding_warm_up.h"

namespace coilspin::model {

namespace {

constexpr const char* kSimulation = "locked-rotor simulation";

// What the supply and the winding do over each sample period [t_k, t_k+1).
struct SupplySchedule {
  std::vector<double> supply_V;          // V_s
  std::vector<double> resistance_ohm;    // R at the winding temperature
  std::vector<double> temperature_degC;  // θ
};

void Require(bool condition, const std::string& what) { RequirePlan(condition, kSimulation, what); }

void ValidateBench(const MotorParameters& motor, const BenchConditions& bench,
                   double sample_period_s) {
  RequireSamplePeriod(sample_period_s, kSimulation);
  Require(motor.resistance_ohm >= 0.0 && bench.supply_resistance_ohm >= 0.0 &&
              motor.resistance_ohm + bench.supply_resistance_ohm > 0.0,
          "R and R_s must be >= 0 with R + R_s > 0");
  Require(motor.inductance_H >= 0.0, "L must be >= 0");
  Require(motor.brush_drop_V >= 0.0, "Vb must be >= 0");
}

void AppendLevel(SupplySchedule& schedule, std::size_t samples, double supply_V,
                 double resistance_ohm, double temperature_degC) {
  schedule.supply_V.insert(schedule.supply_V.end(), samples, supply_V);
  schedule.resistance_ohm.insert(schedule.resistance_ohm.end(), samples, resistance_ohm);
  schedule.temperature_degC.insert(schedule.temperature_degC.end(), samples, temperature_degC);
}

// The winding's warm-up on top of the schedule's temperatures: θ_k += ΔT·(1 − e^(−t_k/τ_th)),
// R_k = R(θ_k) by the copper law.
void AddWarmUp(const MotorParameters& motor, const BenchConditions& bench, double sample_period_s,
               SupplySchedule& schedule) {
  ValidateWarmUp(bench.warm_up);
  if (!HasWarmUp(bench.warm_up)) return;
  for (std::size_t k = 0; k < schedule.supply_V.size(); ++k) {
    schedule.temperature_degC[k] += WarmUpRise_K(bench.warm_up, static_cast<double>(k) * sample_period_s);
    schedule.resistance_ohm[k] = CopperResistanceAt(motor.resistance_ohm, bench.resistance_reference_temperature_degC,
                                                    schedule.temperature_degC[k]);
  }
}

LockedRotorCircuit CircuitAt(const MotorParameters& motor, const BenchConditions& bench,
                             double resistance_ohm) {
  LockedRotorCircuit circuit;
  circuit.loop_resistance_ohm = resistance_ohm + bench.supply_resistance_ohm;  // R + R_s
  circuit.inductance_H = motor.inductance_H;
  circuit.brush_drop_V = motor.brush_drop_V;
  return circuit;
}

// Integrates the schedule from `initial_current_A` and logs t_k = k·Δ,
// v_k = V_s,k − R_s·i_k and i_k (and τ_k = Kt·i_k when `log_torque`), then adds
// noise and quantisation.
SampledLog RunSchedule(const MotorParameters& motor, const BenchConditions& bench,
                       const SupplySchedule& schedule, double sample_period_s,
                       double initial_current_A, bool log_torque) {
  const std::size_t samples = schedule.supply_V.size();
  const double sub_step_s = sample_period_s / kSubStepsPerSample;
  SampledLog log;
  log.time_s.resize(samples);
  log.voltage_V.resize(samples);
  log.current_A.resize(samples);
  double current_A = initial_current_A;
  for (std::size_t k = 0; k < samples; ++k) {
    log.time_s[k] = static_cast<double>(k) * sample_period_s;
    log.voltage_V[k] = schedule.supply_V[k] - bench.supply_resistance_ohm * current_A;
    log.current_A[k] = current_A;
    const LockedRotorCircuit circuit = CircuitAt(motor, bench, schedule.resistance_ohm[k]);
    for (int sub_step = 0; sub_step < kSubStepsPerSample; ++sub_step) {
      current_A = AdvanceLockedRotorCurrent(circuit, current_A, schedule.supply_V[k], sub_step_s);
    }
  }
  if (log_torque) {
    log.torque_N_m.resize(samples);
    for (std::size_t k = 0; k < samples; ++k) {
      log.torque_N_m[k] = motor.torque_constant_N_m_per_A * log.current_A[k];  // τ = Kt·i
    }
  }
  AddBenchNoise(bench, log);
  return log;
}

}  // namespace

SampledLog SimulateLockedRotorPlateaus(const MotorParameters& motor, const PlateauPlan& plan,
                                       const BenchConditions& bench) {
  ValidateBench(motor, bench, plan.sample_period_s);
  Require(!plan.supply_levels_V.empty(), "the plateau plan has no supply levels");
  const std::size_t samples_per_level = SamplesIn(plan.hold_s, plan.sample_period_s, 1, kSimulation, "hold_s");
  SupplySchedule schedule;
  for (std::size_t level = 0; level < plan.supply_levels_V.size(); ++level) {
    const double temperature_degC =
        bench.winding_temperature_degC + static_cast<double>(level) * bench.heating_per_plateau_K;
    const double resistance_ohm = CopperResistanceAt(
        motor.resistance_ohm, bench.resistance_reference_temperature_degC, temperature_degC);
    AppendLevel(schedule, samples_per_level, plan.supply_levels_V[level], resistance_ohm,
                temperature_degC);
  }
  if (plan.log_torque) {
    Require(std::isfinite(motor.torque_constant_N_m_per_A) && motor.torque_constant_N_m_per_A > 0.0,
            "a torque column needs Kt > 0");
  }
  AddWarmUp(motor, bench, plan.sample_period_s, schedule);
  constexpr double kAtRest_A = 0.0;
  SampledLog log =
      RunSchedule(motor, bench, schedule, plan.sample_period_s, kAtRest_A, plan.log_torque);
  if (plan.log_temperature) log.temperature_degC = schedule.temperature_degC;
  return log;
}

SampledLog SimulateLockedRotorStep(const MotorParameters& motor, const StepPlan& plan,
                                   const BenchConditions& bench) {
  ValidateBench(motor, bench, plan.sample_period_s);
  const std::size_t samples_before = SamplesIn(plan.before_s, plan.sample_period_s, 0, kSimulation, "before_s");
  const std::size_t samples_after = SamplesIn(plan.after_s, plan.sample_period_s, 1, kSimulation, "after_s");
  const double temperature_degC = bench.winding_temperature_degC;
  const double resistance_ohm = CopperResistanceAt(
      motor.resistance_ohm, bench.resistance_reference_temperature_degC, temperature_degC);
  SupplySchedule schedule;
  AppendLevel(schedule, samples_before, plan.supply_before_V, resistance_ohm, temperature_degC);
  AppendLevel(schedule, samples_after, plan.supply_after_V, resistance_ohm, temperature_degC);
  AddWarmUp(motor, bench, plan.sample_period_s, schedule);
  const double settled_before_A = SettledLockedRotorCurrent(
      CircuitAt(motor, bench, resistance_ohm), plan.supply_before_V);
  constexpr bool kNoTorque = false;
  return RunSchedule(motor, bench, schedule, plan.sample_period_s, settled_before_A, kNoTorque);
}

}  // namespace coilspin::model
