#include "src/model/free_shaft_dynamics.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "src/model/free_shaft_time_constants.h"

namespace coilspin::model {
namespace {

// RK4 at 20 steps per fastest time constant: about 3e-9 relative per step, so
// settled values and smooth stretches agree with exact solutions to well below 1e-8.
constexpr double kIntegratorRelativeTolerance = 1e-8;
// Settling over this many slowest time constants leaves e^(−40) ≈ 4e-18 of a transient.
constexpr double kSettleTimeConstants = 40.0;

// R, L, Ke, Kt, J, B, Tc, Vb: a small motor with every term of the model.
const MotorParameters kMotor{2.0, 2e-3, 0.02, 0.021, 2e-6, 1e-6, 2e-3, 0.3};

FreeShaftInput Supply(double supply_V, double supply_resistance_ohm) {
  FreeShaftInput input;
  input.supply_V = supply_V;
  input.supply_resistance_ohm = supply_resistance_ohm;
  return input;
}

FreeShaftInput OpenCircuit() {
  FreeShaftInput input;
  input.open_circuit = true;
  return input;
}

double SettleTime_s(const MotorParameters& motor, const FreeShaftInput& input) {
  return kSettleTimeConstants * TimeConstantsOf(motor, input).slowest_s;
}

TEST(FreeShaftDynamics, SettlesAtTheSteadyStateOfBothEquations) {
  // physics (d/dt = 0, i > 0, ω > 0):  (R + R_s)·i + Ke·ω = V − Vb  and  Kt·i − B·ω = Tc + τ_load,
  // solved here by Cramer's rule, independently of the integrator.
  const double v_V = 6.0, rs_ohm = 0.2, load_N_m = 1e-3;
  FreeShaftInput input = Supply(v_V, rs_ohm);
  input.load_torque_N_m = load_N_m;
  const FreeShaftState settled = AdvanceFreeShaft(kMotor, input, FreeShaftState{}, SettleTime_s(kMotor, input));
  const double a11 = kMotor.resistance_ohm + rs_ohm, a12 = kMotor.back_emf_constant_V_s_per_rad;
  const double a21 = kMotor.torque_constant_N_m_per_A, a22 = -kMotor.viscous_friction_N_m_s_per_rad;
  const double b1 = v_V - kMotor.brush_drop_V, b2 = kMotor.coulomb_friction_N_m + load_N_m;
  const double determinant = a11 * a22 - a12 * a21;
  const double expected_A = (b1 * a22 - a12 * b2) / determinant;
  const double expected_rad_s = (a11 * b2 - a21 * b1) / determinant;
  EXPECT_NEAR(settled.current_A, expected_A, kIntegratorRelativeTolerance * expected_A);
  EXPECT_NEAR(settled.speed_rad_s, expected_rad_s, kIntegratorRelativeTolerance * expected_rad_s);
  // physics (Kirchhoff): v = V_s − R_s·i
  EXPECT_DOUBLE_EQ(FreeShaftTerminalVoltage(kMotor, input, settled), v_V - rs_ohm * settled.current_A);
}

TEST(FreeShaftDynamics, WithoutFrictionTheRotorReachesTheIdealNoLoadSpeed) {
  // physics (docs/methods.md §1): B = Tc = 0 and Vb = 0 leave Kt·i = 0 at steady state,
  // so i = 0 and ω = V/Ke (the ideal no-load speed)
  MotorParameters motor = kMotor;
  motor.viscous_friction_N_m_s_per_rad = 0.0;
  motor.coulomb_friction_N_m = 0.0;
  motor.brush_drop_V = 0.0;
  const double v_V = 9.0;
  const FreeShaftInput input = Supply(v_V, 0.0);
  const FreeShaftState settled = AdvanceFreeShaft(motor, input, FreeShaftState{}, SettleTime_s(motor, input));
  const double ideal_rad_s = v_V / motor.back_emf_constant_V_s_per_rad;
  EXPECT_NEAR(settled.speed_rad_s, ideal_rad_s, kIntegratorRelativeTolerance * ideal_rad_s);
  EXPECT_NEAR(settled.current_A, 0.0, kIntegratorRelativeTolerance * v_V / motor.resistance_ohm);
}

TEST(FreeShaftDynamics, SubStepsResolveTheElectricalAndMechanicalTimeConstants) {
  // common practice (fixed-step RK4): at least 20 steps per time constant; the
  // electrical one is L/(R + R_s), the mechanical one J·(R + R_s)/(Kt·Ke) (docs/methods.md §6)
  const double duration_s = 1e-3, rs_ohm = 0.5;
  const FreeShaftInput input = Supply(12.0, rs_ohm);
  const double electrical_s = kMotor.inductance_H / (kMotor.resistance_ohm + rs_ohm);
  EXPECT_GE(static_cast<double>(FreeShaftSubSteps(kMotor, input, duration_s)), 20.0 * duration_s / electrical_s);
  MotorParameters light = kMotor;  // a rotor so light that the mechanical time constant is the shorter one
  light.inertia_kg_m2 = 1e-9;
  const double mechanical_s = light.inertia_kg_m2 * (light.resistance_ohm + rs_ohm) /
                              (light.torque_constant_N_m_per_A * light.back_emf_constant_V_s_per_rad);
  ASSERT_LT(mechanical_s, electrical_s);
  EXPECT_GE(static_cast<double>(FreeShaftSubSteps(light, input, duration_s)), 20.0 * duration_s / mechanical_s);
}

TEST(FreeShaftDynamics, OpenCircuitCoastFollowsTheClosedForm) {
  // physics (references.md, solve J·dω/dt = −B·ω − Tc): ω(t) = (ω₀ + Tc/B)·e^(−t·B/J) − Tc/B and,
  // integrating once more, θ(t) = (ω₀ + Tc/B)·(J/B)·(1 − e^(−t·B/J)) − (Tc/B)·t
  MotorParameters motor = kMotor;
  motor.viscous_friction_N_m_s_per_rad = 2e-5;  // J/B = 0.1 s: the exponential shows
  const double w0_rad_s = 250.0;
  const double j = motor.inertia_kg_m2, b = motor.viscous_friction_N_m_s_per_rad, tc = motor.coulomb_friction_N_m;
  const double stop_s = (j / b) * std::log(1.0 + b * w0_rad_s / tc);
  FreeShaftState state;
  state.current_A = 1.5;  // opening the terminals drops it at once
  state.speed_rad_s = w0_rad_s;
  constexpr int kChunks = 200;
  const double chunk_s = 1.5 * stop_s / kChunks;
  for (int n = 1; n <= kChunks; ++n) {
    state = AdvanceFreeShaft(motor, OpenCircuit(), state, chunk_s);
    const double t_s = n * chunk_s;
    EXPECT_EQ(state.current_A, 0.0);
    if (t_s < stop_s) {
      const double expected_rad_s = (w0_rad_s + tc / b) * std::exp(-t_s * b / j) - tc / b;
      EXPECT_NEAR(state.speed_rad_s, expected_rad_s, kIntegratorRelativeTolerance * w0_rad_s) << t_s;
    } else {
      EXPECT_EQ(state.speed_rad_s, 0.0) << "stiction holds the rotor once it stops, t = " << t_s;
    }
    const double moving_s = std::min(t_s, stop_s);
    const double expected_rad = (w0_rad_s + tc / b) * (j / b) * (1.0 - std::exp(-moving_s * b / j)) - tc / b * moving_s;
    EXPECT_NEAR(state.position_rad, expected_rad, kIntegratorRelativeTolerance * expected_rad) << t_s;
    // physics: with the terminals open, v = Ke·ω (the back-EMF)
    EXPECT_DOUBLE_EQ(FreeShaftTerminalVoltage(motor, OpenCircuit(), state),
                     motor.back_emf_constant_V_s_per_rad * state.speed_rad_s);
  }
}

TEST(FreeShaftDynamics, TheRotorStopsAtTheClosedFormStopTime) {
  // physics (references.md): the coast stops at t = (J/B)·ln(1 + B·ω₀/Tc); the switch is
  // located to a tiny fraction of a sub-step, so a millionth either side decides it
  const double w0_rad_s = 120.0;
  const double j = kMotor.inertia_kg_m2, b = kMotor.viscous_friction_N_m_s_per_rad, tc = kMotor.coulomb_friction_N_m;
  const double stop_s = (j / b) * std::log(1.0 + b * w0_rad_s / tc);
  constexpr double kAside = 1e-6;
  FreeShaftState start;
  start.speed_rad_s = w0_rad_s;
  const FreeShaftState before = AdvanceFreeShaft(kMotor, OpenCircuit(), start, (1.0 - kAside) * stop_s);
  const FreeShaftState after = AdvanceFreeShaft(kMotor, OpenCircuit(), start, (1.0 + kAside) * stop_s);
  // physics: Δt before the stop the closed form gives ω = (Tc/B)·(e^(Δt·B/J) − 1)
  // (a millionth of ω₀; the integrator's error scales with the amplitude ω₀ + Tc/B)
  const double remaining_rad_s = tc / b * std::expm1(kAside * stop_s * b / j);
  EXPECT_NEAR(before.speed_rad_s, remaining_rad_s, kIntegratorRelativeTolerance * (w0_rad_s + tc / b));
  EXPECT_EQ(after.speed_rad_s, 0.0);
}

TEST(FreeShaftDynamics, StictionHoldsTheRotorUntilTheTorqueExceedsTc) {
  // physics (stiction rule): at rest the rotor stays while Kt·i ≤ Tc. With the rotor still,
  // i(t) = ((V − Vb)/R)·(1 − e^(−t·R/L)), so it breaks away at t_b = −(L/R)·ln(1 − Tc·R/(Kt·(V − Vb)))
  const double r = kMotor.resistance_ohm, l = kMotor.inductance_H, kt = kMotor.torque_constant_N_m_per_A;
  const double vb = kMotor.brush_drop_V, tc = kMotor.coulomb_friction_N_m;
  const double weak_V = vb + 0.9 * tc * r / kt;  // settled Kt·i = 0.9·Tc
  const FreeShaftState held = AdvanceFreeShaft(kMotor, Supply(weak_V, 0.0), FreeShaftState{}, 0.2);
  EXPECT_EQ(held.speed_rad_s, 0.0);
  EXPECT_EQ(held.position_rad, 0.0);
  EXPECT_NEAR(held.current_A, (weak_V - vb) / r, kIntegratorRelativeTolerance * weak_V / r);

  const double strong_V = 3.0;
  const double breakaway_s = -(l / r) * std::log(1.0 - tc * r / (kt * (strong_V - vb)));
  constexpr double kAside = 1e-6;
  const FreeShaftInput strong = Supply(strong_V, 0.0);
  const FreeShaftState still = AdvanceFreeShaft(kMotor, strong, FreeShaftState{}, (1.0 - kAside) * breakaway_s);
  EXPECT_EQ(still.speed_rad_s, 0.0);
  const double expected_A = (strong_V - vb) / r * (1.0 - std::exp(-(1.0 - kAside) * breakaway_s * r / l));
  EXPECT_NEAR(still.current_A, expected_A, kIntegratorRelativeTolerance * expected_A);
  const FreeShaftState moving = AdvanceFreeShaft(kMotor, strong, FreeShaftState{}, (1.0 + kAside) * breakaway_s);
  EXPECT_GT(moving.speed_rad_s, 0.0);
}

TEST(FreeShaftDynamics, BrushesBlockASupplyBelowTheirDrop) {
  // physics (diode-like brush rule): from rest with |V| ≤ Vb no current flows, so nothing moves
  const FreeShaftState state = AdvanceFreeShaft(kMotor, Supply(0.9 * kMotor.brush_drop_V, 0.0), FreeShaftState{}, 0.1);
  EXPECT_EQ(state.current_A, 0.0);
  EXPECT_EQ(state.speed_rad_s, 0.0);
}

TEST(FreeShaftDynamics, ReversingTheSupplyReversesTheRotorThroughZero) {
  // physics: the model is odd in (V, i, ω, θ-rate) with τ_load = 0, so the steady state at −V is the
  // mirror image of the one at +V; the rotor passes ω = 0 with |Kt·i| > Tc and does not stick
  const double v_V = 6.0;
  const FreeShaftInput forward = Supply(v_V, 0.0), backward = Supply(-v_V, 0.0);
  const FreeShaftState ahead = AdvanceFreeShaft(kMotor, forward, FreeShaftState{}, SettleTime_s(kMotor, forward));
  const FreeShaftState back = AdvanceFreeShaft(kMotor, backward, ahead, SettleTime_s(kMotor, backward));
  EXPECT_NEAR(back.speed_rad_s, -ahead.speed_rad_s, kIntegratorRelativeTolerance * ahead.speed_rad_s);
  EXPECT_NEAR(back.current_A, -ahead.current_A, kIntegratorRelativeTolerance * ahead.current_A);
}

TEST(FreeShaftDynamics, RejectsParametersItCannotIntegrate) {
  // common practice: misuse is reported, not integrated into nonsense
  MotorParameters no_inertia = kMotor;
  no_inertia.inertia_kg_m2 = 0.0;
  EXPECT_THROW(AdvanceFreeShaft(no_inertia, Supply(1.0, 0.0), FreeShaftState{}, 1e-3), std::invalid_argument);
  MotorParameters no_inductance = kMotor;
  no_inductance.inductance_H = 0.0;
  EXPECT_THROW(AdvanceFreeShaft(no_inductance, Supply(1.0, 0.0), FreeShaftState{}, 1e-3), std::invalid_argument);
  EXPECT_NO_THROW(AdvanceFreeShaft(no_inductance, OpenCircuit(), FreeShaftState{}, 1e-3));
  MotorParameters negative_friction = kMotor;
  negative_friction.viscous_friction_N_m_s_per_rad = -1e-6;
  EXPECT_THROW(AdvanceFreeShaft(negative_friction, OpenCircuit(), FreeShaftState{}, 1e-3), std::invalid_argument);
  EXPECT_THROW(AdvanceFreeShaft(kMotor, OpenCircuit(), FreeShaftState{}, -1e-3), std::invalid_argument);
  // an electrical time constant of 1 ns over 1 s would need 2e10 sub-steps
  MotorParameters tiny_inductance = kMotor;
  tiny_inductance.inductance_H = 2e-9;
  EXPECT_THROW(FreeShaftSubSteps(tiny_inductance, Supply(1.0, 0.0), 1.0), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model
