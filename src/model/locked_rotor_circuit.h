#pragma once
// The armature circuit with the rotor held still (ω = 0), fed by a supply of
// open-circuit voltage V_s and internal resistance R_s:
//     L·di/dt = V_s − (R + R_s)·i − Vb·sgn(i)
//
// Brush drop, a diode-like rule. The contact drop Vb always opposes the
// current. A current that is flowing keeps its direction d = sgn(i) and relaxes
// towards (V_s − Vb·d)/(R + R_s). If that target lies on the other side of
// zero, the current reaches zero in finite time and the rule is applied again
// from i = 0: with |V_s| ≤ Vb no current is driven and i stays 0; with
// |V_s| > Vb it starts in the direction of V_s. So the settled current is
//     (V_s − Vb·sgn(V_s))/(R + R_s)  when |V_s| > Vb,  else 0.
//
// With V_s constant each stretch of one direction is solved exactly:
//     i(t + Δ) = a·i(t) + (1 − a)·u/(R + R_s),  a = exp(−Δ·(R + R_s)/L),  u = V_s − Vb·d
// and a zero crossing is located exactly, t* = (L/(R + R_s))·ln(1 − i·(R + R_s)/u).
// L = 0 (a purely resistive circuit) gives the settled current at once.

namespace coilspin::model {

struct LockedRotorCircuit {
  double loop_resistance_ohm = 0.0;  // R + R_s, > 0
  double inductance_H = 0.0;         // L, ≥ 0
  double brush_drop_V = 0.0;         // Vb, ≥ 0
};

// The current `duration_s` after it was `current_A`, with the supply held at `supply_V`.
double AdvanceLockedRotorCurrent(const LockedRotorCircuit& circuit, double current_A,
                                 double supply_V, double duration_s);

// The current the circuit settles to with the supply held at `supply_V`.
double SettledLockedRotorCurrent(const LockedRotorCircuit& circuit, double supply_V);

}  // namespace coilspin::model
