#pragma once
// A synthetic bench log as the simulator writes it: SI channels sampled at the
// logger's instants. Empty channels were not logged.

#include <vector>

namespace coilspin::model {

struct SampledLog {
  std::vector<double> time_s;
  std::vector<double> voltage_V;
  std::vector<double> current_A;
  std::vector<double> speed_rad_s;
  std::vector<double> torque_N_m;
  std::vector<double> temperature_degC;
};

}  // namespace coilspin::model
