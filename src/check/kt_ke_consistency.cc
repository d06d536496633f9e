#include "src/check/kt_ke_consistency.h"

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>
#include <cmath>
#include <cstdio>
#include <stdexcept>
#include <vector>

#include "src/check/unit_slips.h"
#include "src/check/winding_conventions.h"

namespace coilspin::check {
namespace {

constexpr int kShownDigits = 4;  // digits of ratios and bounds in the notes

std::string Shown(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.*g", kShownDigits, value);
  return buffer;
}

std::string Band(double tolerance) { return "1 \u00b1 " + Shown(tolerance); }

// The upper two-sided quantile t_{(1+c)/2, ν} (Boost.Math; ν = +inf: normal).
double UpperQuantile(double confidence, double degrees_of_freedom) {
  const double upper_tail = (1.0 - confidence) / 2.0;
  if (std::isinf(degrees_of_freedom)) {
    return boost::math::quantile(boost::math::complement(boost::math::normal_distribution<double>(), upper_tail));
  }
  return boost::math::quantile(
      boost::math::complement(boost::math::students_t_distribution<double>(degrees_of_freedom), upper_tail));
}

void RequireTolerance(double tolerance) {
  if (!IsValidKtKeTolerance(tolerance)) {
    throw std::invalid_argument("Kt/Ke consistency: the tolerance must lie strictly between 0 and 1");
  }
}

std::string DescribeMatch(const MismatchFactor& factor) {
  const std::string what = factor.kind == MismatchKind::kWindingConvention
                               ? "a brushless winding convention (star-connected, sinusoidal; k_ph = phase "
                                 "back-EMF amplitude per rad/s)"
                               : "a unit slip";
  const std::string value = Shown(factor.kt_over_ke);
  return factor.name + (factor.name == value ? "" : " = " + value) + ", " + what + ": " + factor.explanation;
}

std::string DatasheetExplanation(double ratio, double tolerance, const std::optional<MismatchMatch>& cause) {
  const std::string head = "Kt/Ke = " + Shown(ratio);
  if (std::fabs(ratio - 1.0) <= tolerance) {
    return head + " lies within " + Band(tolerance) +
           ": the torque and back-EMF constants agree (in SI, 1 N*m/A = 1 V*s/rad).";
  }
  if (!cause) {
    return head + " lies outside " + Band(tolerance) +
           " and matches no brushless winding convention or unit slip within the tolerance: one of the figures "
           "is wrong, or the two do not describe the same motor.";
  }
  std::string text = head + " lies outside " + Band(tolerance) + ". It matches " + DescribeMatch(cause->factor) + ".";
  for (const MismatchFactor& other : cause->also) text += " Also within the tolerance: " + DescribeMatch(other) + ".";
  return text;
}

}  // namespace

bool IsValidKtKeTolerance(double tolerance) { return tolerance > 0.0 && tolerance < 1.0; }

Consistency CheckFittedKtKe(const FittedKtKeRatio& ratio, double confidence, double tolerance) {
  RequireTolerance(tolerance);
  if (!(confidence > 0.0 && confidence < 1.0)) {
    throw std::invalid_argument("Kt/Ke consistency: the confidence must lie strictly between 0 and 1");
  }
  Consistency result;
  result.tolerance = tolerance;
  if (!std::isfinite(ratio.value) || !std::isfinite(ratio.std_error) || ratio.std_error < 0.0 ||
      !(ratio.degrees_of_freedom > 0.0)) {
    result.verdict = "not-checked";
    result.note = "the Kt/Ke interval could not be formed (ratio " + Shown(ratio.value) + ", standard error " +
                  Shown(ratio.std_error) + ", degrees of freedom " + Shown(ratio.degrees_of_freedom) + ")";
    return result;
  }
  const double half_width = UpperQuantile(confidence, ratio.degrees_of_freedom) * ratio.std_error;
  result.kt_over_ke = ratio.value;
  result.ci_low = ratio.value - half_width;
  result.ci_high = ratio.value + half_width;
  const double band_low = 1.0 - tolerance;
  const double band_high = 1.0 + tolerance;
  const std::string interval = "the " + Shown(confidence) + " interval of Kt/Ke [" + Shown(*result.ci_low) + ", " +
                               Shown(*result.ci_high) + "]";
  if (*result.ci_low <= band_high && *result.ci_high >= band_low) {
    result.verdict = "consistent";
    result.note = interval + " overlaps " + Band(tolerance) + " (tolerance " + Shown(tolerance) +
                  "): Kt and Ke agree within it (in SI, 1 N*m/A = 1 V*s/rad)";
  } else {
    result.verdict = "inconsistent";
    result.note = interval + " lies entirely " + (*result.ci_high < band_low ? "below " : "above ") +
                  Band(tolerance) + " (tolerance " + Shown(tolerance) +
                  "): Kt and Ke differ by more than the tolerance";
  }
  return result;
}

Consistency KtKeNotCheckedResult(KtKeNotChecked reason, double tolerance) {
  RequireTolerance(tolerance);
  Consistency result;
  result.tolerance = tolerance;
  result.verdict = "not-checked";
  switch (reason) {
    case KtKeNotChecked::kKtAssumedEqualToKe:
      result.note = "Kt was not measured but taken equal to Ke (SI), so Kt/Ke = 1 by construction and tells nothing";
      break;
    case KtKeNotChecked::kKtMissing:
      result.note = "Kt was not determined by the given tests (it needs a torque measurement)";
      break;
    case KtKeNotChecked::kKeMissing:
      result.note = "Ke was not determined by the given tests (it needs a no-load, spin-down or step test)";
      break;
  }
  return result;
}

DatasheetKtKe CheckDatasheetKtKe(const units::MotorConstant& kt, const units::MotorConstant& ke, double tolerance) {
  RequireTolerance(tolerance);
  if (kt.kind != units::ConstantKind::kTorqueConstant) {
    throw std::invalid_argument("CheckDatasheetKtKe: kt must be a torque constant");
  }
  if (ke.kind == units::ConstantKind::kTorqueConstant) {
    throw std::invalid_argument("CheckDatasheetKtKe: ke must be a back-EMF or speed constant");
  }
  if (!(kt.value_si > 0.0 && std::isfinite(kt.value_si) && ke.value_si > 0.0 && std::isfinite(ke.value_si))) {
    throw std::invalid_argument("CheckDatasheetKtKe: both constants must be positive and finite");
  }
  DatasheetKtKe result;
  result.torque_constant_N_m_per_A = kt.value_si;
  result.back_emf_constant_V_s_per_rad = units::BackEmfConstantOf_V_s_per_rad(ke);
  result.kt_over_ke = result.torque_constant_N_m_per_A / result.back_emf_constant_V_s_per_rad;
  result.tolerance = tolerance;
  if (std::fabs(result.kt_over_ke - 1.0) <= tolerance) {
    result.verdict = "consistent";
  } else {
    result.verdict = "inconsistent";
    std::vector<MismatchFactor> candidates = WindingConventionFactors();
    const std::vector<MismatchFactor> slips = UnitSlipFactors(kt, ke);
    candidates.insert(candidates.end(), slips.begin(), slips.end());
    result.cause = NearestMismatch(candidates, result.kt_over_ke, tolerance);
  }
  result.explanation = DatasheetExplanation(result.kt_over_ke, tolerance, result.cause);
  return result;
}

}  // namespace coilspin::check
