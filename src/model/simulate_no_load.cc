#include "src/model/simulate_no_load.h"

#include <cstddef>

#include "src/model/free_shaft_bench.h"
#include "src/model/sample_plan.h"

namespace coilspin::model {

namespace {

constexpr const char* kSimulation = "no-load simulation";

}  // namespace

SampledLog SimulateNoLoad(const MotorParameters& motor, const NoLoadPlan& plan,
                          const BenchConditions& bench) {
  RequireSamplePeriod(plan.sample_period_s, kSimulation);
  RequirePlan(!plan.supply_levels_V.empty(), kSimulation, "the no-load plan has no supply levels");
  const std::size_t samples_per_level =
      SamplesIn(plan.hold_s, plan.sample_period_s, 1, kSimulation, "hold_s");
  std::vector<FreeShaftSegment> segments;
  for (double supply_V : plan.supply_levels_V) {
    FreeShaftSegment level;
    level.input.supply_V = supply_V;
    level.input.supply_resistance_ohm = bench.supply_resistance_ohm;
    level.samples = samples_per_level;
    segments.push_back(level);
  }
  FreeShaftChannels channels;
  channels.shaft = plan.shaft;
  channels.temperature = plan.log_temperature;
  return RunFreeShaftBench(motor, segments, plan.sample_period_s, channels, bench, kSimulation);
}

}  // namespace coilspin::model
