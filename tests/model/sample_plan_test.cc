// The shared checks of the bench simulators (src/model/sample_plan.h): a span
// becomes the whole number of samples nearest span/Δ, and a span beyond
// kMaxSimulatedSamples is refused before anything is allocated.

#include "src/model/sample_plan.h"

#include <gtest/gtest.h>

#include <stdexcept>
#include <string>

namespace coilspin::model {
namespace {

TEST(SamplesIn, NearestWholeNumberOfSamples) {
  EXPECT_EQ(SamplesIn(0.5, 1e-3, 1, "test simulation", "hold_s"), 500u);
  EXPECT_EQ(SamplesIn(0.0104, 1e-3, 1, "test simulation", "hold_s"), 10u);
}

TEST(SamplesIn, ASpanBeyondTheCapIsRefusedNotAllocated) {
  // 1e9 s at 1 ms: 1e12 samples, far beyond the cap; 1e-12 s sampling of 1 s likewise.
  try {
    SamplesIn(1e9, 1e-3, 1, "test simulation", "hold_s");
    FAIL() << "no exception";
  } catch (const std::invalid_argument& e) {
    EXPECT_EQ(std::string(e.what()), "test simulation: hold_s spans more than 10000000 samples");
  }
  EXPECT_THROW(SamplesIn(1.0, 1e-12, 1, "test simulation", "after_s"), std::invalid_argument);
  const double at_cap_s = static_cast<double>(kMaxSimulatedSamples) * 1e-3;
  EXPECT_EQ(SamplesIn(at_cap_s, 1e-3, 1, "test simulation", "hold_s"), kMaxSimulatedSamples);
}

}  // namespace
}  // namespace coilspin::model
