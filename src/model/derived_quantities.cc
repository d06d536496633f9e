#include "src/model/derived_quantities.h"

#include <algorithm>
#include <cmath>

#include "src/units/constants.h"

namespace coilspin::model {
namespace {

// Golden-section search for the peak efficiency: iterations to shrink the
// bracket by 0.618^60 ≈ 3e-13 (far below any parameter's uncertainty).
constexpr int kGoldenSectionIterations = 60;

double Get(const ParameterValues& p, const char* key, double fallback = 0.0) {
  const auto it = p.find(key);
  return it == p.end() ? fallback : it->second;
}

bool HasAll(const ParameterValues& p, const std::vector<std::string>& keys) {
  return std::all_of(keys.begin(), keys.end(), [&](const std::string& k) { return p.count(k) > 0; });
}

double Drive(const ParameterValues& p, double voltage_V) { return voltage_V - Get(p, "brush_drop"); }

double Efficiency(const ParameterValues& p, double voltage_V, double speed_rad_s) {
  const double current_A = (Drive(p, voltage_V) - Get(p, "back_emf_constant") * speed_rad_s) / Get(p, "resistance");
  return ShaftTorque(p, voltage_V, speed_rad_s) * speed_rad_s / (voltage_V * current_A);
}

double PeakEfficiency(const ParameterValues& p, double voltage_V) {
  const double golden = (std::sqrt(5.0) - 1.0) / 2.0;
  double lo = 0.0, hi = NoLoadSpeed(p, voltage_V);
  for (int k = 0; k < kGoldenSectionIterations; ++k) {
    const double a = hi - golden * (hi - lo), b = lo + golden * (hi - lo);
    if (Efficiency(p, voltage_V, a) < Efficiency(p, voltage_V, b)) lo = a; else hi = b;
  }
  return Efficiency(p, voltage_V, 0.5 * (lo + hi));
}

}  // namespace

double ShaftTorque(const ParameterValues& p, double voltage_V, double speed_rad_s) {
  // τ(ω) = Kt·(V − Vb − Ke·ω)/R − B·ω − Tc
  return Get(p, "torque_constant") * (Drive(p, voltage_V) - Get(p, "back_emf_constant") * speed_rad_s) /
             Get(p, "resistance") -
         Get(p, "viscous_friction") * speed_rad_s - Get(p, "coulomb_friction");
}

double NoLoadSpeed(const ParameterValues& p, double voltage_V) {
  const double kt = Get(p, "torque_constant"), ke = Get(p, "back_emf_constant"), r = Get(p, "resistance");
  // ω = (Kt·(V − Vb)/R − Tc)/(Kt·Ke/R + B)
  return (kt * Drive(p, voltage_V) / r - Get(p, "coulomb_friction")) / (kt * ke / r + Get(p, "viscous_friction"));
}

std::string DerivedNote(const std::string& key) {
  if (key == "stall_torque") return "without friction: Kt*(V - Vb)/R";
  if (key == "stall_torque_with_friction") return "with friction: Kt*(V - Vb)/R - Tc, the torque-speed line at zero speed";
  return "";
}

std::vector<std::string> DerivedKeys() {
  ParameterValues all;
  for (const char* key : {"resistance", "inductance", "back_emf_constant", "torque_constant", "inertia",
                          "viscous_friction", "coulomb_friction", "brush_drop"})
    all[key] = 1.0;  // any values: only which formulas apply matters here
  std::vector<std::string> keys;
  for (const auto& formula : DerivedFormulas(all, 1.0)) keys.push_back(formula.key);
  return keys;
}

std::vector<DerivedFormula> DerivedFormulas(const ParameterValues& available, double voltage_V) {
  const double v = voltage_V;
  std::vector<DerivedFormula> all = {
      {"stall_current", "I_stall", "A", {"resistance"}, true,
       [v](const ParameterValues& p) { return Drive(p, v) / Get(p, "resistance"); }},
      {"stall_torque", "T_stall", "N*m", {"resistance", "torque_constant"}, true,
       [v](const ParameterValues& p) { return Get(p, "torque_constant") * Drive(p, v) / Get(p, "resistance"); }},
      {"stall_torque_with_friction", "T_stall_f", "N*m", {"resistance", "torque_constant", "coulomb_friction"}, true,
       [v](const ParameterValues& p) {
         return Get(p, "torque_constant") * Drive(p, v) / Get(p, "resistance") - Get(p, "coulomb_friction");
       }},
      {"no_load_speed_ideal", "w_nl0", "rad/s", {"back_emf_constant"}, true,
       [v](const ParameterValues& p) { return Drive(p, v) / Get(p, "back_emf_constant"); }},
      {"no_load_speed", "w_nl", "rad/s",
       {"resistance", "torque_constant", "back_emf_constant", "viscous_friction", "coulomb_friction"}, true,
       [v](const ParameterValues& p) { return NoLoadSpeed(p, v); }},
      {"no_load_current", "I_nl", "A",
       {"resistance", "torque_constant", "back_emf_constant", "viscous_friction", "coulomb_friction"}, true,
       [v](const ParameterValues& p) {
         return (Get(p, "viscous_friction") * NoLoadSpeed(p, v) + Get(p, "coulomb_friction")) / Get(p, "torque_constant");
       }},
      {"electrical_time_constant", "tau_e", "s", {"resistance", "inductance"}, false,
       [](const ParameterValues& p) { return Get(p, "inductance") / Get(p, "resistance"); }},
      {"mechanical_time_constant", "tau_m", "s", {"resistance", "inertia", "torque_constant", "back_emf_constant"}, false,
       [](const ParameterValues& p) {
         return Get(p, "resistance") * Get(p, "inertia") / (Get(p, "torque_constant") * Get(p, "back_emf_constant"));
       }},
      {"speed_constant", "Kv", "rpm/V", {"back_emf_constant"}, false,
       [](const ParameterValues& p) { return units::kRpmPerRadPerSecond / Get(p, "back_emf_constant"); }},
      {"speed_constant_si", "Kv_SI", "rad/(s*V)", {"back_emf_constant"}, false,
       [](const ParameterValues& p) { return 1.0 / Get(p, "back_emf_constant"); }},
      {"motor_constant", "Km", "N*m/sqrt(W)", {"resistance", "torque_constant"}, false,
       [](const ParameterValues& p) { return Get(p, "torque_constant") / std::sqrt(Get(p, "resistance")); }},
      {"speed_torque_slope", "dw/dT", "rad/(s*N*m)", {"resistance", "torque_constant", "back_emf_constant"}, false,
       [](const ParameterValues& p) {
         return Get(p, "resistance") / (Get(p, "torque_constant") * Get(p, "back_emf_constant"));
       }},
      {"max_output_power", "P_max", "W",
       {"resistance", "torque_constant", "back_emf_constant", "viscous_friction", "coulomb_friction"}, true,
       [v](const ParameterValues& p) {
         const double a = Get(p, "torque_constant") * Drive(p, v) / Get(p, "resistance") - Get(p, "coulomb_friction");
         const double k = Get(p, "torque_constant") * Get(p, "back_emf_constant") / Get(p, "resistance") +
                          Get(p, "viscous_friction");
         return a * a / (4.0 * k);
       }},
      {"peak_efficiency", "eta_max", "1",
       {"resistance", "torque_constant", "back_emf_constant", "viscous_friction", "coulomb_friction"}, true,
       [v](const ParameterValues& p) { return PeakEfficiency(p, v); }},
  };
  std::vector<DerivedFormula> result;
  for (auto& f : all)
    if (HasAll(available, f.uses)) result.push_back(std::move(f));
  return result;
}

}  // namespace coilspin::model
