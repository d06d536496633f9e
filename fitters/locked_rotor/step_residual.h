#pragma once
// Locked-rotor step capture (ω = 0):  L·di/dt = v(t) − R·i − Vb·sgn(i)
// with the LOGGED terminal voltage v as the input, held between samples
// (zero-order hold). Between t_k and t_{k+1} the solution is exact:
//     î_{k+1} = a_k·î_k + (1 − a_k)·u_k / R,   a_k = exp(−(t_{k+1} − t_k)·R/L)
//     u_k = v_k − Vb·sgn(î_k) while current flows; from rest (î_k = 0)
//     u_k = v_k − Vb·sgn(v_k) when |v_k| > Vb, else 0   (brushes conduct only above Vb)
// and a current that crosses zero inside an interval does so at the exact
// instant, then restarts under the from-rest rule (it stays at zero when
// |v_k| ≤ Vb: the brush drop opposes the current, it cannot drive it).
// The recursion starts from î_0 = i0 (a nuisance parameter). Residual:
// (i_k − i_z) − î_k, in A, i_z the current sensor's zero reading (src/model/sensor_offsets.h).
// Using the logged v rather than a nominal supply voltage keeps a supply's
// internal resistance (the terminal voltage sags as current rises) out of L.

#include <cmath>
#include <vector>

namespace coilspin::locked_rotor {

// u = v − Vb·sgn(v) above the brush drop, 0 below it.
template <typename T>
T DriveVoltage(double voltage_V, const T& brush_drop_V) {
  if (T(voltage_V) > brush_drop_V) return T(voltage_V) - brush_drop_V;
  if (T(voltage_V) < -brush_drop_V) return T(voltage_V) + brush_drop_V;
  return T(0.0);
}

// u = v − Vb·sgn(i) while current flows; the from-rest rule when it does not.
template <typename T>
T FlowingDrive(double voltage_V, const T& current_A, const T& brush_drop_V) {
  if (current_A > 0.0) return T(voltage_V) - brush_drop_V;
  if (current_A < 0.0) return T(voltage_V) + brush_drop_V;
  return DriveVoltage(voltage_V, brush_drop_V);
}

// One sample interval Δ of the held voltage v, exactly, including a zero
// crossing of the current inside it:  i(t) = î·e^(−t/τ) + (u/R)(1 − e^(−t/τ)),
// τ = L/R; a crossing under drive u happens at t* = τ·ln(1 − R·î/u). After it
// the current restarts from rest under the from-rest rule (or stays at zero
// when |v| ≤ Vb).
//
// At rest within the noise (|v| and |î| both inside their noise bands, as
// before a step) the drive is v itself: applying the brush rule there would
// let Vb "explain" the logged voltage's noise and bias Vb and R.
struct RestBand {
  double voltage_V = 0.0;
  double current_A = 0.0;
};

template <typename T>
bool AtRest(double voltage_V, const T& current_A, const RestBand& rest) {
  using std::abs;
  return std::fabs(voltage_V) <= rest.voltage_V && abs(current_A) <= T(rest.current_A);
}

// The drive u of the current while the rotor does not turn: v inside the rest
// bands, else the brush rule.
template <typename T>
T HeldRotorDrive(double voltage_V, const T& current_A, const T& brush_drop_V, const RestBand& rest) {
  return AtRest(voltage_V, current_A, rest) ? T(voltage_V) : FlowingDrive(voltage_V, current_A, brush_drop_V);
}

template <typename T>
T Advance(double interval_s, double voltage_V, const T& current_A, const T& resistance_ohm, const T& inductance_H,
          const T& brush_drop_V, const RestBand& rest = {}) {
  using std::exp;
  using std::log;
  using std::abs;
  const T tau_s = inductance_H / resistance_ohm;
  const bool at_rest = AtRest(voltage_V, current_A, rest);
  const T drive_V = HeldRotorDrive(voltage_V, current_A, brush_drop_V, rest);
  const T a = exp(-interval_s / tau_s);
  const T next_A = a * current_A + (1.0 - a) * drive_V / resistance_ohm;
  const bool crosses = (current_A > 0.0 && next_A < 0.0) || (current_A < 0.0 && next_A > 0.0);
  if (!crosses || at_rest) return next_A;
  const T crossing_s = tau_s * log(1.0 - resistance_ohm * current_A / drive_V);  // t*
  const T rest_drive_V = DriveVoltage(voltage_V, brush_drop_V);
  return (1.0 - exp(-(interval_s - crossing_s) / tau_s)) * rest_drive_V / resistance_ohm;
}

struct StepCurrentResidual {
  const std::vector<double>* time_s;
  const std::vector<double>* voltage_V;
  const std::vector<double>* current_A;
  double temperature_factor = 1.0;  // f = (k + θ)/(k + θ_ref), 1 when unknown
  RestBand rest;                    // noise bands of v and i around zero

  // p[0] = R at θ_ref [ohm], p[1] = L [H], p[2] = Vb [V], p[3] = i0 [A], p[4] = i_z [A]
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    using std::exp;
    const T resistance_ohm = *p[0] * temperature_factor;
    const T& inductance_H = *p[1];
    const T& brush_drop_V = *p[2];
    T modelled_current_A = *p[3];
    const T& zero_A = *p[4];
    const std::vector<double>& t = *time_s;
    const std::vector<double>& v = *voltage_V;
    const std::vector<double>& i = *current_A;
    const std::size_t n = t.size();
    for (std::size_t k = 0; k < n; ++k) {
      residual[k] = i[k] - zero_A - modelled_current_A;  // r_k = (i_k − i_z) − î_k
      if (k + 1 == n) break;
      modelled_current_A =
          Advance(t[k + 1] - t[k], v[k], modelled_current_A, resistance_ohm, inductance_H, brush_drop_V, rest);
    }
    return true;
  }
};

}  // namespace coilspin::locked_rotor
