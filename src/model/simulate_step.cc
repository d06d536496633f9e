#include "src/model/simulate_step.h"

#include <cstddef>
#include <vector>

#include "src/model/free_shaft_bench.h"
#include "src/model/sample_plan.h"

namespace coilspin::model {

namespace {

constexpr const char* kSimulation = "step simulation";

std::size_t SettleSamples(const FreeShaftStepPlan& plan) {
  RequirePlan(plan.settle_s >= 0.0, kSimulation, "settle_s must be >= 0");
  RequirePlan(plan.initial_supply_V == 0.0 || plan.settle_s > 0.0, kSimulation,
              "a step between two levels needs settle_s > 0 (the motor starts from rest)");
  return plan.settle_s > 0.0 ? SamplesIn(plan.settle_s, plan.sample_period_s, 1, kSimulation, "settle_s") : 0;
}

void DropLeading(std::size_t count, std::vector<double>* channel) {
  if (channel->empty()) return;
  channel->erase(channel->begin(), channel->begin() + static_cast<std::ptrdiff_t>(count));
}

}  // namespace

double StepTime_s(const FreeShaftStepPlan& plan) {
  RequireSamplePeriod(plan.sample_period_s, kSimulation);
  const std::size_t settle = SettleSamples(plan);
  const std::size_t pre = SamplesIn(plan.pre_step_s, plan.sample_period_s, 1, kSimulation, "pre_step_s");
  return static_cast<double>(settle + pre) * plan.sample_period_s;
}

SampledLog SimulateStep(const MotorParameters& motor, const FreeShaftStepPlan& plan, const BenchConditions& bench) {
  RequireSamplePeriod(plan.sample_period_s, kSimulation);
  const std::size_t settle = SettleSamples(plan);
  FreeShaftSegment before;
  before.input.supply_V = plan.initial_supply_V;
  before.input.supply_resistance_ohm = bench.supply_resistance_ohm;
  before.samples = settle + SamplesIn(plan.pre_step_s, plan.sample_period_s, 1, kSimulation, "pre_step_s");
  FreeShaftSegment after = before;
  after.input.supply_V = plan.final_supply_V;
  after.samples = SamplesIn(plan.hold_s, plan.sample_period_s, 1, kSimulation, "hold_s");
  FreeShaftChannels channels;
  channels.shaft = plan.shaft;
  channels.temperature = plan.log_temperature;
  SampledLog log = RunFreeShaftBench(motor, {before, after}, plan.sample_period_s, channels, bench, kSimulation);
  for (auto* channel : {&log.time_s, &log.voltage_V, &log.current_A, &log.speed_rad_s, &log.position_rad,
                        &log.torque_N_m, &log.temperature_degC})
    DropLeading(settle, channel);
  return log;
}

}  // namespace coilspin::model
