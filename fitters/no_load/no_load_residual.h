#pragma once
// No-load plateaus (free shaft, settled: di/dt = 0, dω/dt = 0). On plateau j:
//   electrical:  v̄_j = R·f·ī_j + Vb·sgn(ī_j) + Ke·ω̄_j
//                (f = (k + θ)/(k + θ_ref): R is shared at the reference temperature)
//   mechanical:  Kt·ī_j = B·ω̄_j + Tc·sgn(ω̄_j)   (the current feeds only friction)
// with ī_j the logged mean less the current sensor's zero reading i_z
// (src/model/sensor_offsets.h). Residuals: measured − model, in V and in A.

#include <vector>

namespace coilspin::no_load {

struct NoLoadVoltageResidual {
  std::vector<double> mean_voltage_V;
  std::vector<double> mean_current_A;
  std::vector<double> mean_speed_rad_s;
  double temperature_factor = 1.0;  // f

  // p[0] = R at θ_ref [ohm], p[1] = Vb [V], p[2] = Ke [V·s/rad], p[3] = i_z [A]
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    for (std::size_t j = 0; j < mean_voltage_V.size(); ++j) {
      const double direction = mean_current_A[j] > 0.0 ? 1.0 : -1.0;  // sgn(ī_j)
      // r_j = v̄_j − (R·f·(ī_j − i_z) + Vb·sgn(ī_j) + Ke·ω̄_j)
      residual[j] = mean_voltage_V[j] - (*p[0] * temperature_factor * (mean_current_A[j] - *p[3]) +
                                         *p[1] * direction + *p[2] * mean_speed_rad_s[j]);
    }
    return true;
  }
};

struct NoLoadCurrentResidual {
  std::vector<double> mean_current_A;
  std::vector<double> mean_speed_rad_s;

  // p[0] = Kt [N·m/A], p[1] = B [N·m·s/rad], p[2] = Tc [N·m], p[3] = i_z [A]
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    for (std::size_t j = 0; j < mean_current_A.size(); ++j) {
      const double direction = mean_speed_rad_s[j] > 0.0 ? 1.0 : -1.0;  // sgn(ω̄_j)
      // r_j = (ī_j − i_z) − (B·ω̄_j + Tc·sgn(ω̄_j))/Kt
      residual[j] = mean_current_A[j] - *p[3] - (*p[1] * mean_speed_rad_s[j] + *p[2] * direction) / *p[0];
    }
    return true;
  }
};

}  // namespace coilspin::no_load
