#pragma once
// How a simulated bench differs from an ideal one: supply internal resistance,
// measurement noise, ADC quantisation, winding heating. Noise levels are
// standard deviations (σ) of white Gaussian noise added to each logged channel.

#include <cstdint>

namespace coilspin::model {

struct BenchConditions {
  double supply_resistance_ohm = 0.0;  // terminal voltage v = V_supply − R_s·i
  double voltage_noise_sigma_V = 0.0;
  double current_noise_sigma_A = 0.0;
  double voltage_lsb_V = 0.0;          // ADC step of the voltage channel; 0 = not quantised
  double current_lsb_A = 0.0;          // ADC step of the current channel; 0 = not quantised
  double winding_temperature_degC = 25.0;        // at the start of the test
  double heating_per_plateau_K = 0.0;            // winding temperature rise from one plateau to the next
  double resistance_reference_temperature_degC = 25.0;  // the temperature at which R is given
  std::uint64_t seed = 1;              // noise is reproducible for a given seed
};

}  // namespace coilspin::model
