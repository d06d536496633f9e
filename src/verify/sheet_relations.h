#pragma once
// The relations of the motor model (docs/methods.md §6) that tie a datasheet's
// own lines together, evaluated at the sheet's rated voltage V, with Kt and Ke
// in SI (1 N·m/A = 1 V·s/rad):
//   torque_constant          = Ke                          (an ideal machine: E·I = T·ω)
//   speed_constant           = 1/Ke                        (Kv in SI)
//   stall_torque             = Kt·(V − Vb)/R
//   stall_current            = (V − Vb)/R
//   no_load_speed            = (V − Vb − R·I0)/Ke          (I0: no-load current)
//   motor_constant           = Kt/√R
//   mechanical_time_constant = R·J/(Kt·Ke)
//   electrical_time_constant = L/R
//   speed_torque_slope       = R/(Kt·Ke)
//   max_output_power         = (V − Vb − R·I0)²/(4R)
//   peak_efficiency          = ((V − Vb)/V)·(1 − √(I0·R/(V − Vb)))²
// The last two take Kt = Ke (SI) and friction as the constant torque Kt·I0 that
// the no-load current I0 feeds (physics: then τ(I) = Kt·(I − I0) and
// ω = (V − Vb − R·I)/Ke; the output power τ·ω is largest at
// I = (I_stall + I0)/2, and the efficiency τ·ω/(V·I) =
// ((V − Vb)/V)·(1 − I0/I)·(1 − I/I_stall) at I = √(I0·I_stall), with
// I_stall = (V − Vb)/R). Vb and I0 are 0 when the sheet does not state them.
// Ke is the sheet's back-EMF constant, else 1/Kv, else Kt; Kt the torque
// constant, else Ke.

#include <functional>
#include <map>
#include <string>
#include <vector>

namespace coilspin::verify {

// The sheet's figures by key, SI.
using LineValues = std::map<std::string, double>;

struct Relation {
  std::string formula;              // "stall_torque = Kt*(V - Vb)/R", with the terms the sheet gives
  std::string stated;               // the line it predicts
  std::vector<std::string> inputs;  // the lines it predicts it from (the keys standing for Kt, Ke, R, ...)
  bool uses_voltage = false;        // depends on V (a line printed for another voltage would break it)
  std::function<double(const LineValues&, double voltage_V)> predict;
};

// The relations whose lines the sheet states (`present`: the keys of its lines).
std::vector<Relation> RelationsFor(const std::vector<std::string>& present);

}  // namespace coilspin::verify
