#include "src/model/sample_plan.h"

#include <cmath>
#include <stdexcept>

namespace coilspin::model {

void RequirePlan(bool condition, const std::string& simulation, const std::string& what) {
  if (!condition) throw std::invalid_argument(simulation + ": " + what);
}

void RequireSamplePeriod(double sample_period_s, const std::string& simulation) {
  RequirePlan(std::isfinite(sample_period_s) && sample_period_s > 0.0, simulation,
              "sample period must be > 0");
}

std::size_t SamplesIn(double span_s, double sample_period_s, std::size_t minimum,
                      const std::string& simulation, const std::string& name) {
  RequirePlan(std::isfinite(span_s) && span_s >= 0.0, simulation, name + " must be >= 0");
  RequirePlan(span_s / sample_period_s <= static_cast<double>(kMaxSimulatedSamples), simulation,
              name + " spans more than " + std::to_string(kMaxSimulatedSamples) + " samples");
  const auto samples = static_cast<std::size_t>(std::llround(span_s / sample_period_s));
  RequirePlan(samples >= minimum, simulation,
              name + " must hold at least " + std::to_string(minimum) + " sample period(s)");
  return samples;
}

}  // namespace coilspin::model
