#pragma once
// What a real rig adds to a log besides white noise (docs/bench-artefacts.md).
// Every artefact is off at its default, so a bench that sets none of them
// gives the same log, bit for bit, as before they existed.
//
// Sensor artefacts, per logged channel x (voltage, current, speed, torque),
// applied in this order to the channel's exact value (src/model/sensor_chain.h):
//     y_k = x_k + o + e_k + s_k,   x_logged,k = q(y_k), or 0 at a dropout
//   o    zero offset, a constant in the channel's SI unit;
//   e_k  AR(1) noise of stationary σ and lag-1 correlation φ:
//            e_0 = σ·z_0,   e_k = φ·e_(k−1) + √(1 − φ²)·σ·z_k   (|φ| < 1),
//        stationary from the first sample (Var e_k = σ², corr(e_k, e_(k−1)) = φ);
//        φ = 0 is the white noise of src/model/measurement_noise.h, drawn
//        from the same stream;
//   s_k  a spike: with probability p_s per sample, ±k·FS (sign equally likely),
//        FS the channel's full scale, taken as the largest |x_k| of the exact
//        channel in the log (a sensor ranged just above its signal);
//   q    the ADC step (0 = none);
//   dropout: with probability p_d per sample the reading is replaced by 0
//        (a tachometer that loses its pulse, a logger that misses a frame).
// Spikes and dropouts are drawn from their own streams of the bench seed
// (src/model/noise_streams.h), so turning them on leaves the noise unchanged.
//
// Commutation ripple (free shaft only): a measurement-level artefact on the
// logged current, and on the logged voltage where the back-EMF drives the
// terminals (open circuit, or a braking resistor: V_s = 0):
//     x_logged = x·(1 + a·cos(N·θ + φ0)),  θ the motor shaft angle,
// N commutator segments per turn, a the relative amplitude. The motor's
// dynamics are not changed. A locked rotor keeps θ constant: its log has no ripple.
//
// Winding warm-up (every kind): the winding warms continuously from the start
// of the log (t = 0; a free-shaft step's unlogged settle included),
//     θ_w(t) = θ_w0 + ΔT·(1 − e^(−t/τ_th)),
// and R follows by the copper law (docs/methods.md §7), held over each sample
// period at its value at the period's start. The temperature column, when
// logged, carries θ_w(t_k). (The locked-rotor heating per plateau adds to it.)
//
// Mechanical model discrepancy (free shaft only), absent from coilspin's model:
//     J·dω/dt = Kt·i − B·ω − c·ω·|ω| − (Tc + δ(t))·sgn(ω) − τ_load
//   c·ω·|ω|  a speed-squared (aerodynamic) drag;
//   δ(t)     a wandering Coulomb friction: an Ornstein–Uhlenbeck process of
//            stationary σ_δ and correlation time τ_δ, sampled exactly at the
//            sample instants (src/model/wandering_friction.h) and held over
//            each period; Tc + δ is clipped at 0 (friction never drives).

namespace coilspin::model {

// One logged channel's sensor, in the channel's SI unit.
struct SensorArtefacts {
  double noise_lag1_correlation = 0.0;  // φ in (−1, 1); 0 = white noise
  double zero_offset = 0.0;             // o, added to every reading
  double dropout_rate = 0.0;            // p_d in [0, 1], per sample
  double spike_rate = 0.0;              // p_s in [0, 1], per sample
  double spike_full_scales = 0.0;       // k ≥ 0: a spike is ±k·FS
};

struct CommutationRipple {
  int segments_per_turn = 0;      // N; 0 = no ripple
  double relative_amplitude = 0;  // a in [0, 1)
  double phase_rad = 0.0;         // φ0
};

struct WindingWarmUp {
  double rise_K = 0.0;           // ΔT; 0 = no warm-up
  double time_constant_s = 0.0;  // τ_th > 0 when ΔT ≠ 0
};

struct MechanicalDiscrepancy {
  double drag_N_m_s2_per_rad2 = 0.0;      // c ≥ 0
  double friction_wander_sigma_N_m = 0.0;  // σ_δ ≥ 0; 0 = no wander
  double friction_wander_time_s = 0.0;     // τ_δ > 0 when σ_δ > 0
};

}  // namespace coilspin::model
