#pragma once
// The conformity decision for one datasheet line: a measured value y with its
// two-sided interval [y⁻, y⁺] at the fit's confidence, against the line's
// tolerance band [T_L, T_U] (a side may be open).
//
// Decision rule with guard bands equal to the interval (ISO 14253-1:2017,
// 5.2–5.3, and JCGM 106:2012, 8.3 "guarded acceptance" with w = U on the
// acceptance side and the mirror rule for rejection):
//   pass          the whole interval lies inside the band:   T_L ≤ y⁻ and y⁺ ≤ T_U
//                 (y lies in the acceptance zone [T_L + U⁻, T_U − U⁺])
//   fail          the whole interval lies outside the band:  y⁺ < T_L or y⁻ > T_U
//                 (y lies beyond the band widened by the guard band)
//   inconclusive  the interval straddles an edge: neither conformity nor
//                 non-conformity is proven at this confidence.
// U⁻ = y − y⁻ and U⁺ = y⁺ − y are the interval's sides (equal for a Student-t
// interval; a bootstrap interval may be lopsided). The interval is the fit's
// coverage interval, so the risk of a wrong pass or fail is at most
// (1 − confidence)/2 at each edge.
//
// What would decide an inconclusive line: the interval must shrink, about the
// same value, by the factor
//   k = min over the crossed edges E of |y − E| / (the interval's side towards E)
// (0 < k < 1; k = 0 when y lies exactly on an edge, which no narrower interval
// decides). An interval from n samples shrinks as 1/√n, so about 1/k² times the
// data is needed; the verdict it then reaches is the one y itself points to:
// pass when y lies inside the band, fail when outside.

#include <string_view>

#include "src/verify/datasheet.h"

namespace coilspin::verify {

enum class Verdict { kPass, kFail, kInconclusive, kNotTested };

// "pass", "fail", "inconclusive", "not-tested" (as the verification file writes them).
std::string_view VerdictName(Verdict verdict);

struct Decision {
  Verdict verdict = Verdict::kInconclusive;
  double narrowing_needed = 1.0;   // k above, for an inconclusive verdict; 1 otherwise
  Verdict would_be = Verdict::kPass;  // what y points to: pass (inside the band) or fail (outside)
};

// `ci_low` ≤ `value` ≤ `ci_high`, all finite (callers check).
Decision Decide(const Band& band, double value, double ci_low, double ci_high);

}  // namespace coilspin::verify
