#pragma once
// Checks shared by the bench simulators: a plan's sample period and spans of
// time as whole numbers of samples. The messages start with the simulation's
// name ("no-load simulation: hold_s must hold at least 1 sample period(s)").

#include <cstddef>
#include <string>

namespace coilspin::model {

// The most samples one simulated log may hold, all its spans together: 10^7,
// the size of the ingest benchmark's log (tests/bench/ingest_bench.cc), about
// 0.5 GB of CSV text. A larger request is refused rather than left to exhaust
// the memory (or to run for hours); a span beyond it alone makes SamplesIn throw.
inline constexpr std::size_t kMaxSimulatedSamples = 10'000'000;

// Throws std::invalid_argument(simulation + ": " + what) unless `condition`.
void RequirePlan(bool condition, const std::string& simulation, const std::string& what);

// Throws unless the sample period is finite and > 0.
void RequireSamplePeriod(double sample_period_s, const std::string& simulation);

// The whole number of samples nearest to span/Δ; throws when the span is negative, not
// finite, holds fewer than `minimum` samples or more than kMaxSimulatedSamples.
std::size_t SamplesIn(double span_s, double sample_period_s, std::size_t minimum,
                      const std::string& simulation, const std::string& name);

}  // namespace coilspin::model
