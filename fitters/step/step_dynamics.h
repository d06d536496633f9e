#pragma once
// The free-shaft motor driven by its logged terminal voltage, sample interval
// by sample interval (docs/methods.md §3.3):
//     L·di/dt = v − R·i − Ke·ω − Vb·sgn(i)
//     J·dω/dt = Kt·i − B·ω − Tc·sgn(ω)
// with v between samples either moving linearly to the next sample
// (first-order hold: a sampled, continuous terminal voltage such as a supply
// sagging with the current) or, across a jump (a switched edge; the instant
// it happened between the two samples is unknown), held at v_k until the
// sample that first shows the new level (zero-order hold). While the rotor is
// held by stiction the voltage is held too (the locked-rotor recursion). The
// two sign functions are
// decided at each sample instant and held over the interval:
//
//   Rotor at rest (ω = 0). Coulomb friction holds it while |Kt·i| ≤ Tc
//   (stiction); the current then obeys the locked-rotor equation, advanced
//   exactly with its brush and rest-band rules (fitters/locked_rotor/
//   step_residual.h). When |Kt·i| passes Tc inside the interval, the instant
//   t* is solved exactly from i(t) = i∞ + (i_k − i∞)·e^(−t/τ_e) and the
//   rotor turns from t* on, in the direction of the torque.
//   Rotor turning. The coupled linear pair is advanced exactly
//   (linear_interval.h) with s_ω = sgn(ω_k) and s_i = sgn(i_k); with no
//   current (i_k = 0) the brushes conduct only when |v − Ke·ω| > Vb, else the
//   current stays 0 and the rotor coasts (J·dω/dt = −B·ω − Tc·s_ω).
//   Crossings. Friction cannot reverse the rotor: an ω that changes sign
//   within an interval is set to 0 at the next sample (the rotor has
//   stopped; stiction decides what follows). With Vb > 0 a current that
//   changes sign is set to 0 (the brushes block, then restart by the rule
//   above). These two instants are resolved to the sample, not exactly: the
//   error is confined to one interval, which is why a step log needs many
//   samples per electrical time constant (it also needs them for L itself).
//
// The cost per sample is constant: a few products, whatever the ratio of the
// time constants to the sample interval. The interval's matrices (three
// exponentials) are kept in a DiscretisationCache and recomputed only when the
// sample interval changes, or for the part of an interval after a breakaway.

#include <cmath>

#include "fitters/locked_rotor/step_residual.h"
#include "fitters/step/linear_interval.h"

