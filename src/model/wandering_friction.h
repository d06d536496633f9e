#pragma once
// A Coulomb friction that wanders slowly (docs/bench-artefacts.md): a bearing
// whose drag changes as its grease warms and moves, absent from coilspin's
// model, which takes Tc constant. The wander δ(t) is an Ornstein–Uhlenbeck
// process, dδ = −δ/τ_δ·dt + σ_δ·√(2/τ_δ)·dW, stationary with σ_δ and
// correlation time τ_δ. Sampled every Δ it is exactly the AR(1) process
//     δ_0 = σ_δ·z_0,   δ_k = ρ·δ_(k−1) + √(1 − ρ²)·σ_δ·z_k,   ρ = e^(−Δ/τ_δ)
// (src/model/ar1_noise.h; Gillespie, Phys. Rev. E 54, 2084 (1996), the exact
// updating formula). The free-shaft bench holds Tc + δ_k, clipped at 0, over
// [t_k, t_k+1).

#include <cstddef>
#include <cstdint>
#include <vector>

#include "src/model/bench_artefacts.h"

namespace coilspin::model {

// True when σ_δ > 0.
bool HasFrictionWander(const MechanicalDiscrepancy& discrepancy);

// δ_0 … δ_(samples−1) from `seed`'s friction stream (src/model/noise_streams.h);
// empty without wander.
std::vector<double> FrictionWander_N_m(const MechanicalDiscrepancy& discrepancy, double sample_period_s,
                                       std::size_t samples, std::uint64_t seed);

// Throws std::invalid_argument unless c ≥ 0, σ_δ ≥ 0 and, with σ_δ > 0, τ_δ > 0 (all finite).
void ValidateDiscrepancy(const MechanicalDiscrepancy& discrepancy);

}  // namespace coilspin::model
