#pragma once
// Residuals of a free-shaft voltage step, measured − model, output error:
// the model state (î, ω̂, θ̂) is simulated from the initial state with the
// LOGGED terminal voltage as input (step_dynamics.h), never reset to the data,
// so noise on the outputs stays in the residuals and does not enter the model:
//   current:   (i_k − i_z) − î(t_k)         [A]   (i_z: the current sensor's zero reading)
//   speed:     ω_k − ω̂(t_k)                 [rad/s]
//   position:  θ_k − θ̂(t_k)                 [rad]   (encoder counts fitted directly)
// One functor per channel; each runs the same simulation (the cost per sample
// is constant, so two channels cost twice one).
//
// Parameters, in physical units, in this order:
//   R at θ_ref [ohm] (times the copper factor f of the log), L [H], Ke [V·s/rad],
//   Kt [N·m/A] (absent when Kt is taken equal to Ke: the same parameter plays both roles),
//   J [kg·m²], B [N·m·s/rad], Tc [N·m], Vb [V], i₀ [A], ω₀ [rad/s], θ₀ [rad] (position only),
//   i_z [A] (current only).

#include <cmath>
#include <vector>

#include "fitters/locked_rotor/step_residual.h"
#include "fitters/step/step_dynamics.h"

namespace coilspin::step {

enum class StepChannel { kCurrent, kSpeed, kPosition };

struct StepResidual {
  const std::vector<double>* time_s;
  const std::vector<double>* voltage_V;
  const std::vector<double>* measured;  // the channel's samples
  StepChannel channel = StepChannel::kCurrent;
  bool torque_constant_is_back_emf = false;
  double temperature_factor = 1.0;      // f = (k + θ)/(k + θ_ref), 1 when unknown
  locked_rotor::RestBand rest;          // noise bands of v and i around zero
  // A change of v between two samples larger than this is a switched edge, held
  // (zero-order hold); smaller changes are followed linearly (step_dynamics.h).
  double jump_V = 0.0;

  // Number of parameters the functor expects.
  int ParameterCount() const {
    return (torque_constant_is_back_emf ? 9 : 10) + (channel == StepChannel::kCurrent ? 1 : 0) +
           (channel == StepChannel::kPosition ? 1 : 0);
  }

  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    int next = 0;
    StepMotor<T> m;
    m.resistance_ohm = *p[next++] * temperature_factor;
    m.inductance_H = *p[next++];
    m.back_emf = *p[next++];
    m.torque_constant = torque_constant_is_back_emf ? m.back_emf : *p[next++];
    m.inertia = *p[next++];
    m.viscous = *p[next++];
    m.coulomb = *p[next++];
    m.brush_drop_V = *p[next++];
    ShaftState<T> x;
    x.current_A = *p[next++];
    x.speed_rad_s = *p[next++];
    x.angle_rad = channel == StepChannel::kPosition ? *p[next++] : T(0.0);
    const T zero = channel == StepChannel::kCurrent ? *p[next++] : T(0.0);  // i_z
    const std::vector<double>& t = *time_s;
    const std::vector<double>& v = *voltage_V;
    const std::vector<double>& y = *measured;
    const std::size_t n = t.size();
    DiscretisationCache<T> cache;  // one A per evaluation: reused while Δ repeats
    for (std::size_t k = 0; k < n; ++k) {
      const T& modelled = channel == StepChannel::kCurrent ? x.current_A
                          : channel == StepChannel::kSpeed ? x.speed_rad_s
                                                           : x.angle_rad;
      residual[k] = y[k] - zero - modelled;
      if (k + 1 == n) break;
      const double change_V = v[k + 1] - v[k];
      const double slope_V_per_s = std::fabs(change_V) > jump_V ? 0.0 : change_V / (t[k + 1] - t[k]);
      x = AdvanceStep(t[k + 1] - t[k], v[k], slope_V_per_s, x, m, rest, &cache);
    }
    return true;
  }
};

}  // namespace coilspin::step
