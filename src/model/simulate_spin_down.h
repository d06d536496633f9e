#pragma once
// Forward simulation of the spin-down (retardation) bench.
//
// Run: from rest the supply V_s (behind the bench's R_s) drives the free shaft
// for run_s, towards its no-load point. At t_off = round(run_s/Δ)·Δ, a sample
// instant, the supply is disconnected and the rotor coasts for coast_s:
//   open circuit (the default): i = 0, J·dω/dt = −B·ω − Tc·sgn(ω), so the rotor
//     slows to rest (src/model/coast_closed_form.h) and the terminal voltage is
//     the back-EMF v = Ke·ω; the first coast sample already logs i = 0, v = Ke·ω;
//   a braking resistor R_brake across the terminals: the armature keeps
//     conducting, L·di/dt = −(R + R_brake)·i − Ke·ω − Vb·sgn(i) and
//     v = −R_brake·i, settling near i = −Ke·ω/(R + R_brake): the electrical
//     braking torque Kt·i adds to friction. A fitter that assumes an open
//     circuit should notice the current (or the faster decay).
// The model, rules and integrator are those of src/model/free_shaft_dynamics.h;
// timing, channels and noise those of src/model/free_shaft_bench.h.
//
// Logged: time, the shaft's speed and/or position at the logged shaft, and on
// request the terminal voltage and current (run and coast).
//
// Throws std::invalid_argument for a plan or motor that cannot be simulated
// (a run or coast shorter than one sample, a negative or non-finite braking
// resistance, and whatever the integrator and the bench reject).

#include <optional>

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/model/sampled_log.h"
#include "src/model/shaft_channels.h"

namespace coilspin::model {

struct SpinDownPlan {
  double supply_V = 12.0;     // V_s during the run
  double run_s = 2.0;         // from rest to t_off
  double coast_s = 3.0;       // logged after t_off
  double sample_period_s = 1e-3;
  bool log_voltage = true;    // terminal voltage (the back-EMF Ke·ω while coasting open)
  bool log_current = true;
  std::optional<double> brake_resistance_ohm;  // none: open circuit; else R_brake across the terminals
  ShaftChannels shaft = ShaftChannels::kSpeed;
};

SampledLog SimulateSpinDown(const MotorParameters& motor, const SpinDownPlan& plan,
                            const BenchConditions& bench);

// t_off = round(run_s/Δ)·Δ, the instant the supply is disconnected (the time of
// the first coast sample). Throws as SimulateSpinDown for a bad run_s or Δ.
double SpinDownPowerOffTime_s(const SpinDownPlan& plan);

}  // namespace coilspin::model
