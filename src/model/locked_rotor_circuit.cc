#include "src/model/locked_rotor_circuit.h"

#include <cmath>

namespace coilspin::model {

namespace {

// The direction the current flows in (or starts in, from rest) under the diode-like brush rule.
int CurrentDirection(const LockedRotorCircuit& circuit, double current_A, double supply_V) {
  if (current_A > 0.0) return 1;
  if (current_A < 0.0) return -1;
  if (supply_V > circuit.brush_drop_V) return 1;
  if (supply_V < -circuit.brush_drop_V) return -1;
  return 0;
}

// At most two stretches: the present direction, then (after a zero crossing) the other one.
constexpr int kMaxStretches = 2;

}  // namespace

double SettledLockedRotorCurrent(const LockedRotorCircuit& circuit, double supply_V) {
  const int direction = CurrentDirection(circuit, 0.0, supply_V);
  if (direction == 0) return 0.0;
  // i = (V_s − Vb·sgn(V_s))/(R + R_s)
  return (supply_V - circuit.brush_drop_V * direction) / circuit.loop_resistance_ohm;
}

double AdvanceLockedRotorCurrent(const LockedRotorCircuit& circuit, double current_A,
                                 double supply_V, double duration_s) {
  if (circuit.inductance_H == 0.0) return SettledLockedRotorCurrent(circuit, supply_V);
  const double time_constant_s = circuit.inductance_H / circuit.loop_resistance_ohm;  // L/(R + R_s)
  double current = current_A;
  double remaining_s = duration_s;
  for (int stretch = 0; stretch < kMaxStretches; ++stretch) {
    const int direction = CurrentDirection(circuit, current, supply_V);
    if (direction == 0) return 0.0;
    const double drive_V = supply_V - circuit.brush_drop_V * direction;  // u = V_s − Vb·d
    const double target_A = drive_V / circuit.loop_resistance_ohm;       // u/(R + R_s)
    if (target_A * direction < 0.0) {
      // t* = (L/(R + R_s))·ln(1 − i·(R + R_s)/u): the current reaches zero
      const double crossing_s = time_constant_s * std::log1p(-current / target_A);
      if (crossing_s <= remaining_s) {
        current = 0.0;
        remaining_s -= crossing_s;
        continue;
      }
    }
    // i(t + Δ) = a·i + (1 − a)·u/(R + R_s); 1 − a = −expm1(−Δ/τ) keeps digits when Δ ≪ τ
    const double a = std::exp(-remaining_s / time_constant_s);
    const double one_minus_a = -std::expm1(-remaining_s / time_constant_s);
    return a * current + one_minus_a * target_A;
  }
  return current;
}

}  // namespace coilspin::model
