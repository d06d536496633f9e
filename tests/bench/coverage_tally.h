#pragma once
// Coverage benchmark helper: per parameter tallies of many fits against a known
// truth, and the markdown tables docs/coverage.md records.
//
// For each fit of a parameter with truth θ and reported interval [lo, hi]:
//   covered     lo ≤ θ ≤ hi (the empirical coverage estimates the interval's
//               true level; with n fits its binomial standard error is
//               √(p(1−p)/n), about 3.4 points at p = 0.95, n = 40)
//   relative    (θ̂ − θ)/θ, whose mean is the bias and whose SD the spread
//   half-width  (hi − lo)/(2θ), the reported interval's mean half-width,
//               to compare with the spread: a well-sized normal 95 % interval
//               has a half-width of about 1.96 spreads (normal quantile, common practice)

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"

namespace coilspin::bench {

struct Tally {
  int fits = 0;
  int covered = 0;
  double sum_relative = 0.0;
  double sum_squared_relative = 0.0;
  double sum_relative_half_width = 0.0;

  void Add(const QuantityEstimate& q, double truth) {
    const double relative = (q.value - truth) / truth;
    ++fits;
    if (q.ci_low <= truth && truth <= q.ci_high) ++covered;
    sum_relative += relative;
    sum_squared_relative += relative * relative;
    sum_relative_half_width += (q.ci_high - q.ci_low) / (2.0 * truth);
  }
  double Coverage_percent() const { return 100.0 * covered / fits; }
  double Bias() const { return sum_relative / fits; }
  double Spread() const {
    const double mean = Bias();
    return std::sqrt(std::max(0.0, sum_squared_relative / fits - mean * mean));
  }
  double MeanHalfWidth() const { return sum_relative_half_width / fits; }
};

// Tallies per parameter over all motors, and per "motor / parameter".
struct CoverageTallies {
  std::map<std::string, Tally> by_parameter;
  std::map<std::string, Tally> by_motor;

  void Add(const std::string& motor, const std::string& key, const QuantityEstimate& q, double truth) {
    by_parameter[key].Add(q, truth);
    by_motor[motor + " / " + key].Add(q, truth);
  }
};

inline void PrintRow(const std::string& name, const Tally& t, const char* coverage_format) {
  std::printf("| %s | %d | ", name.c_str(), t.fits);
  std::printf(coverage_format, t.Coverage_percent());
  std::printf(" | %+.2e | %.2e | %.2e |\n", t.Bias(), t.Spread(), t.MeanHalfWidth());
}

// The overall table in `keys` order, then the per-motor table (alphabetical).
inline void PrintTables(const CoverageTallies& tallies, const std::vector<std::string>& keys) {
  std::printf("| parameter | fits | coverage of the 95 %% interval | bias (relative) | spread (relative RMS) "
              "| mean half-width (relative) |\n| --- | --- | --- | --- | --- | --- |\n");
  for (const std::string& key : keys) {
    const auto found = tallies.by_parameter.find(key);
    if (found != tallies.by_parameter.end() && found->second.fits > 0) PrintRow(key, found->second, "%.1f %%");
  }
  std::printf("\n| motor / parameter | fits | coverage | bias | spread | half-width |\n"
              "| --- | --- | --- | --- | --- | --- |\n");
  for (const auto& [name, t] : tallies.by_motor) PrintRow(name, t, "%.0f %%");
}

}  // namespace coilspin::bench
