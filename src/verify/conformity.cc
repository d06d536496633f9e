#include "src/verify/conformity.h"

#include <algorithm>
#include <cmath>

namespace coilspin::verify {
namespace {

// |y − E| over the interval's side towards E, for an edge the interval crosses.
double Shrink(double distance_to_edge, double side) { return side > 0.0 ? distance_to_edge / side : 0.0; }

}  // namespace

std::string_view VerdictName(Verdict verdict) {
  switch (verdict) {
    case Verdict::kPass:
      return "pass";
    case Verdict::kFail:
      return "fail";
    case Verdict::kInconclusive:
      return "inconclusive";
    case Verdict::kNotTested:
      break;
  }
  return "not-tested";
}

Decision Decide(const Band& band, double value, double ci_low, double ci_high) {
  Decision d;
  if (band.low <= ci_low && ci_high <= band.high) {  // ISO 14253-1: conformity proven
    d.verdict = Verdict::kPass;
    return d;
  }
  if (ci_high < band.low || ci_low > band.high) {  // ISO 14253-1: non-conformity proven
    d.verdict = Verdict::kFail;
    d.would_be = Verdict::kFail;
    return d;
  }
  d.verdict = Verdict::kInconclusive;
  const double below = value - ci_low, above = ci_high - value;  // the interval's sides
  if (band.Contains(value)) {
    d.would_be = Verdict::kPass;
    double k = 1.0;
    if (ci_low < band.low) k = std::min(k, Shrink(value - band.low, below));
    if (ci_high > band.high) k = std::min(k, Shrink(band.high - value, above));
    d.narrowing_needed = k;
  } else {
    d.would_be = Verdict::kFail;
    d.narrowing_needed = value > band.high ? Shrink(value - band.high, below) : Shrink(band.low - value, above);
  }
  return d;
}

}  // namespace coilspin::verify
