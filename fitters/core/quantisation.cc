#include "fitters/core/quantisation.h"

#include <cmath>

namespace coilspin::core {

int VisitQuantisationErrors(const std::vector<double>& modelled, double step,
                            const std::function<void(const Eigen::VectorXd& error)>& visit) {
  if (!(step > 0.0) || modelled.empty()) return 0;
  const Eigen::Index n = static_cast<Eigen::Index>(modelled.size());
  Eigen::VectorXd e(n);
  for (int j = 0; j < kQuantisationPhases; ++j) {
    const double phase = (j + 0.5) / kQuantisationPhases;  // φ_j
    for (Eigen::Index k = 0; k < n; ++k) {
      const double moved = modelled[static_cast<std::size_t>(k)] - modelled.front();  // Δ̂_k
      e(k) = step * std::floor(moved / step + phase) - moved;  // e_k = q·floor(Δ_k/q + φ) − Δ_k
    }
    visit(e);
  }
  return kQuantisationPhases;
}

}  // namespace coilspin::core
