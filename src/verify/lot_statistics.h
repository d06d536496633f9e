#pragma once
// Statistics of one datasheet line over a lot of motors.
//
//   mean x̄ = Σx/n, sample standard deviation s = √(Σ(x − x̄)²/(n − 1))
//   process capability against the band [LSL, USL] (ISO 22514-2, with the lot's
//   s as the estimate of σ — for a single lot without rational subgroups this is
//   what ISO 22514-2 calls the performance index Ppk; the trade says Cpk):
//       Cpk = min(USL − x̄, x̄ − LSL)/(3s)   (one-sided band: the side it has)
//   robust z-score (Iglewicz & Hoaglin 1993, "How to detect and handle outliers"):
//       M_i = 0.6745·(x_i − x̃)/MAD,  x̃ the median, MAD = median |x_i − x̃|,
//       an outlier when |M_i| > 3.5
//   0.6745 is Φ⁻¹(0.75), which makes MAD/0.6745 estimate σ for normal data.

#include <optional>
#include <vector>

#include "src/verify/datasheet.h"

namespace coilspin::verify {

// The published constants of the modified z-score (Iglewicz & Hoaglin 1993).
inline constexpr double kModifiedZScale = 0.6745;
inline constexpr double kModifiedZOutlier = 3.5;
// Cpk counts the distance to the nearer limit in units of 3σ (ISO 22514-2).
inline constexpr double kCapabilitySigmas = 3.0;

double Mean(const std::vector<double>& x);
// n − 1 in the denominator; 0 for fewer than two values.
double SampleStandardDeviation(const std::vector<double>& x);
double MedianAbsoluteDeviation(const std::vector<double>& x);

// Nothing when s = 0, when there are fewer than two values, or when the band is open on both sides.
std::optional<double> ProcessCapability(const Band& band, const std::vector<double>& x);

// M_i for each value; nothing when MAD = 0 (more than half the values equal) or there are fewer than three.
std::optional<std::vector<double>> ModifiedZScores(const std::vector<double>& x);

}  // namespace coilspin::verify
