#include "src/units/compound_units.h"

#include <array>
#include <charconv>
#include <cmath>
#include <stdexcept>

#include "src/units/constants.h"
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
  std::string_view spelling;  // matched exactly, after '·' → '*' and whitespace removal
  UnitTerm numerator;
  UnitTerm denominator;
};

// The one table of compound units. Factors come from the unit table: ozf·in and
// kgf·cm from NIST SP 811 Appendix B, rpm = 2π/60 rad/s (physics), prefixes from
// NIST SP 811 4.3. Per kind, the canonical (SI) spelling comes first.
constexpr std::array<CompoundSpelling, 17> kCompoundTable = {{
    // torque constant → N·m/A
    {ConstantKind::kTorqueConstant, "N*m/A", {1.0, Quantity::kTorque, "N*m"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "Nm/A", {1.0, Quantity::kTorque, "Nm"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "mN*m/A", {1.0, Quantity::kTorque, "mN*m"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "mNm/A", {1.0, Quantity::kTorque, "mNm"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "oz*in/A", {1.0, Quantity::kTorque, "oz*in"}, {1.0, Quantity::kCurrent, "A"}},
    {ConstantKind::kTorqueConstant, "kgf*cm/A", {1.0, Quantity::kTorque, "kgf*cm"}, {1.0, Quantity::kCurrent, "A"}},
    // back-EMF constant → V·s/rad (= V/(rad/s))
    {ConstantKind::kBackEmfConstant, "V*s/rad", {1.0, Quantity::kVoltage, "V"}, {1.0, Quantity::kSpeed, "rad/s"}},
    {ConstantKind::kBackEmfConstant, "V/(rad/s)", {1.0, Quantity::kVoltage, "V"}, {1.0, Quantity::kSpeed, "rad/s"}},
    {ConstantKind::kBackEmfConstant, "V/rpm", {1.0, Quantity::kVoltage, "V"}, {1.0, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "V/krpm", {1.0, Quantity::kVoltage, "V"}, {kKilo, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "mV/rpm", {1.0, Quantity::kVoltage, "mV"}, {1.0, Quantity::kSpeed, "rpm"}},
    {ConstantKind::kBackEmfConstant, "V/kRPM", {1.0, Quantity::kVoltage, "V"}, {kKilo, Quantity::kSpeed, "RPM"}},
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

constexpr std::string_view kMiddleDot = "\u00b7";

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

bool IsSpace(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v'; }

std::string_view Trimmed(std::string_view text) {
  while (!text.empty() && IsSpace(text.front())) text.remove_prefix(1);
  while (!text.empty() && IsSpace(text.back())) text.remove_suffix(1);
  return text;
}

// '·' → '*', whitespace dropped.
std::string Normalised(std::string_view spelling) {
  std::string out;
  for (std::size_t i = 0; i < spelling.size();) {
    if (spelling.substr(i, kMiddleDot.size()) == kMiddleDot) {
      out += '*';
      i += kMiddleDot.size();
    } else {
      if (!IsSpace(spelling[i])) out += spelling[i];
      ++i;
    }
  }
  return out;
}

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
  return "accepted units are " + text + " ('\u00b7' may be written for '*')";
}

MotorConstantParse Failure(std::string message) { return {std::nullopt, std::move(message)}; }

}  // namespace

std::string_view ConstantKindName(ConstantKind kind) { return InfoOf(kind).name; }
std::string_view ConstantKindMeaning(ConstantKind kind) { return InfoOf(kind).meaning; }
std::string_view SiUnitOf(ConstantKind kind) { return InfoOf(kind).si_unit; }

std::optional<CompoundConversion> LookUpCompoundUnit(std::string_view spelling) {
  const std::string wanted = Normalised(spelling);
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
  const std::string_view trimmed = Trimmed(text);
  if (trimmed.empty()) return Failure("expected a number and a unit, such as '2.2 oz*in/A', got nothing");
  double value = 0.0;
  const char* first = trimmed.data();
  const char* last = trimmed.data() + trimmed.size();
  const auto [end, error] = std::from_chars(first, last, value);
  if (error != std::errc() || end == first) {
    return Failure("'" + std::string(trimmed) + "' does not start with a number; expected a number and a unit, " +
                   "such as '2.2 oz*in/A'");
  }
  if (!std::isfinite(value)) return Failure("'" + std::string(trimmed) + "': the number must be finite");
  const std::string_view unit_text = Trimmed(std::string_view(end, static_cast<std::size_t>(last - end)));
  if (unit_text.empty()) return Failure("'" + std::string(trimmed) + "' has no unit; " + AcceptedText());
  if (unit_text.front() == ',') {
    return Failure("'" + std::string(trimmed) + "': write the decimal separator as '.', not ','");
  }
  const std::optional<CompoundConversion> conversion = LookUpCompoundUnit(unit_text);
  if (!conversion) {
    return Failure("unknown unit '" + std::string(unit_text) + "' in '" + std::string(trimmed) + "'; " +
                   AcceptedText());
  }
  MotorConstant constant;
  constant.kind = conversion->kind;
  constant.value = value;
  constant.unit = Normalised(unit_text);
  constant.as_given = std::string(trimmed);
  constant.value_si = value * conversion->factor_to_si;
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
