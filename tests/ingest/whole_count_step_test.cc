// Whole encoder counts in a position column (src/ingest/whole_count_step.h).

#include "src/ingest/whole_count_step.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <vector>

namespace coilspin {
namespace {

constexpr double kTwoPi = 6.283185307179586477;  // physics (definition of the radian)

TEST(WholeCountStep, FindsTheCountOfAnEncoderLogEvenWrittenToNineDigits) {
  constexpr int kCpr = 4096;
  const double count_rad = kTwoPi / kCpr;
  std::vector<double> counted, written;
  for (int k = 0; k < 2000; ++k) {
    const double angle_rad = 0.3 + 0.00004 * k * k;  // speeding up from rest, invented
    const double reading = count_rad * std::floor(angle_rad / count_rad);
    counted.push_back(reading);
    char text[32];
    std::snprintf(text, sizeof text, "%.9g", reading);  // a CSV cell of 9 significant digits
    written.push_back(std::strtod(text, nullptr));
  }
  ASSERT_TRUE(WholeCountStep(counted).has_value());
  EXPECT_NEAR(*WholeCountStep(counted), count_rad, 1e-12);
  ASSERT_TRUE(WholeCountStep(written).has_value());
  EXPECT_NEAR(*WholeCountStep(written) / count_rad, 1.0, 1e-6);
}

TEST(WholeCountStep, AnExactAngleOrAStillShaftIsNotCounts) {
  std::vector<double> exact;
  for (int k = 0; k < 100; ++k) exact.push_back(0.01 * k + 0.001 * std::sin(0.3 * k));
  EXPECT_FALSE(WholeCountStep(exact).has_value());
  EXPECT_FALSE(WholeCountStep(std::vector<double>(50, 1.5)).has_value());
  EXPECT_FALSE(WholeCountStep({}).has_value());
}

}  // namespace
}  // namespace coilspin
