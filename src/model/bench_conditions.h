#pragma once
// How a simulated bench differs from an ideal one: supply internal resistance,
// measurement noise, ADC quantisation, winding heating, and how the shaft is
// read (an encoder, a gearbox between the motor and the sensor). Noise levels
// are standard deviations (σ) of the Gaussian noise added to each logged
// channel (white unless the channel's sensor sets a lag-1 correlation); speed
// and position are logged at the output of the gearbox. A real rig's other
// artefacts (src/model/bench_artefacts.h, docs/bench-artefacts.md) are all off
// by default.

#include <cstdint>

#include "src/model/bench_artefacts.h"

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
  double speed_noise_sigma_rad_s = 0.0;  // on the logged speed, at the logged shaft
  double torque_noise_sigma_N_m = 0.0;   // on the logged torque (load cell)
  int encoder_counts_per_rev = 0;        // 0 = no encoder: position is logged exactly
  // Where the shaft rests within a count when the log starts, as a fraction of a
  // count in [0, 1): 0 puts it exactly on an edge; a real shaft rests anywhere.
  double encoder_start_phase = 0.0;
  double gear_ratio = 1.0;               // motor turns per output turn: logged ω_out = ω/N, θ_out = θ/N
  std::uint64_t seed = 1;              // noise is reproducible for a given seed
  // A real rig (src/model/bench_artefacts.h): each sensor's coloured noise,
  // offset, dropouts and spikes (in the channel's unit, the speed at the logged shaft) ...
  SensorArtefacts voltage_sensor;
  SensorArtefacts current_sensor;
  SensorArtefacts speed_sensor;
  SensorArtefacts torque_sensor;
  double speed_lsb_rad_s = 0.0;          // ADC step of the speed channel; 0 = not quantised
  double torque_lsb_N_m = 0.0;           // ADC step of the torque channel; 0 = not quantised
  // ... commutation ripple and mechanical discrepancy (free shaft), winding warm-up (every kind).
  CommutationRipple ripple;
  WindingWarmUp warm_up;
  MechanicalDiscrepancy discrepancy;
};

}  // namespace coilspin::model
