#include <gtest/gtest.h>
#include <stdlib.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>

#include "src/output/bench_log_csv.h"

namespace coilspin::output {
namespace {

namespace fs = std::filesystem;

constexpr double kPi = 3.14159265358979323846;  // physics (mathematical constant)

class BenchLogPositionTest : public ::testing::Test {
 protected:
  void SetUp() override {
    std::string pattern = (fs::temp_directory_path() / "coilspin-position-XXXXXX").string();
    ASSERT_NE(::mkdtemp(pattern.data()), nullptr);
    dir_ = pattern;
  }
  void TearDown() override { fs::remove_all(dir_); }

  // The file written for `log` in `style`, as text.
  std::string Written(const model::SampledLog& log, const CsvStyle& style) {
    const fs::path path = dir_ / "log.csv";
    WriteBenchLogCsv(log, path.string(), style);
    std::ifstream in(path);
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
  }

  fs::path dir_;
};

model::SampledLog PositionLog() {
  model::SampledLog log;
  log.time_s = {0.0, 0.001, 0.002};
  log.speed_rad_s = {0.0, 10.0, 20.0};
  log.position_rad = {0.0, 0.5 * kPi, -3.0 * kPi};
  return log;
}

TEST_F(BenchLogPositionTest, WritesPositionInRadiansDegreesAndRevolutions) {
  // physics (definitions): π/2 rad = 90 deg = 0.25 rev; −3π rad = −540 deg = −1.5 rev
  CsvStyle style;
  const std::string radians = Written(PositionLog(), style);
  EXPECT_EQ(radians.substr(0, radians.find('\n')), "time [s],speed [rad/s],position [rad]");
  EXPECT_NE(radians.find("\n0.001,10,1.570796327\n"), std::string::npos) << radians;
  style.position_unit = "deg";
  style.speed_unit = "rpm";
  const std::string degrees = Written(PositionLog(), style);
  EXPECT_EQ(degrees.substr(0, degrees.find('\n')), "time [s],speed [rpm],position [deg]");
  // references.md: 1 rpm = 2π/60 rad/s, so 10 rad/s = 95.49296586 rpm
  EXPECT_NE(degrees.find("\n0.001,95.49296586,90\n"), std::string::npos) << degrees;
  EXPECT_NE(degrees.find("\n0.002,190.9859317,-540\n"), std::string::npos) << degrees;
  style.position_unit = "rev";
  EXPECT_NE(Written(PositionLog(), style).find(",-1.5\n"), std::string::npos);
}

TEST_F(BenchLogPositionTest, WritesEncoderCountsAsWholeNumbers) {
  // physics: with cpr counts per revolution, θ = n·2π/cpr; a count is an integer, written in full
  constexpr int kCpr = 4096;
  model::SampledLog log;
  log.time_s = {0.0, 0.001, 0.002};
  const double per_count = 2.0 * kPi / kCpr;
  log.position_rad = {0.0, 1234567.0 * per_count, -3.0 * per_count};
  CsvStyle style;
  style.position_unit = "counts";
  style.counts_per_rev = kCpr;
  style.significant_digits = 3;  // not for counts
  const std::string text = Written(log, style);
  EXPECT_EQ(text, "time [s],position [counts]\n0,0\n0.001,1234567\n0.002,-3\n");
}

TEST_F(BenchLogPositionTest, CountsNeedTheCountsPerRevolution) {
  // bench-logs.md: a counts column is meaningless without the encoder's counts per revolution
  CsvStyle style;
  style.position_unit = "counts";
  std::string error;
  EXPECT_FALSE(style.IsValid(&error));
  EXPECT_NE(error.find("counts per revolution"), std::string::npos) << error;
  EXPECT_THROW(Written(PositionLog(), style), std::invalid_argument);
  style.position_unit = "furlongs";
  EXPECT_FALSE(style.IsValid(&error));
  EXPECT_NE(error.find("rad, deg, rev, counts"), std::string::npos) << "lists the accepted units: " << error;
}

}  // namespace
}  // namespace coilspin::output
