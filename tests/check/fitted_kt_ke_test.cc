// Kt/Ke verdicts on a fitted ratio: Student-t intervals checked against published
// quantile tables, and the overlap rule of docs/methods.md at its boundaries.

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

#include "src/check/kt_ke_consistency.h"

namespace coilspin::check {
namespace {

// NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.2 (critical values of
// Student's t): t_{0.975, 10} = 2.228, t_{0.975, 50} = 2.009; 1.3.6.7.1 (normal): z_{0.975} = 1.960.
constexpr double kT975Dof10 = 2.228;
constexpr double kT975Dof50 = 2.009;
constexpr double kZ975 = 1.960;
constexpr double kTableRounding = 5e-4;  // the tables print three decimals

TEST(FittedKtKe, IntervalUsesTheStudentTQuantile) {
  const Consistency c = CheckFittedKtKe({1.0, 0.01, 10.0}, 0.95);
  ASSERT_TRUE(c.ci_low && c.ci_high);
  EXPECT_NEAR(*c.ci_high - 1.0, kT975Dof10 * 0.01, kTableRounding * 0.01);  // NIST/SEMATECH 1.3.6.7.2
  EXPECT_NEAR(1.0 - *c.ci_low, kT975Dof10 * 0.01, kTableRounding * 0.01);   // symmetric (Wald interval)
  EXPECT_EQ(*c.kt_over_ke, 1.0);
  EXPECT_EQ(c.tolerance, 0.05);  // common practice: the stated default
  EXPECT_EQ(c.verdict, "consistent");
  EXPECT_NE(c.note.find("1 \u00b1 0.05"), std::string::npos) << c.note;  // the note states the tolerance
}

TEST(FittedKtKe, InfiniteDegreesOfFreedomUseTheNormalQuantile) {
  const Consistency c = CheckFittedKtKe({1.0, 0.01, std::numeric_limits<double>::infinity()}, 0.95);
  ASSERT_TRUE(c.ci_high);
  EXPECT_NEAR(*c.ci_high - 1.0, kZ975 * 0.01, kTableRounding * 0.01);  // NIST/SEMATECH 1.3.6.7.1
}

TEST(FittedKtKe, RatioOfNinetyThreeHundredthsWithSmallErrorIsInconsistent) {
  // docs/methods.md §5: the interval 0.93 ± 2.009·0.005 = [0.920, 0.940] lies below 0.95
  const Consistency c = CheckFittedKtKe({0.93, 0.005, 50.0}, 0.95);
  EXPECT_EQ(c.verdict, "inconsistent");
  EXPECT_NEAR(*c.ci_high, 0.93 + kT975Dof50 * 0.005, kTableRounding * 0.005);  // NIST/SEMATECH 1.3.6.7.2
  EXPECT_NE(c.note.find("below"), std::string::npos) << c.note;
  EXPECT_NE(c.note.find("0.05"), std::string::npos) << c.note;
  // The same ratio with a wide interval reaches the band: consistent (docs/methods.md §5, overlap rule).
  EXPECT_EQ(CheckFittedKtKe({0.93, 0.05, 50.0}, 0.95).verdict, "consistent");
}

TEST(FittedKtKe, OneIsConsistentAndAboveTheBandIsInconsistent) {
  EXPECT_EQ(CheckFittedKtKe({1.00, 0.005, 50.0}, 0.95).verdict, "consistent");  // docs/methods.md §5
  const Consistency high = CheckFittedKtKe({1.08, 0.005, 50.0}, 0.95);           // [1.070, 1.090] > 1.05
  EXPECT_EQ(high.verdict, "inconsistent");
  EXPECT_NE(high.note.find("above"), std::string::npos) << high.note;
}

TEST(FittedKtKe, BoundariesOfTheOverlapRule) {
  // docs/methods.md §5: consistent when the interval reaches 1 ± tol. With ν = 10 the
  // half-width is t·se, t = 2.228 (NIST/SEMATECH 1.3.6.7.2); an se 0.1 % either side of
  // gap/t lands the interval's edge just inside or just outside the band.
  const double gap = 0.05;  // from 0.90 up to 0.95, and from 1.10 down to 1.05
  const double se_at_edge = gap / kT975Dof10;
  EXPECT_EQ(CheckFittedKtKe({0.90, se_at_edge * 1.001, 10.0}, 0.95).verdict, "consistent");
  EXPECT_EQ(CheckFittedKtKe({0.90, se_at_edge * 0.999, 10.0}, 0.95).verdict, "inconsistent");
  EXPECT_EQ(CheckFittedKtKe({1.10, se_at_edge * 1.001, 10.0}, 0.95).verdict, "consistent");
  EXPECT_EQ(CheckFittedKtKe({1.10, se_at_edge * 0.999, 10.0}, 0.95).verdict, "inconsistent");
  // A point estimate (se = 0) exactly on the band's edge counts as inside (closed band).
  EXPECT_EQ(CheckFittedKtKe({0.95, 0.0, 10.0}, 0.95, 0.05).verdict, "consistent");
  EXPECT_EQ(CheckFittedKtKe({0.9499, 0.0, 10.0}, 0.95, 0.05).verdict, "inconsistent");
}

TEST(FittedKtKe, ToleranceIsHonoured) {
  // docs/methods.md §5: the tolerance is the user's; [1.040, 1.060] meets 1 ± 0.05 but not 1 ± 0.03
  EXPECT_EQ(CheckFittedKtKe({1.05, 0.005, 50.0}, 0.95, 0.05).verdict, "consistent");
  const Consistency tight = CheckFittedKtKe({1.05, 0.005, 50.0}, 0.95, 0.03);
  EXPECT_EQ(tight.verdict, "inconsistent");
  EXPECT_EQ(tight.tolerance, 0.03);
  EXPECT_NE(tight.note.find("1 \u00b1 0.03"), std::string::npos) << tight.note;
}

TEST(FittedKtKe, WithoutAnIntervalTheRatioIsNotChecked) {
  // docs/methods.md §4: an undetermined error is reported, never turned into a verdict
  const Consistency c = CheckFittedKtKe({1.0, std::nan(""), 10.0}, 0.95);
  EXPECT_EQ(c.verdict, "not-checked");
  EXPECT_FALSE(c.kt_over_ke.has_value());
  EXPECT_EQ(CheckFittedKtKe({1.0, 0.01, 0.0}, 0.95).verdict, "not-checked");
  EXPECT_THROW(CheckFittedKtKe({1.0, 0.01, 10.0}, 1.0), std::invalid_argument);        // programmer error
  EXPECT_THROW(CheckFittedKtKe({1.0, 0.01, 10.0}, 0.95, 0.0), std::invalid_argument);  // programmer error
}

TEST(KtKeNotChecked, ReasonsAreStated) {
  // docs/methods.md §2: with Kt assumed equal to Ke the verdict is "not-checked"
  const Consistency assumed = KtKeNotCheckedResult(KtKeNotChecked::kKtAssumedEqualToKe);
  EXPECT_EQ(assumed.verdict, "not-checked");
  EXPECT_FALSE(assumed.kt_over_ke.has_value());
  EXPECT_FALSE(assumed.ci_low.has_value());
  EXPECT_EQ(assumed.tolerance, 0.05);
  EXPECT_NE(assumed.note.find("taken equal to Ke"), std::string::npos) << assumed.note;
  EXPECT_NE(KtKeNotCheckedResult(KtKeNotChecked::kKtMissing).note.find("Kt was not determined"), std::string::npos);
  EXPECT_NE(KtKeNotCheckedResult(KtKeNotChecked::kKeMissing).note.find("Ke was not determined"), std::string::npos);
}

}  // namespace
}  // namespace coilspin::check
