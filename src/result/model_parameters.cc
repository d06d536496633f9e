#include "src/result/model_parameters.h"

#include <cmath>

namespace coilspin::result {
namespace {

std::string ReasonFor(const MotorEstimate& e, const std::string& key) {
  for (const auto& [missing, reason] : e.not_identified)
    if (missing == key) return reason;
  return "not in the result file";
}

}  // namespace

ModelParameters ModelParametersOf(const MotorEstimate& e) {
  ModelParameters m;
  const struct {
    const char* key;
    double* value;
    bool needed;
  } fields[] = {{"resistance", &m.values.resistance_ohm, true},
                {"inductance", &m.values.inductance_H, true},
                {"back_emf_constant", &m.values.back_emf_constant_V_s_per_rad, true},
                {"torque_constant", &m.values.torque_constant_N_m_per_A, true},
                {"inertia", &m.values.inertia_kg_m2, true},
                {"viscous_friction", &m.values.viscous_friction_N_m_s_per_rad, false},
                {"coulomb_friction", &m.values.coulomb_friction_N_m, false},
                {"brush_drop", &m.values.brush_drop_V, false}};
  for (const auto& f : fields) {
    if (const QuantityEstimate* q = e.Find(f.key)) {
      *f.value = q->value;
      if (f.needed && !(std::isfinite(q->value) && q->value > 0.0))
        m.missing.push_back({f.key, "its value in the result (" + std::to_string(q->value) + ") is not a positive number"});
    } else if (f.needed) {
      m.missing.push_back({f.key, ReasonFor(e, f.key)});
    } else {
      m.taken_as_zero.push_back(f.key);
    }
  }
  return m;
}

}  // namespace coilspin::result
