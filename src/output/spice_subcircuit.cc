#include "src/output/spice_subcircuit.h"

#include <algorithm>
#include <sstream>

#include "src/model/smooth_sign.h"
#include "src/output/number_format.h"

namespace coilspin::output {
namespace {

// With neither B nor Tc the shaft node has no DC path to ground and a SPICE
// operating point is singular; a conductance of 1e-12 S (B = 1e-12 N·m·s/rad,
// far below any bench's resolution) gives it one (common practice: SPICE's own
// GMIN default is 1e-12 S).
constexpr double kRestConductance_S = 1e-12;

bool Absent(const result::ModelParameters& p, const char* key) {
  return std::find(p.taken_as_zero.begin(), p.taken_as_zero.end(), key) != p.taken_as_zero.end();
}

// "* R  = 1.3712 ohm, 95 % interval [1.3701, 1.3723] (locked-rotor)"
std::string ParameterComment(const MotorEstimate& e, const char* key, double confidence) {
  const QuantityEstimate* q = e.Find(key);
  if (!q) return "";
  std::string tests;
  for (const auto& t : q->tests) tests += (tests.empty() ? "" : ", ") + t;
  std::ostringstream line;
  line << "* " << q->symbol << " = " << FormatValue(q->value, q->std_error) << " " << q->unit << ", "
       << ShortNumber(100.0 * confidence, 4) << " % interval [" << FormatValue(q->ci_low, q->std_error) << ", "
       << FormatValue(q->ci_high, q->std_error) << "]";
  if (!tests.empty()) line << " (" << tests << ")";
  if (!q->basis.empty()) line << ", basis " << q->basis;
  line << "\n";
  return line.str();
}

}  // namespace

std::string SpiceSubcircuit(const MotorEstimate& e, const result::ModelParameters& parameters,
                            const std::string& name, const ExportSource& source) {
  const model::MotorParameters& p = parameters.values;
  const bool brush = !Absent(parameters, "brush_drop") && p.brush_drop_V != 0.0;
  const bool viscous = !Absent(parameters, "viscous_friction") && p.viscous_friction_N_m_s_per_rad > 0.0;
  const bool coulomb = !Absent(parameters, "coulomb_friction") && p.coulomb_friction_N_m != 0.0;
  const std::string wi = ExactNumber(model::kBrushSignWidth_A);
  const std::string ww = ExactNumber(model::kFrictionSignWidth_rad_s);

  std::ostringstream s;
  s << ".subckt " << name << " p n shaft\n";
  s << "* Permanent-magnet DC motor" << (source.motor_label.empty() ? "" : " \"" + source.motor_label + "\"")
    << ", exported by coilspin from " << source.result_file << " (" << source.result_format << "). SI units.\n";
  s << "* Pins: p, n = motor terminals (+, -); shaft = mechanical port:\n"
       "*   V(shaft) to ground = speed [rad/s] (1 V = 1 rad/s);\n"
       "*   current drawn out of shaft = load torque [N*m] (1 A = 1 N*m).\n"
       "* Model: v = R*i + L*di/dt + Ke*w + Vb*sgn(i);  J*dw/dt = Kt*i - B*w - Tc*sgn(w) - T_load\n"
       "* Analogy: J is a capacitance (1 F = 1 kg*m^2), B a conductance (1 S = 1 N*m*s/rad),\n"
       "*   Kt*i a current source into shaft, Ke*w a voltage source in the winding.\n";
  s << "* sgn(x) is smoothed as tanh(x/w): w = " << wi << " A for the brush drop, w = " << ww
    << " rad/s for Coulomb friction\n"
       "*   (within 1e-4 of sgn beyond 5 w; below Tc the shaft creeps at w*atanh(T/Tc) instead of sticking).\n";
  s << "* Needs behavioural (B) sources with tanh, e.g. ngspice.\n";
  for (const char* key : {"resistance", "inductance", "back_emf_constant", "torque_constant", "inertia",
                          "viscous_friction", "coulomb_friction", "brush_drop"})
    s << ParameterComment(e, key, source.confidence);
  for (const auto& key : parameters.taken_as_zero) s << "* " << key << " not determined by the fit: left out (0)\n";

  // Winding: p -R- 1 -L- 2 -brush drop- 3 -back-EMF- 4 -sense- n
  s << "R_winding p 1 " << ExactNumber(p.resistance_ohm) << "\n";
  s << "L_winding 1 " << (brush ? "2 " : "3 ") << ExactNumber(p.inductance_H) << "\n";
  if (brush) s << "B_brush 2 3 V = " << ExactNumber(p.brush_drop_V) << "*tanh(I(V_sense)/" << wi << ")\n";
  s << "E_back_emf 3 4 shaft 0 " << ExactNumber(p.back_emf_constant_V_s_per_rad) << "\n";
  s << "V_sense 4 n DC 0\n";
  // Shaft: torque in, inertia, friction out.
  s << "F_torque 0 shaft V_sense " << ExactNumber(p.torque_constant_N_m_per_A) << "\n";
  s << "C_inertia shaft 0 " << ExactNumber(p.inertia_kg_m2) << "\n";
  if (viscous) s << "R_viscous shaft 0 " << ExactNumber(1.0 / p.viscous_friction_N_m_s_per_rad) << "\n";
  if (coulomb) s << "B_coulomb shaft 0 I = " << ExactNumber(p.coulomb_friction_N_m) << "*tanh(V(shaft)/" << ww << ")\n";
  if (!viscous && !coulomb)
    s << "R_rest shaft 0 " << ExactNumber(1.0 / kRestConductance_S)
      << "\n* R_rest: a DC path for the operating point (B = 1e-12 N*m*s/rad, negligible)\n";
  s << ".ends " << name << "\n";
  return s.str();
}

}  // namespace coilspin::output
