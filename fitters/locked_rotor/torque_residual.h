#pragma once
// Locked-rotor torque column (a load cell on an arm holds the rotor): on each
// settled plateau j the held torque is
//     τ̄_j = Kt·ī_j + τ0
// where the offset τ0 takes up the load cell's zero and any static friction at
// that rotor position (one τ0 per log). This measures Kt independently of Ke.
// Residual: measured − model, in N·m.

#include <vector>

namespace coilspin::locked_rotor {

struct PlateauTorqueResidual {
  std::vector<double> mean_torque_N_m;
  std::vector<double> mean_current_A;

  // p[0] = Kt [N·m/A], p[1] = τ0 [N·m]
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    for (std::size_t j = 0; j < mean_torque_N_m.size(); ++j)
      residual[j] = mean_torque_N_m[j] - (*p[0] * mean_current_A[j] + *p[1]);  // r_j = τ̄_j − (Kt·ī_j + τ0)
    return true;
  }
};

}  // namespace coilspin::locked_rotor
