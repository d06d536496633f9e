#include "src/model/simulate_spin_down.h"

#include <cmath>
#include <cstddef>
#include <vector>

#include "src/model/free_shaft_bench.h"
#include "src/model/sample_plan.h"

namespace coilspin::model {

namespace {

constexpr const char* kSimulation = "spin-down simulation";
constexpr double kBrakeVoltage_V = 0.0;  // a resistor across the terminals: V_s = 0, R_s = R_brake

std::size_t RunSamples(const SpinDownPlan& plan) {
  RequireSamplePeriod(plan.sample_period_s, kSimulation);
  return SamplesIn(plan.run_s, plan.sample_period_s, 1, kSimulation, "run_s");
}

}  // namespace

double SpinDownPowerOffTime_s(const SpinDownPlan& plan) {
  return static_cast<double>(RunSamples(plan)) * plan.sample_period_s;
}

SampledLog SimulateSpinDown(const MotorParameters& motor, const SpinDownPlan& plan,
                            const BenchConditions& bench) {
  FreeShaftSegment run;
  run.input.supply_V = plan.supply_V;
  run.input.supply_resistance_ohm = bench.supply_resistance_ohm;
  run.samples = RunSamples(plan);
  FreeShaftSegment coast;
  coast.samples = SamplesIn(plan.coast_s, plan.sample_period_s, 1, kSimulation, "coast_s");
  coast.input.open_circuit = !plan.brake_resistance_ohm.has_value();
  if (plan.brake_resistance_ohm) {
    RequirePlan(std::isfinite(*plan.brake_resistance_ohm) && *plan.brake_resistance_ohm >= 0.0,
                kSimulation, "the braking resistance must be >= 0");
    coast.input.supply_V = kBrakeVoltage_V;
    coast.input.supply_resistance_ohm = *plan.brake_resistance_ohm;
  }
  FreeShaftChannels channels;
  channels.voltage = plan.log_voltage;
  channels.current = plan.log_current;
  channels.shaft = plan.shaft;
  return RunFreeShaftBench(motor, {run, coast}, plan.sample_period_s, channels, bench, kSimulation);
}

}  // namespace coilspin::model
