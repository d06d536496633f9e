#pragma once
// PI gains for the usual cascade of a DC-motor drive: an inner current loop
// (voltage command from the current error) and an outer speed loop (current
// command from the speed error), both in parallel form u = kp·e + ki·∫e dt,
// from the fitted model  L·di/dt = v − R·i − Ke·ω,  J·dω/dt = Kt·i − B·ω
// (docs/exports.md, "Tuning"). Friction Tc and brush drop Vb are constant
// disturbances to these loops; the integral terms remove them.
//
// Current loop, pole–zero cancellation: the PI zero ki/kp = R/L cancels the
// winding's pole, so with the back-EMF left aside the open loop is ωc/s and the
// closed loop 1/(s/ωc + 1):
//   kp = L·ωc [V/A],  ki = R·ωc [V/(A·s)].
// Speed loop, SIMC (Skogestad 2003, "Simple analytic rules for model reduction
// and PID controller tuning", J. Process Control 13, 291–309; rules recalled
// from memory): the plant from current command to speed is
//   Kt/(J·s + B) · 1/(s/ωc + 1),
// a first-order process k/(τ1·s + 1), k = Kt/B, τ1 = J/B, with the closed
// current loop as a lag τ2 = 1/ωc. Skogestad's half rule moves half of τ2 into
// an effective delay and half onto τ1:  θ = τ2/2,  τ1' = τ1 + τ2/2.  SIMC with
// the desired closed-loop time constant τc = 1/ωs:
//   Kc = τ1'/(k·(τc + θ)) = (J + B·τ2/2)/(Kt·(τc + θ))   [A·s/rad]
//   τI = min(τ1', 4·(τc + θ)),   kp = Kc,  ki = Kc/τI    [A/rad]
// (B = 0 is the integrating case of the same rules: Kc = J/(Kt·(τc + θ)),
// τI = 4·(τc + θ)).
//
// Default bandwidths, when none is given, from the fitted time constants:
//   ωc = 5/τe (τe = L/R): the closed current loop five times faster than the
//        winding alone (common practice: fast enough to decouple the loops,
//        slow enough that the first voltage step kp·Δi = 5·R·Δi stays within a
//        few times the drop the current needs in the end);
//   ωs = ωc/10 (common practice, from memory: the inner loop of a cascade
//        5–10 times faster than the outer).
// The drive's sample rate and PWM delay are not in the model; both cost phase
// (ω·T_delay at the crossover) and bound the bandwidths a drive can use.

#include "src/model/motor_parameters.h"

namespace coilspin::tune {

struct PiGains {
  double kp = 0.0;
  double ki = 0.0;
};

inline constexpr double kCurrentBandwidthOverWindingPole = 5.0;   // ωc·τe, above
inline constexpr double kCurrentOverSpeedBandwidth = 10.0;        // ωc/ωs, above

double DefaultCurrentBandwidth_rad_s(const model::MotorParameters& p);
double DefaultSpeedBandwidth_rad_s(double current_bandwidth_rad_s);

PiGains CurrentLoopGains(const model::MotorParameters& p, double current_bandwidth_rad_s);
PiGains SpeedLoopGains(const model::MotorParameters& p, double current_bandwidth_rad_s,
                       double speed_bandwidth_rad_s);

}  // namespace coilspin::tune
