#include "src/model/wandering_friction.h"

#include <cmath>
#include <stdexcept>

#include "src/model/ar1_noise.h"
#include "src/model/noise_streams.h"

namespace coilspin::model {

bool HasFrictionWander(const MechanicalDiscrepancy& discrepancy) {
  return discrepancy.friction_wander_sigma_N_m > 0.0;
}

std::vector<double> FrictionWander_N_m(const MechanicalDiscrepancy& discrepancy, double sample_period_s,
                                       std::size_t samples, std::uint64_t seed) {
  std::vector<double> wander;
  if (!HasFrictionWander(discrepancy)) return wander;
  const double rho = std::exp(-sample_period_s / discrepancy.friction_wander_time_s);  // ρ = e^(−Δ/τ_δ)
  Ar1Noise process(seed, kFrictionWanderStream, discrepancy.friction_wander_sigma_N_m, rho);
  wander.resize(samples);
  for (double& delta : wander) delta = process.Next();
  return wander;
}

void ValidateDiscrepancy(const MechanicalDiscrepancy& discrepancy) {
  const auto finite_non_negative = [](double x) { return std::isfinite(x) && x >= 0.0; };
  if (!finite_non_negative(discrepancy.drag_N_m_s2_per_rad2)) {
    throw std::invalid_argument("mechanical discrepancy: the drag coefficient must be >= 0");
  }
  if (!finite_non_negative(discrepancy.friction_wander_sigma_N_m)) {
    throw std::invalid_argument("mechanical discrepancy: the friction wander's sigma must be >= 0");
  }
  if (HasFrictionWander(discrepancy) &&
      !(std::isfinite(discrepancy.friction_wander_time_s) && discrepancy.friction_wander_time_s > 0.0)) {
    throw std::invalid_argument("mechanical discrepancy: the friction wander's correlation time must be > 0");
  }
}

}  // namespace coilspin::model
