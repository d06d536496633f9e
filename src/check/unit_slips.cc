#include "src/check/unit_slips.h"

#include <cmath>
#include <cstdio>
#include <string>

namespace coilspin::check {
namespace {

// Decimal slips tried: 10^±1 … 10^±6 (common practice: micro to mega covers the
// prefixes datasheets use).
constexpr int kLargestDecimalSlipExponent = 6;
constexpr double kDecimalBase = 10.0;
// Units whose factors differ by less than this are synonyms, not a slip.
constexpr double kSameFactorRelative = 1e-12;
// Digits of a factor as shown in its name.
constexpr int kShownDigits = 4;

std::string Shown(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.*g", kShownDigits, value);
  return buffer;
}

bool SameFactor(double a, double b) { return std::fabs(a - b) <= kSameFactorRelative * std::fabs(b); }

// Slips of one figure: for each other unit m of its kind, Kt/Ke scales by
// (f_w/f_m)^direction, direction +1 for Kt and Kv, −1 for Ke (header).
void AddSlipsOf(const units::MotorConstant& figure, int direction, std::vector<MismatchFactor>* out) {
  const std::optional<units::CompoundConversion> written = units::LookUpCompoundUnit(figure.unit);
  if (!written) return;
  for (const FigureSlip& slip : FigureUnitSlips(written->factor_to_si, units::DistinctCompoundUnits(figure.kind))) {
    const double scale = std::pow(slip.read_over_meant, direction);
    out->push_back({MismatchKind::kUnitSlip, scale, Shown(scale),
                    "the " + std::string(units::ConstantKindName(figure.kind)) + " looks like " + slip.meant_unit +
                        " written as " + figure.unit});
  }
}

}  // namespace

std::vector<FigureSlip> FigureUnitSlips(double written_factor_to_si,
                                        const std::vector<units::CompoundUnitFactor>& same_kind) {
  std::vector<FigureSlip> slips;
  for (const units::CompoundUnitFactor& meant : same_kind) {
    if (SameFactor(meant.factor_to_si, written_factor_to_si)) continue;
    slips.push_back({meant.spelling, written_factor_to_si / meant.factor_to_si});
  }
  return slips;
}

std::vector<int> DecimalSlipExponents() {
  std::vector<int> exponents;
  for (int exponent = -kLargestDecimalSlipExponent; exponent <= kLargestDecimalSlipExponent; ++exponent) {
    if (exponent != 0) exponents.push_back(exponent);
  }
  return exponents;
}

std::vector<MismatchFactor> UnitSlipFactors(const units::MotorConstant& kt, const units::MotorConstant& ke) {
  std::vector<MismatchFactor> slips;
  AddSlipsOf(kt, +1, &slips);
  AddSlipsOf(ke, ke.kind == units::ConstantKind::kSpeedConstant ? +1 : -1, &slips);
  for (int exponent : DecimalSlipExponents()) {
    const double scale = std::pow(kDecimalBase, exponent);
    slips.push_back({MismatchKind::kUnitSlip, scale, Shown(scale),
                     "a decimal slip of 10^" + std::to_string(exponent) +
                         " in one of the figures (a misplaced decimal point or SI prefix)"});
  }
  return MergeEqualFactors(slips);
}

}  // namespace coilspin::check
