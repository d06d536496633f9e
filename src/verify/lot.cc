#include "src/verify/lot.h"

#include <algorithm>
#include <cmath>

#include "src/verify/lot_statistics.h"

namespace coilspin::verify {
namespace {

void Count(Verdict v, int* pass, int* fail, int* inconclusive, int* not_tested) {
  switch (v) {
    case Verdict::kPass:
      ++*pass;
      break;
    case Verdict::kFail:
      ++*fail;
      break;
    case Verdict::kInconclusive:
      ++*inconclusive;
      break;
    case Verdict::kNotTested:
      ++*not_tested;
      break;
  }
}

}  // namespace

Lot SummariseLot(const std::vector<MotorCheck>& motors) {
  Lot lot;
  lot.motors = static_cast<int>(motors.size());
  if (motors.empty()) return lot;
  const std::size_t line_count = motors.front().lines.size();
  for (std::size_t k = 0; k < line_count; ++k) {
    LotLine line;
    line.key = motors.front().lines[k].key;
    line.unit = motors.front().lines[k].unit;
    const Band& band = motors.front().lines[k].line.band;
    std::vector<double> values;
    std::vector<std::size_t> owner;  // motor index of each value
    for (std::size_t m = 0; m < motors.size(); ++m) {
      const LineCheck& check = motors[m].lines[k];
      Count(check.decision.verdict, &line.pass, &line.fail, &line.inconclusive, &line.not_tested);
      if (check.value) {
        values.push_back(*check.value);
        owner.push_back(m);
      }
    }
    line.measured = static_cast<int>(values.size());
    line.robust_z.assign(motors.size(), std::nullopt);
    if (!values.empty()) {
      line.mean = Mean(values);
      line.std = SampleStandardDeviation(values);
      line.min = *std::min_element(values.begin(), values.end());
      line.max = *std::max_element(values.begin(), values.end());
      line.cpk = ProcessCapability(band, values);
      if (const std::optional<std::vector<double>> z = ModifiedZScores(values)) {
        for (std::size_t i = 0; i < values.size(); ++i) {
          line.robust_z[owner[i]] = (*z)[i];
          if (std::fabs((*z)[i]) > kModifiedZOutlier) line.outliers.push_back(motors[owner[i]].result_file);
        }
      }
    }
    lot.pass += line.pass;
    lot.fail += line.fail;
    lot.inconclusive += line.inconclusive;
    lot.not_tested += line.not_tested;
    lot.lines.push_back(std::move(line));
  }
  for (const MotorCheck& m : motors)
    if (m.Worst() == Verdict::kPass) ++lot.motors_passing;
  return lot;
}

}  // namespace coilspin::verify
