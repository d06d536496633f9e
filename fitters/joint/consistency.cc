#include "fitters/joint/consistency.h"

#include "fitters/joint/derived.h"
#include "src/check/kt_ke_consistency.h"

namespace coilspin::joint {

Consistency CheckConsistency(const MotorEstimate& e, bool kt_measured, double tolerance) {
  if (!e.Find("back_emf_constant")) return check::KtKeNotCheckedResult(check::KtKeNotChecked::kKeMissing, tolerance);
  if (!e.Find("torque_constant")) return check::KtKeNotCheckedResult(check::KtKeNotChecked::kKtMissing, tolerance);
  if (!kt_measured) return check::KtKeNotCheckedResult(check::KtKeNotChecked::kKtAssumedEqualToKe, tolerance);
  const model::DerivedFormula ratio{"kt_over_ke", "Kt/Ke", "1", {"torque_constant", "back_emf_constant"}, false,
                                    [](const model::ParameterValues& p) {
                                      return p.at("torque_constant") / p.at("back_emf_constant");
                                    }};
  const auto q = DeriveWithInterval(ratio, e, 0.0);
  if (!q) return check::KtKeNotCheckedResult(check::KtKeNotChecked::kKtMissing, tolerance);
  return check::CheckFittedKtKe({q->value, q->std_error, q->degrees_of_freedom}, e.confidence, tolerance);
}

}  // namespace coilspin::joint
