#include "fitters/core/quantisation.h"

#include <cmath>

namespace coilspin::core {

std::vector<Eigen::VectorXd> QuantisationErrors(const std::vector<double>& modelled, double step) {
  std::vector<Eigen::VectorXd> errors;
  if (!(step > 0.0) || modelled.empty()) return errors;
  const Eigen::Index n = static_cast<Eigen::Index>(modelled.size());
  for (int j = 0; j < kQuantisationPhases; ++j) {
    const double phase = (j + 0.5) / kQuantisationPhases;  // φ_j
    Eigen::VectorXd e(n);
    for (Eigen::Index k = 0; k < n; ++k) {
      const double moved = modelled[static_cast<std::size_t>(k)] - modelled.front();  // Δ̂_k
      e(k) = step * std::floor(moved / step + phase) - moved;  // e_k = q·floor(Δ_k/q + φ) − Δ_k
    }
    errors.push_back(std::move(e));
  }
  return errors;
}

}  // namespace coilspin::core
