#pragma once
// Checks shared by the bench simulators: a plan's sample period and spans of
// time as whole numbers of samples. The messages start with the simulation's
// name ("no-load simulation: hold_s must hold at least 1 sample period(s)").

#include <cstddef>
#include <string>

namespace coilspin::model {

// Throws std::invalid_argument(simulation + ": " + what) unless `condition`.
void RequirePlan(bool condition, const std::string& simulation, const std::string& what);

// Throws unless the sample period is finite and > 0.
void RequireSamplePeriod(double sample_period_s, const std::string& simulation);

// The whole number of samples nearest to span/Δ; throws when the span is negative, not
// finite, or holds fewer than `minimum` samples.
std::size_t SamplesIn(double span_s, double sample_period_s, std::size_t minimum,
                      const std::string& simulation, const std::string& name);

}  // namespace coilspin::model
