#include "src/ingest/whole_count_step.h"

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
  for (double reading : position_rad) {
    const double counts = (reading - position_rad.front()) / step;  // (θ_k − θ_0)/q
    if (std::fabs(counts - std::round(counts)) > kWholeCountTolerance) return std::nullopt;
  }
  return step;
}

}  // namespace coilspin
