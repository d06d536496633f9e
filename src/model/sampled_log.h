#pragma once
// A synthetic bench log as the simulator writes it: SI channels sampled at the
// logger's instants. Empty channels were not logged. Speed and position are
// those of the logged shaft (the gearbox output when there is a gearbox); an
// encoder's position is a whole number of counts times 2π/cpr.

#include <vector>

namespace coilspin::model {

struct SampledLog {
  std::vector<double> time_s;
  std::vector<double> voltage_V;
  std::vector<double> current_A;
  std::vector<double> speed_rad_s;
  std::vector<double> position_rad;
  std::vector<double> torque_N_m;
  std::vector<double> temperature_degC;
};

}  // namespace coilspin::model
