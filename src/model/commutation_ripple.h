#pragma once
// Commutation ripple as the logger sees it (docs/bench-artefacts.md): a
// brushed motor's current, and its terminal voltage while the back-EMF drives
// the terminals, carry a ripple of N·(shaft turns) cycles, N the commutator
// segments per turn. Modelled at the measurement, relative to the value:
//     x_logged = x·(1 + a·cos(N·θ + φ0)),   θ the motor shaft angle [rad].
// The motor's dynamics see the mean value (the ripple averages out over a
// segment). A locked rotor has a constant θ and is logged without ripple.

#include "src/model/bench_artefacts.h"

namespace coilspin::model {

// True when N > 0 and a > 0.
bool HasRipple(const CommutationRipple& ripple);

// 1 + a·cos(N·θ + φ0).
double RippleFactor(const CommutationRipple& ripple, double shaft_angle_rad);

// Throws std::invalid_argument unless N ≥ 0, a in [0, 1) and φ0 finite.
void ValidateRipple(const CommutationRipple& ripple);

}  // namespace coilspin::model