namespace coilspin::step {

template <typename T>
struct StepMotor {
  T resistance_ohm;   // R, at the winding temperature
  T inductance_H;     // L
  T back_emf;         // Ke [V·s/rad]
  T torque_constant;  // Kt [N·m/A]
  T inertia;          // J [kg·m²]
  T viscous;          // B [N·m·s/rad]
  T coulomb;          // Tc [N·m]
  T brush_drop_V;     // Vb
};

template <typename T>
struct ShaftState {
  T current_A;
  T speed_rad_s;
  T angle_rad;
};

template <typename T>
T SignOf(const T& x) {
  return x > 0.0 ? T(1.0) : (x < 0.0 ? T(-1.0) : T(0.0));
}

// Below b·Δ = kSmallDecay the coast uses the limits e^(−bΔ) → 1 − bΔ (no B).
inline constexpr double kSmallDecay = 1e-12;

// Current blocked (i = 0), rotor turning in direction s_ω:
//   ω(t) = e^(−b·t)·ω_k − (1 − e^(−b·t))·c·s_ω/b,  b = B/J, c = Tc/J.
template <typename T>
ShaftState<T> Coast(const T& interval_s, const ShaftState<T>& x, const StepMotor<T>& m, const T& direction) {
  using std::exp;
  using std::expm1;
  const T b = m.viscous / m.inertia;
  const T c = m.coulomb / m.inertia * direction;
  T rise, integral;  // (1 − e^(−bΔ))/b and ∫₀^Δ (1 − e^(−bt))/b dt
  if (b * interval_s < kSmallDecay) {
    rise = interval_s;
    integral = 0.5 * interval_s * interval_s;
  } else {
    rise = -expm1(-b * interval_s) / b;
    integral = (interval_s - rise) / b;
  }
  const T speed = x.speed_rad_s - b * rise * x.speed_rad_s - rise * c;
  const T angle = x.angle_rad + rise * x.speed_rad_s - integral * c;
  return {T(0.0), speed, angle};
}

// The last Discretisation of one evaluation (one parameter set, so one A): reused
// while consecutive sample intervals are equal.
template <typename T>
struct DiscretisationCache {
  double interval_s = -1.0;  // none yet
  Discretisation<T> d;
};

template <typename T>
Matrix2<T> SystemMatrix(const StepMotor<T>& m) {
  return {-m.resistance_ohm / m.inductance_H, -m.back_emf / m.inductance_H, m.torque_constant / m.inertia,
          -m.viscous / m.inertia};
}

// Both equations, with the current's sign s_i and the rotor's direction s_ω held.
// `cache` is used when the interval is a whole sample interval (its key), else null.
template <typename T>
ShaftState<T> Turning(const T& interval_s, double voltage_V, double slope_V_per_s, const ShaftState<T>& x,
                      const StepMotor<T>& m, const T& direction, DiscretisationCache<T>* cache) {
  using std::abs;
  T current_sign = SignOf(x.current_A);
  if (current_sign == 0.0) {
    const T drive_V = voltage_V - m.back_emf * x.speed_rad_s;  // u = v − Ke·ω
    if (abs(drive_V) <= m.brush_drop_V) return Coast(interval_s, x, m, direction);  // no matrices needed
    current_sign = SignOf(drive_V);
  }
  const Vector2<T> u{(voltage_V - m.brush_drop_V * current_sign) / m.inductance_H, -m.coulomb * direction / m.inertia};
  const Vector2<T> ramp{slope_V_per_s / m.inductance_H, T(0.0)};
  const Vector2<T> start{x.current_A, x.speed_rad_s};
  const IntervalResult<T> r = cache ? AdvanceLinear(cache->d, u, ramp, start)
                                    : AdvanceLinear(Discretise(SystemMatrix(m), interval_s), u, ramp, start);
  ShaftState<T> next{r.state.x1, r.state.x2, x.angle_rad + r.angle_rad};
  if (SignOf(next.speed_rad_s) != direction) next.speed_rad_s = T(0.0);  // stopped: no reversal by friction
  if (m.brush_drop_V > 0.0 && SignOf(next.current_A) == -current_sign) next.current_A = T(0.0);  // brushes block
  return next;
}

// One sample interval from x, the voltage starting at v and moving at slope_V_per_s (0: held).
template <typename T>
ShaftState<T> AdvanceStep(double interval_s, double voltage_V, double slope_V_per_s, const ShaftState<T>& x,
                          const StepMotor<T>& m, const locked_rotor::RestBand& rest, DiscretisationCache<T>* cache) {
  using std::abs;
  using std::log;
  const T interval(interval_s);
  if (cache->interval_s != interval_s) {
    cache->interval_s = interval_s;
    cache->d = Discretise(SystemMatrix(m), interval);
  }
  if (x.speed_rad_s != 0.0) return Turning(interval, voltage_V, slope_V_per_s, x, m, SignOf(x.speed_rad_s), cache);
  const T torque_start = m.torque_constant * x.current_A;
  if (abs(torque_start) > m.coulomb)
    return Turning(interval, voltage_V, slope_V_per_s, x, m, SignOf(torque_start), cache);
  const T end_A = locked_rotor::Advance(interval_s, voltage_V, x.current_A, m.resistance_ohm, m.inductance_H,
                                        m.brush_drop_V, rest);
  const ShaftState<T> held{end_A, T(0.0), x.angle_rad};
  if (!(abs(m.torque_constant * end_A) > m.coulomb)) return held;  // stiction holds the rotor
  // Breakaway inside the interval, where i(t*) = ±Tc/Kt on the way from i_k to i_end:
  //   i(t) = i∞ + (i_k − i∞)·e^(−t/τ_e),  t* = τ_e·ln((i_k − i∞)/(i* − i∞)).
  // A current that changed sign on the way did so at t₀ = τ_e·ln(1 − R·i_k/u) and
  // restarted from 0 under the from-rest drive (the locked-rotor rule); t* counts from there.
  const T tau_s = m.inductance_H / m.resistance_ohm;
  const T direction = SignOf(end_A);
  const T breakaway_A = direction * m.coulomb / m.torque_constant;
  T start_A = x.current_A, start_s = T(0.0);
  T drive_V = locked_rotor::HeldRotorDrive(voltage_V, x.current_A, m.brush_drop_V, rest);
  if (x.current_A != 0.0 && SignOf(end_A) != SignOf(x.current_A) &&
      !locked_rotor::AtRest(voltage_V, x.current_A, rest)) {  // inside the rest bands the drive is v throughout
    start_s = tau_s * log(1.0 - m.resistance_ohm * x.current_A / drive_V);
    start_A = T(0.0);
    drive_V = locked_rotor::DriveVoltage(voltage_V, m.brush_drop_V);
  }
  const T settled_A = drive_V / m.resistance_ohm;  // i∞
  const T ratio = (start_A - settled_A) / (breakaway_A - settled_A);
  if (!(ratio > 1.0)) return held;  // rounding at the boundary: the next sample decides
  const T breakaway_s = start_s + tau_s * log(ratio);
  if (!(breakaway_s < interval)) return held;
  return Turning(interval - breakaway_s, voltage_V, slope_V_per_s, ShaftState<T>{breakaway_A, T(0.0), x.angle_rad}, m,
                 direction, static_cast<DiscretisationCache<T>*>(nullptr));
}

}  // namespace coilspin::step
