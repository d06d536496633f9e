#pragma once
// Locked-rotor plateaus (ω = 0, di/dt = 0): on each settled plateau j
//     v̄_j = R·f_j·ī_j + Vb·sgn(ī_j)
// with f_j = (k + θ_j)/(k + θ_ref) the copper temperature factor that carries
// R from the reference temperature θ_ref to the plateau's winding temperature
// θ_j (f_j = 1 when no temperature is known), and ī_j the logged mean less the
// current sensor's zero reading i_z (src/model/sensor_offsets.h). Residual:
// measured − model, in V.

#include <vector>

namespace coilspin::locked_rotor {

struct PlateauVoltageResidual {
  std::vector<double> mean_voltage_V;
  std::vector<double> mean_current_A;
  std::vector<double> temperature_factor;  // f_j

  // p[0] = R at θ_ref [ohm], p[1] = Vb [V], p[2] = i_z [A]
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    const T& resistance_ohm = *p[0];
    const T& brush_drop_V = *p[1];
    const T& zero_A = *p[2];
    for (std::size_t j = 0; j < mean_voltage_V.size(); ++j) {
      const double direction = mean_current_A[j] > 0.0 ? 1.0 : -1.0;  // sgn(ī_j)
      // r_j = v̄_j − (R·f_j·(ī_j − i_z) + Vb·sgn(ī_j))
      residual[j] = mean_voltage_V[j] - (resistance_ohm * temperature_factor[j] * (mean_current_A[j] - zero_A) +
                                         brush_drop_V * direction);
    }
    return true;
  }
};

}  // namespace coilspin::locked_rotor
