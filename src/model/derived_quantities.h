#pragma once
// Quantities that follow from the fitted parameters (docs/methods.md §6), each
// with its gradient with respect to the parameters it uses, so that its
// uncertainty follows from the parameter covariance by the delta method:
//     Var(g) ≈ ∇gᵀ · Cov · ∇g.

#include <string>
#include <vector>

namespace coilspin::model {

struct DerivedFormula {
  std::string key;                      // "electrical_time_constant"
  std::string symbol;                   // "tau_e"
  std::string unit;                     // "s"
  std::vector<std::string> uses;        // parameter keys, in gradient order
  double value = 0.0;
  std::vector<double> gradient;         // ∂g/∂(each of `uses`)
};

// τe = L/R [s];  ∂τe/∂L = 1/R,  ∂τe/∂R = −L/R²
inline DerivedFormula ElectricalTimeConstant(double resistance_ohm, double inductance_H) {
  return {"electrical_time_constant", "tau_e", "s", {"resistance", "inductance"},
          inductance_H / resistance_ohm,
          {-inductance_H / (resistance_ohm * resistance_ohm), 1.0 / resistance_ohm}};
}

}  // namespace coilspin::model
