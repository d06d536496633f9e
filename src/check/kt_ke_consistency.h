#pragma once
// Kt/Ke consistency (docs/methods.md, "Kt/Ke consistency").
//
// In SI the torque constant and the back-EMF constant share a unit,
// 1 N·m/A = 1 V·s/rad, and an ideal machine has Kt = Ke: its power balance
// E·I = T·ω with E = Ke·ω and T = Kt·I. A real motor, or a datasheet, is judged
// by how far Kt/Ke is from 1:
//   fit        the interval r ± t_{(1+c)/2, ν}·se (Student-t, ν degrees of freedom)
//              is "consistent" when it overlaps [1 − tol, 1 + tol] and
//              "inconsistent" when it lies entirely outside;
//   datasheet  the two figures carry no uncertainty: "consistent" when
//              |r − 1| ≤ tol; otherwise the check looks for the cause among the
//              brushless winding conventions (winding_conventions.h) and the unit
//              slips (unit_slips.h) and names the nearest one within the tolerance.
// The default tolerance is units::kDefaultKtKeTolerance (0.05, common practice).

#include <optional>
#include <string>

#include "fitters/core/motor_estimate.h"
#include "src/check/mismatch_factor.h"
#include "src/units/compound_units.h"
#include "src/units/constants.h"

namespace coilspin::check {

// A tolerance must lie strictly between 0 and 1.
bool IsValidKtKeTolerance(double tolerance);

// Kt/Ke of a fit with its standard error (delta method from the covariance) and
// the degrees of freedom of that error (+inf: normal quantile).
struct FittedKtKeRatio {
  double value = 0.0;
  double std_error = 0.0;
  double degrees_of_freedom = 0.0;
};

// The verdict on a fitted ratio at two-sided `confidence` (0 < c < 1). A ratio
// without a finite value, standard error or positive degrees of freedom is
// "not-checked", with the reason. Throws std::invalid_argument for a confidence
// or tolerance out of range (callers validate options first).
Consistency CheckFittedKtKe(const FittedKtKeRatio& ratio, double confidence,
                            double tolerance = units::kDefaultKtKeTolerance);

enum class KtKeNotChecked {
  kKtAssumedEqualToKe,  // Kt not measured, taken equal to Ke: the ratio is 1 by construction
  kKtMissing,           // no test determined Kt
  kKeMissing,           // no test determined Ke
};

// "not-checked", with the reason in the note and no ratio.
Consistency KtKeNotCheckedResult(KtKeNotChecked reason, double tolerance = units::kDefaultKtKeTolerance);

struct DatasheetKtKe {
  double torque_constant_N_m_per_A = 0.0;
  double back_emf_constant_V_s_per_rad = 0.0;  // from Kv when Kv was given
  double kt_over_ke = 0.0;
  double tolerance = 0.0;
  std::string verdict;                  // "consistent" | "inconsistent"
  std::optional<MismatchMatch> cause;   // when inconsistent and a known factor explains it
  std::string explanation;              // the verdict in words, with the cause
};

// `kt` must be a torque constant, `ke` a back-EMF or speed constant, both
// positive and finite; otherwise std::invalid_argument (callers validate input).
DatasheetKtKe CheckDatasheetKtKe(const units::MotorConstant& kt, const units::MotorConstant& ke,
                                 double tolerance = units::kDefaultKtKeTolerance);

}  // namespace coilspin::check
