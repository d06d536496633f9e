#include "src/units/datasheet_units.h"

#include <array>
#include <cmath>

#include "src/units/compound_units.h"
#include "src/units/constants.h"
#include "src/units/unit_text.h"
#include "src/units/units.h"

namespace coilspin::units {
namespace {

struct DimensionInfo {
  Dimension dimension;
  std::string_view name;
  std::string_view si_unit;
  std::optional<Quantity> log_quantity;      // its spellings come from the unit table
  std::optional<ConstantKind> compound_kind;  // its spellings come from the compound table
};

const std::array<DimensionInfo, 17> kDimensions = {{
    {Dimension::kResistance, "resistance", "ohm", std::nullopt, std::nullopt},
    {Dimension::kInductance, "inductance", "H", std::nullopt, std::nullopt},
    {Dimension::kVoltage, "voltage", "V", Quantity::kVoltage, std::nullopt},
    {Dimension::kCurrent, "current", "A", Quantity::kCurrent, std::nullopt},
    {Dimension::kSpeed, "speed", "rad/s", Quantity::kSpeed, std::nullopt},
    {Dimension::kTorque, "torque", "N*m", Quantity::kTorque, std::nullopt},
    {Dimension::kTime, "time", "s", Quantity::kTime, std::nullopt},
    {Dimension::kPower, "power", "W", std::nullopt, std::nullopt},
    {Dimension::kInertia, "moment of inertia", "kg*m^2", std::nullopt, std::nullopt},
    {Dimension::kTorqueConstant, "torque per current", "N*m/A", std::nullopt, ConstantKind::kTorqueConstant},
    {Dimension::kBackEmfConstant, "voltage per speed", "V*s/rad", std::nullopt, ConstantKind::kBackEmfConstant},
    {Dimension::kSpeedConstant, "speed per voltage", "rad/(s*V)", std::nullopt, ConstantKind::kSpeedConstant},
    {Dimension::kMotorConstant, "torque per square root of power", "N*m/sqrt(W)", std::nullopt, std::nullopt},
    {Dimension::kViscousFriction, "torque per speed", "N*m*s/rad", std::nullopt, std::nullopt},
    {Dimension::kSpeedTorqueSlope, "speed per torque", "rad/(s*N*m)", std::nullopt, std::nullopt},
    {Dimension::kRatio, "a ratio (no unit, or %)", "1", std::nullopt, std::nullopt},
    {Dimension::kTemperature, "temperature", "degC", Quantity::kTemperature, std::nullopt},
}};

struct Row {
  Dimension dimension;
  std::string_view spelling;  // normalised (unit_text.h)
  double factor_to_si;
};

// rpm = 2π/60 rad/s (physics); the prefixes: NIST SP 811, 4.3.
constexpr double kRpm_rad_s = kRadiansPerRevolution / kSecondsPerMinute;
// Moments of inertia from mass × length² (NIST SP 811 Appendix B: lb, oz = lb/16, in, ft exact).
constexpr double kOunceInchSquared_kg_m2 = kPound_kg / kOuncesPerPound * kInch_m * kInch_m;
constexpr double kPoundInchSquared_kg_m2 = kPound_kg * kInch_m * kInch_m;
constexpr double kPoundFootSquared_kg_m2 = kPound_kg * kFoot_m * kFoot_m;
// A torque per angular acceleration is a moment of inertia: 1 N·m·s² = 1 kg·m² (physics).
constexpr double kOunceForceInchSecondSquared_kg_m2 = kOunceForceInch_N_m;
constexpr double kKilogramForceCentimetreSecondSquared_kg_m2 = kStandardGravity_m_s2 * kCenti;
constexpr double kGramForceCentimetre_N_m = kStandardGravity_m_s2 * kMilli * kCenti;  // NIST SP 811 App. B: kgf

// The datasheet table: dimensions without a log quantity or compound kind, and
// the datasheet spellings added to a log quantity's. Per dimension, SI first.
const std::array<Row, 53> kRows = {{
    {Dimension::kResistance, "ohm", 1.0},
    {Dimension::kResistance, "Ohm", 1.0},
    {Dimension::kResistance, "\u03a9", 1.0},  // GREEK CAPITAL LETTER OMEGA
    {Dimension::kResistance, "\u2126", 1.0},  // OHM SIGN
    {Dimension::kResistance, "mohm", kMilli},
    {Dimension::kResistance, "mOhm", kMilli},
    {Dimension::kResistance, "m\u03a9", kMilli},
    {Dimension::kResistance, "kohm", kKilo},
    {Dimension::kResistance, "k\u03a9", kKilo},
    {Dimension::kInductance, "H", 1.0},
    {Dimension::kInductance, "mH", kMilli},
    {Dimension::kInductance, "uH", kMicro},
    {Dimension::kPower, "W", 1.0},
    {Dimension::kPower, "mW", kMilli},
    {Dimension::kPower, "kW", kKilo},
    {Dimension::kInertia, "kg*m^2", 1.0},
    {Dimension::kInertia, "kg*cm^2", kCenti * kCenti},
    {Dimension::kInertia, "g*cm^2", kMilli * kCenti * kCenti},
    {Dimension::kInertia, "g*mm^2", kMilli * kMilli * kMilli},
    {Dimension::kInertia, "oz*in^2", kOunceInchSquared_kg_m2},
    {Dimension::kInertia, "lb*in^2", kPoundInchSquared_kg_m2},
    {Dimension::kInertia, "lb*ft^2", kPoundFootSquared_kg_m2},
    {Dimension::kInertia, "oz*in*s^2", kOunceForceInchSecondSquared_kg_m2},
    {Dimension::kInertia, "kgf*cm*s^2", kKilogramForceCentimetreSecondSquared_kg_m2},
    {Dimension::kMotorConstant, "N*m/sqrt(W)", 1.0},
    {Dimension::kMotorConstant, "Nm/sqrt(W)", 1.0},
    {Dimension::kMotorConstant, "mN*m/sqrt(W)", kMilli},
    {Dimension::kMotorConstant, "mNm/sqrt(W)", kMilli},
    {Dimension::kMotorConstant, "oz*in/sqrt(W)", kOunceForceInch_N_m},
    {Dimension::kViscousFriction, "N*m*s/rad", 1.0},
    {Dimension::kViscousFriction, "N*m/(rad/s)", 1.0},
    {Dimension::kViscousFriction, "mN*m*s/rad", kMilli},
    {Dimension::kViscousFriction, "mNm*s/rad", kMilli},
    {Dimension::kViscousFriction, "mN*m/krpm", kMilli / (kKilo * kRpm_rad_s)},
    {Dimension::kViscousFriction, "mNm/krpm", kMilli / (kKilo * kRpm_rad_s)},
    {Dimension::kSpeedTorqueSlope, "rad/(s*N*m)", 1.0},
    {Dimension::kSpeedTorqueSlope, "(rad/s)/(N*m)", 1.0},
    {Dimension::kSpeedTorqueSlope, "rpm/(N*m)", kRpm_rad_s},
    {Dimension::kSpeedTorqueSlope, "rpm/(mN*m)", kRpm_rad_s / kMilli},
    {Dimension::kSpeedTorqueSlope, "rpm/mNm", kRpm_rad_s / kMilli},
    {Dimension::kRatio, "1", 1.0},
    {Dimension::kRatio, "", 1.0},  // a bare number
    {Dimension::kRatio, "%", kPercent},
    // Added to the bench-log quantities' spellings.
    {Dimension::kSpeed, "krpm", kKilo * kRpm_rad_s},
    {Dimension::kSpeed, "1/min", kRpm_rad_s},
    {Dimension::kSpeed, "min^-1", kRpm_rad_s},
    {Dimension::kSpeed, "min\u207b\u00b9", kRpm_rad_s},  // min⁻¹
    {Dimension::kTorque, "gf*cm", kGramForceCentimetre_N_m},
    {Dimension::kTorque, "uN*m", kMicro},
    {Dimension::kTorque, "uNm", kMicro},
    {Dimension::kTime, "min", kSecondsPerMinute},
    {Dimension::kCurrent, "uA", kMicro},
    {Dimension::kVoltage, "kV", kKilo},
}};

// Factors closer than this are the same factor (rounding of their products, ~1e-16).
constexpr double kSameFactorRelative = 1e-12;

const DimensionInfo& InfoOf(Dimension dimension) {
  for (const DimensionInfo& info : kDimensions) {
    if (info.dimension == dimension) return info;
  }
  return kDimensions.front();  // unreachable: every enumerator has a row
}

// Every unit of a dimension, SI first: the compound table's, the unit table's, then this table's.
std::vector<DatasheetUnit> AllUnits(Dimension dimension) {
  const DimensionInfo& info = InfoOf(dimension);
  std::vector<DatasheetUnit> units;
  if (info.compound_kind) {
    for (const std::string& spelling : AcceptedCompoundUnits(*info.compound_kind))
      units.push_back({spelling, LookUpCompoundUnit(spelling)->factor_to_si, 0.0});
  }
  if (info.log_quantity) {
    for (const std::string& spelling : AcceptedUnits(*info.log_quantity)) {
      const Conversion conversion = *LookUpUnit(*info.log_quantity, spelling);
      if (conversion.needs_counts_per_rev) continue;
      units.push_back({NormalisedUnitSpelling(spelling), conversion.factor, conversion.offset});
    }
  }
  for (const Row& row : kRows) {
    if (row.dimension == dimension) units.push_back({std::string(row.spelling), row.factor_to_si, 0.0});
  }
  return units;
}

}  // namespace

std::string_view DimensionName(Dimension dimension) { return InfoOf(dimension).name; }
std::string_view SiUnitOf(Dimension dimension) { return InfoOf(dimension).si_unit; }

std::optional<DatasheetUnit> LookUpDatasheetUnit(Dimension dimension, std::string_view spelling) {
  const std::string wanted = NormalisedUnitSpelling(spelling);
  for (const DatasheetUnit& unit : AllUnits(dimension)) {
    if (unit.spelling == wanted) return unit;
  }
  return std::nullopt;
}

std::vector<std::string> AcceptedDatasheetUnits(Dimension dimension) {
  std::vector<std::string> spellings;
  for (const DatasheetUnit& unit : AllUnits(dimension)) {
    bool seen = false;
    for (const std::string& known : spellings) seen = seen || known == unit.spelling;
    if (!seen && !unit.spelling.empty()) spellings.push_back(unit.spelling);
  }
  return spellings;
}

std::vector<DatasheetUnit> DistinctDatasheetUnits(Dimension dimension) {
  std::vector<DatasheetUnit> distinct;
  for (const DatasheetUnit& unit : AllUnits(dimension)) {
    if (unit.offset_to_si != 0.0) continue;  // an offset scale is no slip of a factor
    bool seen = false;
    for (const DatasheetUnit& known : distinct)
      seen = seen || std::fabs(known.factor_to_si - unit.factor_to_si) <= kSameFactorRelative * unit.factor_to_si;
    if (!seen) distinct.push_back(unit);
  }
  return distinct;
}

std::vector<Dimension> DimensionsOfUnit(std::string_view spelling) {
  std::vector<Dimension> dimensions;
  for (const DimensionInfo& info : kDimensions) {
    if (LookUpDatasheetUnit(info.dimension, spelling)) dimensions.push_back(info.dimension);
  }
  return dimensions;
}

}  // namespace coilspin::units
