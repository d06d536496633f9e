// The conformity decision with guard bands (src/verify/conformity.h) against
// the rule of ISO 14253-1:2017 (5.2, 5.3: conformity proven when the
// measurement result's uncertainty interval lies within the specification
// zone, non-conformity proven when it lies wholly outside, otherwise neither)
// and JCGM 106:2012 8.3.3 (guarded acceptance: acceptance interval
// [T_L + w, T_U − w] with guard band w = U).

#include "src/verify/conformity.h"

#include <gtest/gtest.h>

#include <limits>

namespace coilspin::verify {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();

Decision At(const Band& band, double y, double expanded_uncertainty) {
  return Decide(band, y, y - expanded_uncertainty, y + expanded_uncertainty);
}

// Worked example, from memory of the figures of ISO 14253-1 (specification zone,
// conformance zone reduced by U at each limit, non-conformance zone beyond the limits
// widened by U, uncertainty range between); the numbers are ours: a shaft of
// 10 mm ± 0.05 mm measured with an expanded uncertainty U = 0.01 mm.
TEST(GuardBandRule, WorkedExampleOfIso14253) {
  const Band spec{9.95, 10.05};
  const double u = 0.01;
  // conformance zone [9.96, 10.04]: conformity proven
  EXPECT_EQ(At(spec, 10.00, u).verdict, Verdict::kPass);
  EXPECT_EQ(At(spec, 10.03, u).verdict, Verdict::kPass);
  EXPECT_EQ(At(spec, 9.965, u).verdict, Verdict::kPass);
  // uncertainty ranges (9.94, 9.96) and (10.04, 10.06): neither is proven
  EXPECT_EQ(At(spec, 10.045, u).verdict, Verdict::kInconclusive);  // inside the limit, within U of it
  EXPECT_EQ(At(spec, 10.055, u).verdict, Verdict::kInconclusive);  // outside the limit, within U of it
  EXPECT_EQ(At(spec, 9.955, u).verdict, Verdict::kInconclusive);
  EXPECT_EQ(At(spec, 9.945, u).verdict, Verdict::kInconclusive);
  // non-conformance zone beyond 9.94 and 10.06: non-conformity proven
  EXPECT_EQ(At(spec, 10.07, u).verdict, Verdict::kFail);
  EXPECT_EQ(At(spec, 9.93, u).verdict, Verdict::kFail);
}

TEST(GuardBandRule, PassIsTheGuardedAcceptanceIntervalOfJcgm106) {
  // JCGM 106:2012 8.3.3: accept when y lies in [T_L + U, T_U − U]; the mirror rule rejects
  // when y lies beyond [T_L − U, T_U + U]. Checked over a grid of results and uncertainties.
  const Band spec{2.116, 2.484};  // 2.3 ohm ± 8 %
  for (double u : {0.001, 0.02, 0.1, 0.2}) {
    for (double y = 1.8; y <= 2.8; y += 0.0037) {
      const Verdict v = At(spec, y, u).verdict;
      const bool accepted = y - u >= spec.low && y + u <= spec.high;
      const bool rejected = y + u < spec.low || y - u > spec.high;
      EXPECT_EQ(v == Verdict::kPass, accepted) << "y = " << y << ", U = " << u;
      EXPECT_EQ(v == Verdict::kFail, rejected) << "y = " << y << ", U = " << u;
      EXPECT_EQ(v == Verdict::kInconclusive, !accepted && !rejected) << "y = " << y << ", U = " << u;
    }
  }
}

TEST(GuardBandRule, AnIntervalWiderThanTheBandNeverPasses) {
  // ISO 14253-1: with U larger than half the tolerance, conformity cannot be proven.
  EXPECT_EQ(At(Band{9.95, 10.05}, 10.0, 0.06).verdict, Verdict::kInconclusive);
}

TEST(GuardBandRule, OneSidedBands) {
  const Band at_least{0.12, kInfinity};  // stall_torque = { min = "0.12 N*m" }
  EXPECT_EQ(At(at_least, 0.15, 0.01).verdict, Verdict::kPass);
  EXPECT_EQ(At(at_least, 0.125, 0.01).verdict, Verdict::kInconclusive);
  EXPECT_EQ(At(at_least, 0.10, 0.01).verdict, Verdict::kFail);
  const Band at_most{-kInfinity, 0.5};   // no_load_current = { max = "0.5 A" }
  EXPECT_EQ(At(at_most, 0.3, 0.1).verdict, Verdict::kPass);
  EXPECT_EQ(At(at_most, 0.45, 0.1).verdict, Verdict::kInconclusive);
  EXPECT_EQ(At(at_most, 0.7, 0.1).verdict, Verdict::kFail);
}

TEST(GuardBandRule, AsymmetricBandsAndLopsidedIntervals) {
  const Band speed{3600.0, 4200.0};  // 4000 rpm, minus 10 %, plus 5 %
  EXPECT_EQ(At(speed, 3700.0, 50.0).verdict, Verdict::kPass);
  EXPECT_EQ(At(speed, 4180.0, 50.0).verdict, Verdict::kInconclusive);
  EXPECT_EQ(At(speed, 3580.0, 10.0).verdict, Verdict::kFail);
  // A bootstrap interval may be lopsided: only its side towards an edge matters there.
  EXPECT_EQ(Decide(speed, 4150.0, 3700.0, 4190.0).verdict, Verdict::kPass);
  EXPECT_EQ(Decide(speed, 4150.0, 4140.0, 4210.0).verdict, Verdict::kInconclusive);
}

TEST(GuardBandRule, WhatWouldDecideAnInconclusiveLine) {
  const Band spec{9.95, 10.05};
  // y = 10.045 inside, U = 0.01: the upper side must shrink to 0.005, half its width; it would then pass.
  const Decision inside = At(spec, 10.045, 0.01);
  EXPECT_NEAR(inside.narrowing_needed, 0.5, 1e-12);
  EXPECT_EQ(inside.would_be, Verdict::kPass);
  // y = 10.058 outside, U = 0.01: the lower side must shrink to 0.008; it would then fail.
  const Decision outside = At(spec, 10.058, 0.01);
  EXPECT_NEAR(outside.narrowing_needed, 0.8, 1e-9);
  EXPECT_EQ(outside.would_be, Verdict::kFail);
  // Straddling both edges: the nearer edge decides the factor (0.04/0.06 at the lower one).
  EXPECT_NEAR(At(spec, 9.99, 0.06).narrowing_needed, 0.04 / 0.06, 1e-9);
  // On the edge itself no narrower interval decides it.
  EXPECT_EQ(At(spec, 10.05, 0.01).narrowing_needed, 0.0);
  EXPECT_EQ(At(spec, 10.05, 0.01).verdict, Verdict::kInconclusive);
}

TEST(GuardBandRule, EdgesAndNames) {
  // ISO 14253-1: the limits belong to the specification zone, so an interval ending on one conforms.
  EXPECT_EQ(Decide(Band{1.0, 2.0}, 1.5, 1.0, 2.0).verdict, Verdict::kPass);
  EXPECT_EQ(VerdictName(Verdict::kPass), "pass");
  EXPECT_EQ(VerdictName(Verdict::kFail), "fail");
  EXPECT_EQ(VerdictName(Verdict::kInconclusive), "inconclusive");
  EXPECT_EQ(VerdictName(Verdict::kNotTested), "not-tested");  // the interface contract's spelling
}

}  // namespace
}  // namespace coilspin::verify
