#pragma once
// The motor with its shaft free to turn (docs/methods.md §1), state (i, ω, θ):
//     L·di/dt = V_s − (R + R_s)·i − Ke·ω − Vb·sgn(i)
//     J·dω/dt = Kt·i − B·ω − c·ω·|ω| − Tc·sgn(ω) − τ_load
//     dθ/dt  = ω
// c·ω·|ω| is a speed-squared (aerodynamic) drag of the rig, not part of
// coilspin's model (docs/bench-artefacts.md); c = 0 unless a simulated bench
// asks for it. It vanishes at ω = 0, so it leaves the stiction rule alone.
// The terminals see either a source of open-circuit voltage V_s behind a
// resistance R_s (terminal v = V_s − R_s·i; a braking resistor R_brake across
// the terminals is V_s = 0, R_s = R_brake), or nothing (open circuit: i = 0,
// terminal v = Ke·ω, the back-EMF). V_s, R_s and τ_load are constant over one
// call of AdvanceFreeShaft.
//
// The two sign functions are decided by switching rules:
//   Brushes (diode-like, as src/model/locked_rotor_circuit.h). A current that
//   flows keeps its direction until it reaches zero. At i = 0, with the drive
//   u = V_s − Ke·ω: |u| ≤ Vb holds the current at 0 (the brushes block);
//   otherwise it starts in the direction of u.
//   Stiction (Coulomb friction at rest). A turning rotor keeps its direction
//   until ω reaches zero; there it stops exactly. At ω = 0, with the drive
//   torque τ_d = Kt·i − τ_load: |τ_d| ≤ Tc holds the rotor at rest (ω = 0,
//   θ constant); otherwise it starts in the direction of τ_d.
// Vb = 0 (or Tc = 0) removes the corresponding sign term and its rule.
//
// Integration. Between switches each regime is a linear ODE with constant
// input (plus the drag, when c > 0), integrated by the classical fourth-order
// Runge–Kutta method in fixed sub-steps of h = duration/n, with n chosen so
// that h is at most 1/kRungeKuttaStepsPerTimeConstant of the fastest time
// constant: the electrical L/(R + R_s), the mechanical J·(R + R_s)/(Kt·Ke),
// the viscous J/B, 1/|λ| for the eigenvalues λ of the (i, ω) system (which can
// be faster than all three when the motor is underdamped), and the drag's
// J/(2c·|ω|) at the speed the call starts from. A switch is exact to
// the integrator: when a sub-step would carry i or ω through zero (or free a
// held current or rotor), its length is bisected to kEventTimeRelativeTolerance
// of a sub-step, the state is taken at the crossing with that variable set to
// exactly 0, and the rules above pick the next regime.
//
// Throws std::invalid_argument for parameters the model cannot integrate
// (L ≤ 0 with a source connected, J ≤ 0, R + R_s ≤ 0, a negative Ke, Kt, B,
// Tc, Vb or c, a negative duration) or a sub-step count above kMaxSubStepsPerCall
// (the time constants are far shorter than the duration: call more often).

#include "src/model/motor_parameters.h"

namespace coilspin::model {

// Sub-steps per fastest time constant (RK4's relative error per step is about
// (h/τ)⁵/120 ≈ 3e-9 at 1/20); at least kMinSubStepsPerCall per call.
inline constexpr double kRungeKuttaStepsPerTimeConstant = 20.0;
inline constexpr int kMinSubStepsPerCall = 4;
inline constexpr long kMaxSubStepsPerCall = 10'000'000;
// A switching instant is bracketed to this fraction of a sub-step.
inline constexpr double kEventTimeRelativeTolerance = 1e-14;

struct FreeShaftState {
  double current_A = 0.0;     // i
  double speed_rad_s = 0.0;   // ω, motor shaft
  double position_rad = 0.0;  // θ, motor shaft
};

// What drives the motor over one call.
struct FreeShaftInput {
  bool open_circuit = false;           // true: i = 0 and v = Ke·ω; V_s and R_s unused
  double supply_V = 0.0;               // V_s
  double supply_resistance_ohm = 0.0;  // R_s (or R_brake with V_s = 0)
  double load_torque_N_m = 0.0;        // τ_load
  double drag_N_m_s2_per_rad2 = 0.0;   // c of the drag c·ω·|ω|, ≥ 0
};

// The state `duration_s` later.
FreeShaftState AdvanceFreeShaft(const MotorParameters& motor, const FreeShaftInput& input,
                                const FreeShaftState& state, double duration_s);

// The RK4 sub-steps AdvanceFreeShaft takes over `duration_s` (before any switch splits one),
// starting from a shaft speed of `speed_rad_s` (which matters only with a drag).
long FreeShaftSubSteps(const MotorParameters& motor, const FreeShaftInput& input,
                       double duration_s, double speed_rad_s = 0.0);

// Terminal voltage: V_s − R_s·i with a source, Ke·ω with the terminals open.
double FreeShaftTerminalVoltage(const MotorParameters& motor, const FreeShaftInput& input,
                                const FreeShaftState& state);

}  // namespace coilspin::model
