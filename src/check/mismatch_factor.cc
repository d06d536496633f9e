#include "src/check/mismatch_factor.h"

#include <algorithm>
#include <cmath>

namespace coilspin::check {
namespace {

// Two candidates whose factors differ by less than this are the same factor
// reached by different products of the same constants (rounding ~1e-16).
constexpr double kSameFactorRelative = 1e-12;

double LogDistance(double kt_over_ke, const MismatchFactor& factor) {
  return std::fabs(std::log(kt_over_ke / factor.kt_over_ke));
}

}  // namespace

std::string MismatchKindName(MismatchKind kind) {
  return kind == MismatchKind::kWindingConvention ? "winding-convention" : "unit-slip";
}

std::optional<MismatchMatch> NearestMismatch(const std::vector<MismatchFactor>& candidates, double kt_over_ke,
                                             double tolerance) {
  std::vector<MismatchFactor> fitting;
  for (const MismatchFactor& candidate : candidates) {
    if (std::fabs(kt_over_ke / candidate.kt_over_ke - 1.0) <= tolerance) fitting.push_back(candidate);
  }
  if (fitting.empty()) return std::nullopt;
  std::stable_sort(fitting.begin(), fitting.end(), [kt_over_ke](const MismatchFactor& a, const MismatchFactor& b) {
    return LogDistance(kt_over_ke, a) < LogDistance(kt_over_ke, b);
  });
  MismatchMatch match;
  match.factor = fitting.front();
  match.also.assign(fitting.begin() + 1, fitting.end());
  return match;
}

std::vector<MismatchFactor> MergeEqualFactors(const std::vector<MismatchFactor>& candidates) {
  std::vector<MismatchFactor> merged;
  for (const MismatchFactor& candidate : candidates) {
    auto same = std::find_if(merged.begin(), merged.end(), [&candidate](const MismatchFactor& known) {
      return known.kind == candidate.kind &&
             std::fabs(known.kt_over_ke - candidate.kt_over_ke) <= kSameFactorRelative * known.kt_over_ke;
    });
    if (same == merged.end()) {
      merged.push_back(candidate);
    } else if (same->explanation.find(candidate.explanation) == std::string::npos) {
      same->explanation += "; or " + candidate.explanation;
    }
  }
  return merged;
}

}  // namespace coilspin::check
