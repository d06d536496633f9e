// Segmentation at the edges of the double range (issue 10): whatever finite
// values a log holds, the segmenters return (a segment or none) and never
// read past a channel, loop without end, or crash. The ingest refuses most such
// logs first (physical_bounds_test.cc); these call the segmenters directly, as
// any caller may.

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <vector>

#include "src/ingest/coast_segmentation.h"
#include "src/ingest/segmentation.h"
#include "src/ingest/small_text_and_statistics.h"

namespace coilspin {
namespace {

constexpr double kLargest = std::numeric_limits<double>::max();

TEST(FindStepOnset, APlateauOf1e308) {
  // The median of the first samples overflowed to inf ((1e308 + 1e308)/2), so no sample
  // ever lay beyond half the "amplitude" and the search ran off the end (SIGSEGV).
  std::vector<double> signal(20, 1e308);
  signal.resize(40, 0.0);
  EXPECT_EQ(FindStepOnset(signal), std::optional<std::size_t>(19));  // the last sample at the initial level
}

TEST(FindStepOnset, ExcursionsBeyondTheDoubleRangeFindNoStep) {
  // From -1e308 to +1e308 the excursion itself is beyond the range of a double: no step measured.
  std::vector<double> signal(20, -1e308);
  signal.resize(40, 1e308);
  EXPECT_FALSE(FindStepOnset(signal).has_value());
  std::vector<double> extremes = {kLargest, -kLargest, kLargest, -kLargest, kLargest, -kLargest};
  EXPECT_FALSE(FindStepOnset(extremes).has_value());
}

TEST(Median, OfTwoLargeValuesStaysFinite) {
  // (a + b)/2 overflows for a = b = 1e308; a/2 + b/2 is the same number, exactly, whenever
  // a + b does not overflow (halving is exact in binary floating point, IEEE 754).
  EXPECT_EQ(Median({1e308, 1e308}), 1e308);
  EXPECT_EQ(Median({kLargest, kLargest, 0.0, 0.0}), 0.5 * kLargest);
  EXPECT_EQ(Median({1.0, 2.0}), 1.5);
  EXPECT_EQ(Median({0.1, 0.2, 0.3, 0.7}), 0.5 * (0.2 + 0.3));
}

TEST(FindPlateaus, LevelsAtTheEdgeOfTheRange) {
  std::vector<double> level(30, 1e308);
  level.resize(60, -1e308);
  const std::vector<Plateau> plateaus = FindPlateaus(level, {&level});
  for (const Plateau& p : plateaus) EXPECT_LE(p.end, level.size());
}

// A shaft turning at `speed` for 200 samples and coasting to rest in 100 more
// (constant deceleration), logged as position, with time stretched by `time_scale`.
BenchLog Coast(double time_scale, double speed) {
  BenchLog log;
  double angle = 0.0;
  for (int k = 0; k < 400; ++k) {
    const double w = k < 200 ? speed : std::max(0.0, speed * (1.0 - (k - 200) / 100.0));
    angle += w * 1e-3;
    log.time_s.push_back(time_scale * 1e-3 * k);
    log.position_rad.push_back(angle);
  }
  return log;
}

TEST(FindCoast, TimesAndSpeedsAtTheEdgeOfTheRange) {
  // Times scaled by 1e-300 (a mutated log's) made the coast finder crash (SIGSEGV, issue 10).
  for (const double time_scale : {1e-300, 1e-200, 1.0, 1e200}) {
    for (const double speed : {100.0, 1e150, 1e300}) {
      const BenchLog log = Coast(time_scale, speed);
      const std::optional<CoastSegment> coast = FindCoast(log);
      if (coast) {
        EXPECT_LE(coast->power_off, log.size()) << time_scale << " " << speed;
        EXPECT_LE(coast->rest, log.size()) << time_scale << " " << speed;
      }
    }
  }
  // A sane coast is still found.
  EXPECT_TRUE(FindCoast(Coast(1.0, 100.0)).has_value());
}

TEST(FindCoast, SpeedsWhoseNoiseBandOverflowsSayWhy) {
  // Times scaled by 1e-300 make the position's differences ~1e300 rad/s apart: their
  // noise band is beyond the range of a double, and the warning says so (not "no speed").
  NoCoast why;
  EXPECT_FALSE(FindCoast(Coast(1e-300, 1e300), &why).has_value());
  EXPECT_EQ(why.rule, NoCoastRule::kNotFinite);
  EXPECT_NE(NoCoastText(why).find("beyond the range of a double"), std::string::npos) << NoCoastText(why);
}

}  // namespace
}  // namespace coilspin
