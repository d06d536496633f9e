#include "fitters/joint/motor_fit.h"

#include <algorithm>

#include "fitters/joint/derived.h"

namespace coilspin::joint {
namespace {

bool Has(const MotorEstimate& e, const std::string& key) {
  if (e.Find(key)) return true;
  return std::any_of(e.not_identified.begin(), e.not_identified.end(),
                     [&](const auto& entry) { return entry.first == key; });
}

// Why a model parameter is undetermined when no test of the set informs it.
void AddMissingReasons(MotorEstimate* e) {
  const std::pair<const char*, const char*> reasons[] = {
      {"resistance", "needs a locked-rotor test"},
      {"inductance", "needs a locked-rotor step capture"},
      {"brush_drop", "needs locked-rotor plateaus at 2 or more current levels"},
      {"back_emf_constant", "needs a no-load, spin-down (with terminal voltage) or step test"},
      {"torque_constant", "needs a torque column, or a back-EMF measurement to assume Kt = Ke"},
      {"inertia", "needs a spin-down or step test"},
      {"viscous_friction", "needs a no-load or spin-down test"},
      {"coulomb_friction", "needs a no-load or spin-down test"},
  };
  for (const auto& [key, reason] : reasons)
    if (!Has(*e, key)) e->not_identified.push_back({key, reason});
}

}  // namespace

bool MotorFitOptions::IsValid(std::string* error) const {
  if (!(confidence > 0.0 && confidence < 1.0)) {
    *error = "confidence must lie between 0 and 1 (exclusive)";
    return false;
  }
  return locked_rotor.IsValid(error);
}

bool IsSupported(TestKind kind) { return kind == TestKind::kLockedRotor; }

MotorEstimate FitMotor(const std::vector<TestLog>& tests, const MotorFitOptions& options) {
  std::vector<const BenchLog*> locked;
  for (const auto& t : tests)
    if (t.kind == TestKind::kLockedRotor) locked.push_back(&t.log);
  MotorEstimate e;
  if (!locked.empty()) {
    locked_rotor::LockedRotorOptions lr = options.locked_rotor;
    lr.confidence = options.confidence;
    e = locked_rotor::FitLockedRotor(locked, lr);
  }
  e.motor_label = options.motor_label;
  e.confidence = options.confidence;
  AddMissingReasons(&e);
  const QuantityEstimate* r = e.Find("resistance");
  const QuantityEstimate* l = e.Find("inductance");
  if (r && l) {
    if (auto q = DeriveWithInterval(model::ElectricalTimeConstant(r->value, l->value), e)) e.derived.push_back(*q);
  }
  Consistency c;
  c.verdict = "not-checked";
  c.note = "needs Kt and Ke from independent evidence (a torque column and a back-EMF measurement)";
  e.consistency = c;
  return e;
}

}  // namespace coilspin::joint
