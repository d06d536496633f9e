#pragma once
// A lot of motors verified against one datasheet: per line, the spread of the
// measured values (lot_statistics.h), their capability against the line's
// band, the outliers by robust z-score, and the count of each verdict.
// Statistics use the motors that have a value for the line (not-tested ones
// are counted, not measured).

#include <optional>
#include <string>
#include <vector>

#include "src/verify/motor_check.h"

namespace coilspin::verify {

struct LotLine {
  std::string key;
  std::string unit;                 // SI
  int measured = 0;                 // motors with a value
  double mean = 0.0, std = 0.0, min = 0.0, max = 0.0;
  std::optional<double> cpk;
  std::vector<std::optional<double>> robust_z;  // per motor, in the lot's order; none where not measured
  std::vector<std::string> outliers;            // result files of the motors with |M| > 3.5
  int pass = 0, fail = 0, inconclusive = 0, not_tested = 0;
};

struct Lot {
  int motors = 0;
  std::vector<LotLine> lines;  // the sheet's order
  int pass = 0, fail = 0, inconclusive = 0, not_tested = 0;  // over every line of every motor
  int motors_passing = 0;      // motors whose every line passes
};

// `motors` checked against the same sheet (their lines in the sheet's order).
Lot SummariseLot(const std::vector<MotorCheck>& motors);

}  // namespace coilspin::verify
