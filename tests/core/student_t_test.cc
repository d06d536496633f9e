// StudentTQuantile against printed tables of the Student-t and standard normal
// distributions (statistics table: e.g. NIST/SEMATECH e-Handbook of
// Statistical Methods, tables 1.3.6.7.1 and 1.3.6.7.2; values to 6 decimals).

#include <gtest/gtest.h>

#include <limits>

#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

// Tables print 6 decimals, so a correct quantile is within half a unit of the last one.
constexpr double kTableRounding = 5e-7;
const double kInfinity = std::numeric_limits<double>::infinity();

TEST(StudentTQuantile, MatchesStudentTTable) {
  // statistics table: upper-tail critical values of Student's t
  EXPECT_NEAR(StudentTQuantile(0.975, 1), 12.706205, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.975, 2), 4.302653, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.975, 5), 2.570582, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.975, 10), 2.228139, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.975, 30), 2.042272, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.95, 10), 1.812461, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.995, 10), 3.169273, kTableRounding);
}

TEST(StudentTQuantile, InfiniteDegreesOfFreedomIsTheNormalQuantile) {
  // statistics table: standard normal critical values
  EXPECT_NEAR(StudentTQuantile(0.975, kInfinity), 1.959964, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.995, kInfinity), 2.575829, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.95, kInfinity), 1.644854, kTableRounding);
}

TEST(StudentTQuantile, LowerTailIsTheMirrorImage) {
  // physics: the t distribution is symmetric about 0, so t_{1−q} = −t_q (statistics table value)
  EXPECT_NEAR(StudentTQuantile(0.025, 10), -2.228139, kTableRounding);
  EXPECT_NEAR(StudentTQuantile(0.5, 7), 0.0, kTableRounding);
}

}  // namespace
}  // namespace coilspin::core
