#pragma once
// Units of the figures a motor datasheet prints, by the dimension of the
// figure, converted to SI: x_SI = x·factor + offset.
//
// One lookup serves every datasheet line, but no factor is written twice:
//   - voltage, current, speed, torque, time and temperature are the bench-log
//     quantities: their spellings are the unit table's (units.h);
//   - torque, back-EMF and speed constants are the compound table's (compound_units.h);
//   - resistance, inductance, inertia, power, the motor constant, friction, the
//     slope of the speed–torque line and dimensionless ratios are in this
//     file's table (datasheet_units.cc), with their sources;
// and a dimension may add datasheet spellings to a log quantity's (krpm for
// speed, gf·cm for torque). Spellings are exact after NormalisedUnitSpelling
// (unit_text.h): "g·cm²" is "g*cm^2", "mNm/√W" is "mNm/sqrt(W)".

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace coilspin::units {

enum class Dimension {
  kResistance,
  kInductance,
  kVoltage,
  kCurrent,
  kSpeed,
  kTorque,
  kTime,
  kPower,
  kInertia,
  kTorqueConstant,
  kBackEmfConstant,
  kSpeedConstant,
  kMotorConstant,
  kViscousFriction,
  kSpeedTorqueSlope,
  kRatio,  // dimensionless: efficiency
  kTemperature,
};

// What the dimension measures, in words ("resistance", "torque per current").
std::string_view DimensionName(Dimension dimension);
// The SI unit as the result file writes it ("ohm", "N*m/A", "rad/(s*V)", "1", "degC").
std::string_view SiUnitOf(Dimension dimension);

struct DatasheetUnit {
  std::string spelling;      // as the tables hold it (normalised)
  double factor_to_si = 1.0;
  double offset_to_si = 0.0;  // temperature in K only
};

// The unit of a spelling for a dimension; nothing when the spelling is not one of it.
std::optional<DatasheetUnit> LookUpDatasheetUnit(Dimension dimension, std::string_view spelling);

// The accepted spellings of a dimension (for messages), SI first.
std::vector<std::string> AcceptedDatasheetUnits(Dimension dimension);

// One unit per distinct factor of a dimension (the first spelling of each), for
// finding which unit a figure was really meant in (a unit slip).
std::vector<DatasheetUnit> DistinctDatasheetUnits(Dimension dimension);

// The dimensions a spelling is a unit of (empty when none), for a message that
// says what a misplaced unit measures.
std::vector<Dimension> DimensionsOfUnit(std::string_view spelling);

}  // namespace coilspin::units
