#include "src/model/locked_rotor_circuit.h"

#include <gtest/gtest.h>

#include <cmath>

namespace coilspin::model {
namespace {

constexpr double kRelativeTolerance = 1e-12;

LockedRotorCircuit Circuit(double loop_resistance_ohm, double inductance_H, double brush_drop_V) {
  LockedRotorCircuit circuit;
  circuit.loop_resistance_ohm = loop_resistance_ohm;
  circuit.inductance_H = inductance_H;
  circuit.brush_drop_V = brush_drop_V;
  return circuit;
}

TEST(LockedRotorCircuit, SettledCurrentFollowsTheDiodeLikeBrushRule) {
  const LockedRotorCircuit circuit = Circuit(2.0, 1e-3, 0.8);
  // physics (d/dt = 0): i = (V − Vb·sgn(V))/(R + R_s) when |V| > Vb
  EXPECT_NEAR(SettledLockedRotorCurrent(circuit, 12.0), (12.0 - 0.8) / 2.0, kRelativeTolerance);
  EXPECT_NEAR(SettledLockedRotorCurrent(circuit, -6.0), (-6.0 + 0.8) / 2.0, kRelativeTolerance);
  // physics: with |V| ≤ Vb the brushes conduct nothing (documented rule)
  EXPECT_EQ(SettledLockedRotorCurrent(circuit, 0.5), 0.0);
  EXPECT_EQ(SettledLockedRotorCurrent(circuit, -0.8), 0.0);
}

TEST(LockedRotorCircuit, RiseFromRestIsTheFirstOrderSolution) {
  const double r_ohm = 2.0, l_H = 4e-3, vb_V = 0.5, v_V = 10.0, t_s = 1.3e-3;
  // physics (first-order ODE): i(t) = ((V − Vb)/R)·(1 − e^(−t·R/L))
  const double expected_A = (v_V - vb_V) / r_ohm * (1.0 - std::exp(-t_s * r_ohm / l_H));
  EXPECT_NEAR(AdvanceLockedRotorCurrent(Circuit(r_ohm, l_H, vb_V), 0.0, v_V, t_s), expected_A,
              kRelativeTolerance * expected_A);
}

TEST(LockedRotorCircuit, TwoHalfStepsEqualOneWholeStep) {
  // physics: the flow of an autonomous ODE composes, i(t1 + t2) = Φ_t2(Φ_t1(i))
  const LockedRotorCircuit circuit = Circuit(1.5, 2e-3, 0.3);
  const double whole_A = AdvanceLockedRotorCurrent(circuit, 1.0, 8.0, 2e-3);
  const double half_A = AdvanceLockedRotorCurrent(circuit, 1.0, 8.0, 1e-3);
  EXPECT_NEAR(AdvanceLockedRotorCurrent(circuit, half_A, 8.0, 1e-3), whole_A,
              kRelativeTolerance * whole_A);
}

TEST(LockedRotorCircuit, ReversalCrossesZeroAndContinuesWithTheOtherBrushDrop) {
  const double r_ohm = 2.0, l_H = 2e-3, vb_V = 1.0, v_V = -6.0, i0_A = 3.0;
  const double tau_s = l_H / r_ohm;
  // physics: for i > 0, i(t) = u/R + (i0 − u/R)·e^(−t/τ) with u = V − Vb; zero at
  // t* = τ·ln(1 − i0·R/u); after it i(t) = ((V + Vb)/R)·(1 − e^(−(t − t*)/τ))
  const double u_V = v_V - vb_V;
  const double crossing_s = tau_s * std::log(1.0 - i0_A * r_ohm / u_V);
  const LockedRotorCircuit circuit = Circuit(r_ohm, l_H, vb_V);

  const double before_s = 0.5 * crossing_s;
  const double expected_before_A = u_V / r_ohm + (i0_A - u_V / r_ohm) * std::exp(-before_s / tau_s);
  EXPECT_NEAR(AdvanceLockedRotorCurrent(circuit, i0_A, v_V, before_s), expected_before_A,
              kRelativeTolerance * i0_A);

  const double after_s = crossing_s + tau_s;
  const double expected_after_A = (v_V + vb_V) / r_ohm * (1.0 - std::exp(-1.0));
  EXPECT_NEAR(AdvanceLockedRotorCurrent(circuit, i0_A, v_V, after_s), expected_after_A,
              kRelativeTolerance * i0_A);
}

TEST(LockedRotorCircuit, CurrentBelowTheBrushDropDecaysToZeroAndStays) {
  const double r_ohm = 2.0, l_H = 2e-3, vb_V = 1.0, v_V = 0.4, i0_A = 1.0;
  // physics: u = V − Vb < 0 drives the current to zero at t* = τ·ln(1 − i0·R/u); with
  // |V| ≤ Vb it then stays 0 (documented brush rule)
  const double crossing_s = l_H / r_ohm * std::log(1.0 - i0_A * r_ohm / (v_V - vb_V));
  const LockedRotorCircuit circuit = Circuit(r_ohm, l_H, vb_V);
  EXPECT_GT(AdvanceLockedRotorCurrent(circuit, i0_A, v_V, 0.9 * crossing_s), 0.0);
  EXPECT_EQ(AdvanceLockedRotorCurrent(circuit, i0_A, v_V, 1.1 * crossing_s), 0.0);
  EXPECT_EQ(AdvanceLockedRotorCurrent(circuit, i0_A, v_V, 10.0 * crossing_s), 0.0);
}

TEST(LockedRotorCircuit, WithoutInductanceTheCurrentSettlesAtOnce) {
  // physics: L = 0 leaves v = R·i + Vb·sgn(i), no dynamics
  const LockedRotorCircuit circuit = Circuit(2.0, 0.0, 0.5);
  EXPECT_NEAR(AdvanceLockedRotorCurrent(circuit, 4.0, -5.0, 1e-6), (-5.0 + 0.5) / 2.0,
              kRelativeTolerance);
}

}  // namespace
}  // namespace coilspin::model
