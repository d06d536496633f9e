#pragma once
// A known factor that would make a datasheet's Kt/Ke differ from 1 although the
// motor obeys Kt = Ke (SI): a brushless winding convention (√3, √2, 3/2, ...) or a
// unit slip (mN·m read as N·m, per rpm read as per rad/s, ...). The datasheet
// check compares the observed ratio with every candidate and names the nearest
// one within the tolerance, together with any others that also fit.

#include <optional>
#include <string>
#include <vector>

namespace coilspin::check {

enum class MismatchKind { kWindingConvention, kUnitSlip };

// "winding-convention", "unit-slip" (as written in the result file).
std::string MismatchKindName(MismatchKind kind);

struct MismatchFactor {
  MismatchKind kind = MismatchKind::kWindingConvention;
  double kt_over_ke = 1.0;  // the Kt/Ke this cause gives a motor whose true Kt equals its Ke
  std::string name;         // "1/√3", "1000"
  std::string explanation;  // which conventions or units produce it
};

struct MismatchMatch {
  MismatchFactor factor;                // the nearest candidate within the tolerance
  std::vector<MismatchFactor> also;     // other candidates within the tolerance, nearest first
};

// Candidates f with |r/f − 1| ≤ tolerance, nearest (in |ln(r/f)|) first; nothing
// when none fits.
std::optional<MismatchMatch> NearestMismatch(const std::vector<MismatchFactor>& candidates, double kt_over_ke,
                                             double tolerance);

// Joins candidates with the same factor (relative difference below 1e-12) into one,
// their explanations joined by "; or ".
std::vector<MismatchFactor> MergeEqualFactors(const std::vector<MismatchFactor>& candidates);

}  // namespace coilspin::check
