#pragma once
// Assumptions the result states next to the numbers that rest on them.
//
// A fit can only determine what its logs separate. Where the model needs a
// value the logs cannot check, the fit holds it (Vb = 0 when no plateaus at two
// current levels separate it from R; Kt = Ke when no torque column measures Kt)
// and the parameters that absorb it say so in their "assumes", with the size of
// the effect where the data bound it:
//   - Vb held at 0: plateaus give v̄ = R·ī + Vb, so least squares through the
//     origin returns R + Vb·Σ|ī|/Σī² (normal equations of the line): R reads high
//     by Σ|ī|/Σī² per volt of brush drop. From a step capture or a free-shaft
//     step alone, R·i∞ = V − Vb at the settled current i∞: 1/i∞ per volt. A
//     free-shaft step's Ke absorbs the rest, Vb/ω∞ per volt.
//   - Kt = Ke (SI): the ideal machine's power balance (Kt·i·ω = Ke·ω·i); real
//     machines differ by a few per cent (iron losses, armature reaction — common
//     practice), and J, B and Tc scale with the Kt used.
// Physical bounds: R, L, J, B, Tc and Vb cannot be negative, so an interval that
// reaches below 0 is cut there (the truth lies above it in any case) and says so.

#include "fitters/core/motor_estimate.h"
#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "fitters/step/step_fit.h"

namespace coilspin::joint {

// R (and a step's Ke) assume Vb = 0 when it was held there.
void NoteBrushDropHeldAtZero(const locked_rotor::LockedRotorPlan& lr, const step::StepTestPlan& st,
                             MotorEstimate* estimate);

// Kt, and J, B, Tc through it, assume Kt = Ke when Kt's basis is equal-to-Ke.
void NoteTorqueConstantTakenAsBackEmf(MotorEstimate* estimate);

// Intervals of parameters that cannot be negative start at 0 at the lowest.
void CutIntervalsAtPhysicalBounds(MotorEstimate* estimate);

}  // namespace coilspin::joint
