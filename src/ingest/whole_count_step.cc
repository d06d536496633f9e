#include "src/ingest/whole_count_step.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace coilspin {

std::optional<double> WholeCountStep(const std::vector<double>& position_rad) {
  if (position_rad.size() < 2) return std::nullopt;
  double step = std::numeric_limits<double>::infinity();
  for (std::size_t k = 1; k < position_rad.size(); ++k) {
    const double change = std::fabs(position_rad[k] - position_rad[k - 1]);
    if (change > 0.0 && change < step) step = change;
  }
  if (!std::isfinite(step)) return std::nullopt;
  // The smallest change carries the rounding of two written readings; refined on
  // ever larger displacements d = n·q (q = d/n), its relative error shrinks as 1/d
  // before the check below reaches the far end of the log.
  std::vector<double> displacement;
  for (double reading : position_rad) displacement.push_back(std::fabs(reading - position_rad.front()));
  std::sort(displacement.begin(), displacement.end());
  for (double d : displacement) {
    const double counts = std::round(d / step);
    if (counts < 1.0) continue;
    if (std::fabs(d / step - counts) > kWholeCountTolerance) return std::nullopt;
    step = d / counts;
  }
  return step;
}

}  // namespace coilspin
