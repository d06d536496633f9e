#pragma once
// The fitted motor as a SPICE subcircuit, by the electromechanical analogy in
// which a node voltage is a speed and a branch current a torque:
//   pins p, n   the motor terminals (+, −);
//   pin shaft   V(shaft) to ground is the speed in rad/s (1 V ≙ 1 rad/s); the
//               current drawn out of it is the load torque in N·m (1 A ≙ 1 N·m).
// Inside (docs/exports.md):
//   winding   p → R → L → brush drop Vb·tanh(i/w_i) → back-EMF Ke·V(shaft) → n
//   shaft     Kt·i injected; J as a capacitance to ground (1 F ≙ 1 kg·m²); B as a
//             conductance (1 S ≙ 1 N·m·s/rad); Tc·tanh(ω/w_ω) drawn out
// so that  v = R·i + L·di/dt + Ke·ω + Vb·sgn(i)  and  J·dω/dt = Kt·i − B·ω −
// Tc·sgn(ω) − τ_load, with sgn smoothed (src/model/smooth_sign.h). The first
// line is `.subckt NAME p n shaft`; elements are Berkeley SPICE 3 R, L, C, E,
// F, V and B (behavioural) sources, run by ngspice. Terms the result does not
// determine (B, Tc, Vb) are left out, and the comments say so.

#include <string>

#include "fitters/core/motor_estimate.h"
#include "src/output/export_source.h"
#include "src/result/model_parameters.h"

namespace coilspin::output {

// `parameters` must be complete (ModelParameters::complete()).
std::string SpiceSubcircuit(const MotorEstimate& estimate, const result::ModelParameters& parameters,
                            const std::string& name, const ExportSource& source);

}  // namespace coilspin::output
