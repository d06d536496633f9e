#pragma once
// The fitted motor's state-space model (src/model/state_space.h) as JSON,
// format "coilspin.state-space/1" (docs/exports.md): continuous time, SI,
//   dx/dt = A·x + B·u_eff,  y = C·x + D·u_eff,
//   u_eff[k] = u[k] + Σ over offsets entering input k of coefficient·value·sgn(sign_of),
// states [current, speed], inputs [voltage, load_torque], outputs [current, speed].
// The offsets are the brush drop (−Vb·sgn(i) on the voltage) and Coulomb
// friction (+Tc·sgn(ω) on the load torque).

#include <string>

#include "src/model/state_space.h"
#include "src/output/export_source.h"
#include "src/result/model_parameters.h"

namespace coilspin::output {

inline constexpr const char* kStateSpaceFormat = "coilspin.state-space/1";

std::string StateSpaceJson(const model::StateSpace& system, const result::ModelParameters& parameters,
                           const ExportSource& source);

}  // namespace coilspin::output
