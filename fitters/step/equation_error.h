#pragma once
// Starting values for the step fit: an equation-error estimate, linear in the
// unknowns, from the logged signals themselves (docs/methods.md §3.3).
//
// Differentiating a noisy current or speed is the weak point of the classical
// equation-error method, so both equations are filtered by an integrator
// (prefilter 1/s, the "integral" or state-variable-filter form of equation
// error): integrated from a sample k₀ to t_k, with the held voltage summed
// exactly (zero-order hold) and the other signals by the trapezoidal rule,
//     ∫(v − Vb·sgn i) dt = R·∫i dt + L·(i_k − i_k₀) + Ke·(θ_k − θ_k₀)
//     ω_k − ω_k₀ = (Kt/J)·∫i dt − (Tc/J)·∫sgn(ω) dt          (B taken as 0)
// (with an encoder the second is integrated once more, so that no speed
// differentiated from quantised counts enters it). Why B is left out: once
// the current has settled to its quasi-steady i ≈ (v − Ke·ω)/R, which holds
// for all but the first few τ_e of a step, i, ω and 1 are affinely dependent,
// and a regression on all three is ill-conditioned (measured: condition number
// 6e3, Kt/J off by a factor 3 to 30 with encoder noise). Only two mechanical
// combinations are well determined there, (Kt/J)·Ke/R + B/J and
// (Kt/J)·v/R − Tc/J; with B = 0 (electrical damping Kt·Ke/R usually far above
// viscous friction in a PM motor: common practice) Kt/J and Tc/J follow, and
// Tc/J then carries the friction at the run's speeds. The output-error fit
// separates B from Tc with the transient.
// Each is an ordinary least-squares problem over the samples k > k₀ (three
// unknowns each). The electrical one starts at the first sample; the
// mechanical one where the rotor has clearly begun to turn (a rotor held by
// stiction does not obey it). Noise in the regressors biases the estimates a
// little (errors in variables); the output-error fit that follows removes it,
// which is all a start needs.

#include <optional>
#include <string>
#include <vector>

namespace coilspin::step {

struct StepSignals {
  const std::vector<double>* time_s = nullptr;
  const std::vector<double>* voltage_V = nullptr;
  const std::vector<double>* current_A = nullptr;
  const std::vector<double>* speed_rad_s = nullptr;     // motor shaft (derived from position if need be)
  const std::vector<double>* position_rad = nullptr;    // optional; else θ = ∫ω dt
  double brush_drop_V = 0.0;                            // Vb, from other tests or 0
  double speed_noise_rad_s = 0.0;                       // σ_ω, to tell turning from rest
};

struct EquationErrorStart {
  double resistance_ohm = 0.0;              // R (at the log's temperature)
  double inductance_H = 0.0;                // L
  double back_emf = 0.0;                    // Ke [V·s/rad]
  double torque_over_inertia = 0.0;         // a = Kt/J [N·m/(A·kg·m²)]
  double viscous_over_inertia = 0.0;        // b = B/J [1/s]: 0, see above
  double coulomb_over_inertia = 0.0;        // c = Tc/J [rad/s²], carrying B·ω too
  std::size_t mechanical_start = 0;         // k₀ of the mechanical regression
};

// Empty, with the reason in *why, when the log cannot give a start (too few
// turning samples, a singular regression, or R, L, Ke, Kt/J not positive).
std::optional<EquationErrorStart> EstimateStepStart(const StepSignals& signals, std::string* why);

}  // namespace coilspin::step
