#pragma once
// The covariance of every parameter of a result, in SI, as result format 2
// writes it and as exports and tuning use it.
//
// The fit estimates a vector θ with covariance C (MotorEstimate::covariance,
// over correlation_names). The result lists more parameters than θ holds:
//   - Kt taken equal to Ke (basis "equal-to-Ke") is the same parameter as Ke,
//     so its row and column are Ke's: Cov(Kt, x) = Cov(Ke, x), Var(Kt) =
//     Cov(Kt, Ke) = Var(Ke), and its correlation with Ke is 1;
//   - a given value (basis "given", e.g. --known-inertia) is a constant of the
//     fit: its row and column are 0, and it has no correlation (left out there).
// With these, any g(parameters) has Var g = ∇gᵀ·C_full·∇g over all of them.
// The order is that of MotorEstimate::parameters.

#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"

namespace coilspin::result {

struct NamedMatrix {
  std::vector<std::string> names;
  std::vector<std::vector<double>> matrix;  // matrix[a][b] belongs to names[a], names[b]
};

inline constexpr const char* kTiedToKeBasis = "equal-to-Ke";
inline constexpr const char* kGivenBasis = "given";

// Empty when the estimate has no covariance (a fit without a usable one).
NamedMatrix FullCovariance(const MotorEstimate& estimate);
// The correlation over the same parameters less the given ones.
NamedMatrix FullCorrelation(const MotorEstimate& estimate);

// The inverse: the estimate's own covariance, correlation and correlation_names
// from a full covariance and correlation (as read from a result file).
// Throws std::invalid_argument naming the parameter when the full matrices do
// not have the layout above (a name not among the parameters, a tied Kt whose
// row is not Ke's is accepted and ignored: Kt follows Ke).
void SetFromFull(const NamedMatrix& covariance, const NamedMatrix& correlation, MotorEstimate* estimate);

}  // namespace coilspin::result
