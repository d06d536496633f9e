#pragma once
// Quantities that follow from the fitted parameters at a stated terminal
// voltage V (docs/methods.md §6). Each is a formula of named parameters; its
// uncertainty follows from the parameter covariance by the delta method
// (src/result/derived_intervals.h).
//
// Steady state, shaft torque on the torque–speed line (friction included when known):
//   τ(ω) = Kt·(V − Vb − Ke·ω)/R − B·ω − Tc
//   stall (ω = 0): i = (V − Vb)/R,  τ = Kt·(V − Vb)/R without friction,
//                  Kt·(V − Vb)/R − Tc with friction (the line's end at ω → 0⁺)
//   no-load (τ = 0): ω = (Kt·(V − Vb)/R − Tc)/(Kt·Ke/R + B),  i = (B·ω + Tc)/Kt;
//                    ideal (frictionless) ω = (V − Vb)/Ke
//   time constants: τe = L/R,  τm = R·J/(Kt·Ke)
//   Kv = 1/Ke (in rad/(s·V), and in rpm/V as quoted),  Km = Kt/√R,
//   slope of the speed–torque line (friction aside) −dω/dτ = R/(Kt·Ke)
//   maximum output power on the line: a²/(4k), a = Kt(V−Vb)/R − Tc, k = Kt·Ke/R + B
//   peak efficiency: max over ω of τ(ω)·ω / (V·i(ω)),  i(ω) = (V − Vb − Ke·ω)/R

#include <functional>
#include <map>
#include <string>
#include <vector>

namespace coilspin::model {

using ParameterValues = std::map<std::string, double>;  // key ("resistance", ...) → SI value

struct DerivedFormula {
  std::string key;                      // "stall_torque"
  std::string symbol;                   // "T_stall"
  std::string unit;                     // "N*m"
  std::vector<std::string> uses;        // parameter keys it needs
  bool at_voltage = false;              // refers to the operating voltage
  std::function<double(const ParameterValues&)> value;
};

// The formulas whose parameters are all present in `available` (brush_drop
// counts as 0 when absent). V is the operating voltage.
std::vector<DerivedFormula> DerivedFormulas(const ParameterValues& available, double voltage_V);

// What a derived figure includes, where its name alone could mislead (the two
// stall torques); empty otherwise.
std::string DerivedNote(const std::string& key);

// The key of every formula (all parameters present).
std::vector<std::string> DerivedKeys();

// Shaft torque τ(ω) at V; friction terms are used when present.
double ShaftTorque(const ParameterValues& p, double voltage_V, double speed_rad_s);
// No-load speed at V (with friction when present).
double NoLoadSpeed(const ParameterValues& p, double voltage_V);

}  // namespace coilspin::model
