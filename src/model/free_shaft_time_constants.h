#pragma once
// Time constants of the free-shaft motor (src/model/free_shaft_dynamics.h),
// from its linear part in (i, ω) with the loop resistance R_t = R + R_s:
//     d/dt [i, ω] = A·[i, ω] + input,   A = [[−R_t/L, −Ke/L], [Kt/J, −B/J]]
//     tr A = −(R_t/L + B/J),   det A = (R_t·B + Kt·Ke)/(L·J)
//     λ = tr/2 ± √(tr²/4 − det)
// The sign terms (Vb, Tc) shift the input, not A, so they leave these alone.
// With the terminals open only J·dω/dt = −B·ω remains: λ = −B/J.
//
// fastest_s is what a fixed-step integrator must resolve: the smallest of
// L/R_t, the mechanical time constant J·R_t/(Kt·Ke) (docs/methods.md §6), J/B
// and 1/|λ|max. slowest_s = 1/min|Re λ| is how long the slowest transient
// takes to shrink by a factor e (settling). A time constant that does not
// exist (B = 0, Kt·Ke = 0, …) is +∞; both are +∞ for an open circuit with B = 0.

#include "src/model/free_shaft_dynamics.h"
#include "src/model/motor_parameters.h"

namespace coilspin::model {

struct FreeShaftTimeConstants {
  double fastest_s = 0.0;
  double slowest_s = 0.0;
};

// Expects validated parameters (L > 0 with a source, J > 0, R + R_s > 0).
FreeShaftTimeConstants TimeConstantsOf(const MotorParameters& motor, const FreeShaftInput& input);

// The drag's local time constant at speed ω, J/(2c·|ω|) (the drag c·ω·|ω|
// linearised: d(c·ω·|ω|)/dω = 2c·|ω|); +∞ when c = 0 or ω = 0. Not part of
// TimeConstantsOf, which describes the linear model the fitters use.
double DragTimeConstant_s(const MotorParameters& motor, const FreeShaftInput& input, double speed_rad_s);

}  // namespace coilspin::model
