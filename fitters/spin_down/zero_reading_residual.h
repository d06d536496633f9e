#pragma once
// A sensor read where the quantity is known to be zero: the current of a
// coasting motor with open terminals (src/model/sensor_offsets.h). Each reading
// is the sensor's zero reading plus noise:
//     r_k = i_k − i_z      [A]
// so the group estimates i_z, and its noise σ and autocorrelation (a coloured
// sensor's noise is widened for like any other group's) give its uncertainty.

#include <vector>

namespace coilspin::spin_down {

struct ZeroReadingResidual {
  std::vector<double> readings;

  // p[0] = i_z [A]
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    for (std::size_t k = 0; k < readings.size(); ++k) residual[k] = readings[k] - *p[0];  // r_k = i_k − i_z
    return true;
  }
};

}  // namespace coilspin::spin_down
