#include "src/units/compound_units.h"

#include <array>
#include <cmath>
#include <stdexcept>

#include "src/units/constants.h"
#include "src/units/unit_text.h"
#include "src/units/units.h"

namespace coilspin::units {
namespace {

struct KindInfo {
  ConstantKind kind;
  std::string_view name;
  std::string_view meaning;
  std::string_view si_unit;
};

constexpr std::array<KindInfo, 3> kKinds = {{
    {ConstantKind::kTorqueConstant, "torque constant", "torque per current", "N*m/A"},
    {ConstantKind::kBackEmfConstant, "back-EMF constant", "voltage per speed", "V*s/rad"},
    {ConstantKind::kSpeedConstant, "speed constant", "speed per voltage", "(rad/s)/V"},
}};

// One side of a compound unit: an SI prefix times a spelling of the unit table.
struct UnitTerm {
  double prefix;
  Quantity quantity;
  std::string_view spelling;
};

struct CompoundSpelling {
  ConstantKind kind;
  std::string_view spelling;  // matched exactly, after NormalisedUnitSpelling (unit_text.h)
  UnitTerm numerator;
  UnitTerm denominator;
};

// The one table of compound units. Factors come from the unit table: ozf·in,
// lbf·in and kgf·cm from NIST SP 811 Appendix B, rpm = 2π/60 rad/s (physics),
// prefixes from NIST SP 811 4.3. Per kind, the canonical (SI) spelling comes
// first. "N-m/A", "mN.m/A", "oz-in/A", "mN·m/A" reach these rows through
// NormalisedUnitSpelling.
constexpr std::array<CompoundSpelling, 19> kCompoundTable = {{
    // torque constant → N·m/A
    {ConstantKind::kTorqueConstant, "N*m/A", {1.0, Quantity::kTorque, "N*m"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "Nm/A", {1.0, Quantity::kTorque, "Nm"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "mN*m/A", {1.0, Quantity::kTorque, "mN*m"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "mNm/A", {1.0, Quantity::kTorque, "mNm"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "oz*in/A", {1.0, Quantity::kTorque, "oz*in"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "kgf*cm/A", {1.0, Quantity::kTorque, "kgf*cm"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "lbf*in/A", {1.0, Quantity::kTorque, "lbf*in"}, {1.0, Quantity::kCurrent, "A"}},
    // back-EMF constant → V·s/rad (= V/(rad/s))
    {ConstantKind::kBackEmfConstant, "V*s/rad", {1.0, Quantity::kVoltage, "V"}, {1.0, Quantity::kSpeed, "rad/s"}},
    {ConstantKind::kBackEmfConstant, "V/(rad/s)", {1.0, Quantity::kVoltage, "V"}, {1.0, Quantity::kSpeed, "rad/s"}},
    {ConstantKind::kBackEmfConstant, "V/rpm", {1.0, Quantity::kVoltage, "V"}, {1.0, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "V/krpm", {1.0, Quantity::kVoltage, "V"}, {kKilo, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "mV/rpm", {1.0, Quantity::kVoltage, "mV"}, {1.0, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "V/kRPM", {1.0, Quantity::kVoltage, "V"}, {kKilo, Quantity::kSpeed, "RPM"}},
    {ConstantKind::kBackEmfConstant, "V/Krpm", {1.0, Quantity::kVoltage, "V"}, {kKilo, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "mV/RPM", {1.0, Quantity::kVoltage, "mV"}, {1.0, Quantity::kSpeed, "RPM"}},
    // speed constant → (rad/s)/V
    {ConstantKind::kSpeedConstant, "(rad/s)/V", {1.0, Quantity::kSpeed, "rad/s"}, {1.0, Quantity::kVoltage, "V"}},
    {ConstantKind::kSpeedConstant, "rpm/V", {1.0, Quantity::kSpeed, "rpm"}, {1.0, Quantity::kVoltage, "V"}},
    {ConstantKind::kSpeedConstant, "krpm/V", {kKilo, Quantity::kSpeed, "rpm"}, {1.0, Quantity::kVoltage, "V"}},
    {ConstantKind::kSpeedConstant, "RPM/V", {1.0, Quantity::kSpeed, "RPM"}, {1.0, Quantity::kVoltage, "V"}},
}};

// Factors of two spellings closer than this are the same factor (they differ by
// rounding of the products that make them, ~1e-16).
constexpr double kSameFactorRelative = 1e-12;

const KindInfo& InfoOf(ConstantKind kind) {
  for (const KindInfo& info : kKinds) {
    if (info.kind == kind) return info;
  }
  return kKinds.front();  // unreachable: every enumerator has a row
}

// A term's factor to SI; every spelling of the table is in the unit table
// (tests/units/compound_units_test.cc checks it), so value() cannot throw.
double FactorOf(const UnitTerm& term) { return term.prefix * LookUpUnit(term.quantity, term.spelling).value().factor; }

double FactorOf(const CompoundSpelling& row) { return FactorOf(row.numerator) / FactorOf(row.denominator); }

std::string Joined(const std::vector<std::string>& words) {
  std::string text;
  for (const std::string& word : words) text += (text.empty() ? "" : ", ") + word;
  return text;
}

std::string AcceptedText() {
  std::string text;
  for (const KindInfo& info : kKinds) {
    text += (text.empty() ? "" : "; ") + std::string(info.name) + ": " + Joined(AcceptedCompoundUnits(info.kind));
  }
  return "accepted units are " + text + " ('\u00b7', or '-' and '.' between letters, may be written for '*')";
}

MotorConstantParse Failure(std::string message) { return {std::nullopt, std::move(message)}; }

}  // namespace

std::string_view ConstantKindName(ConstantKind kind) { return InfoOf(kind).name; }
std::string_view ConstantKindMeaning(ConstantKind kind) { return InfoOf(kind).meaning; }
std::string_view SiUnitOf(ConstantKind kind) { return InfoOf(kind).si_unit; }

std::optional<CompoundConversion> LookUpCompoundUnit(std::string_view spelling) {
  const std::string wanted = NormalisedUnitSpelling(spelling);
  for (const CompoundSpelling& row : kCompoundTable) {
    if (row.spelling == wanted) return CompoundConversion{row.kind, FactorOf(row)};
  }
  return std::nullopt;
}

std::vector<std::string> AcceptedCompoundUnits(ConstantKind kind) {
  std::vector<std::string> spellings;
  for (const CompoundSpelling& row : kCompoundTable) {
    if (row.kind == kind) spellings.emplace_back(row.spelling);
  }
  return spellings;
}

std::vector<CompoundUnitFactor> DistinctCompoundUnits(ConstantKind kind) {
  std::vector<CompoundUnitFactor> distinct;
  for (const CompoundSpelling& row : kCompoundTable) {
    if (row.kind != kind) continue;
    const double factor = FactorOf(row);
    bool seen = false;
    for (const CompoundUnitFactor& known : distinct) {
      seen = seen || std::fabs(known.factor_to_si - factor) <= kSameFactorRelative * std::fabs(factor);
    }
    if (!seen) distinct.push_back({std::string(row.spelling), factor});
  }
  return distinct;
}

MotorConstantParse ParseMotorConstant(std::string_view text) {
  const NumberAndUnit split = SplitNumberAndUnit(text, "2.2 oz*in/A");
  if (!split.value) return Failure(split.error);
  if (split.unit.empty()) return Failure("'" + split.trimmed + "' has no unit; " + AcceptedText());
  const std::optional<CompoundConversion> conversion = LookUpCompoundUnit(split.unit);
  if (!conversion) {
    return Failure("unknown unit '" + split.unit + "' in '" + split.trimmed + "'; " + AcceptedText());
  }
  MotorConstant constant;
  constant.kind = conversion->kind;
  constant.value = *split.value;
  constant.unit = NormalisedUnitSpelling(split.unit);
  constant.as_given = split.trimmed;
  constant.value_si = *split.value * conversion->factor_to_si;
  return {constant, ""};
}

double BackEmfConstantFromSpeedConstant_V_s_per_rad(double speed_constant_rad_per_s_per_V) {
  return 1.0 / speed_constant_rad_per_s_per_V;
}

double BackEmfConstantOf_V_s_per_rad(const MotorConstant& constant) {
  switch (constant.kind) {
    case ConstantKind::kBackEmfConstant:
      return constant.value_si;
    case ConstantKind::kSpeedConstant:
      return BackEmfConstantFromSpeedConstant_V_s_per_rad(constant.value_si);
    case ConstantKind::kTorqueConstant:
      break;
  }
  throw std::invalid_argument("BackEmfConstantOf_V_s_per_rad: a torque constant is not a back-EMF constant");
}

}  // namespace coilspin::units
