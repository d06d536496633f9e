#pragma once
// Motor constants as datasheets write them, a number and a compound unit
// ("2.2 oz*in/A", "1.6 V/krpm", "850 rpm/V"), converted to SI.
//
//   torque constant    Kt  torque per current  → N·m/A
//   back-EMF constant  Ke  voltage per speed   → V·s/rad
//   speed constant     Kv  speed per voltage   → (rad/s)/V
//
// In SI the torque and back-EMF constants share one unit, 1 N·m/A = 1 V·s/rad
// (power balance of an ideal machine, E·I = T·ω), and the speed constant is the
// reciprocal of the back-EMF constant: Ke = 1/Kv, which for Kv in rpm/V reads
// Ke = 60/(2π·Kv) V·s/rad.
//
// Every compound unit is a numerator and a denominator spelling of the one
// unit table (units.cc), so no factor is written twice. Spellings are exact
// (case included) after NormalisedUnitSpelling (unit_text.h): '·' (U+00B7),
// and '-' or '.' between letters, may stand for '*' ("N-m/A", "mN.m/A");
// whitespace between the number and the unit, and inside the unit, is
// ignored. Nothing is guessed.

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace coilspin::units {

enum class ConstantKind { kTorqueConstant, kBackEmfConstant, kSpeedConstant };

// "torque constant", "back-EMF constant", "speed constant".
std::string_view ConstantKindName(ConstantKind kind);
// What the unit measures: "torque per current", "voltage per speed", "speed per voltage".
std::string_view ConstantKindMeaning(ConstantKind kind);
// "N*m/A", "V*s/rad", "(rad/s)/V".
std::string_view SiUnitOf(ConstantKind kind);

struct CompoundConversion {
  ConstantKind kind;
  double factor_to_si = 1.0;  // x_SI = x·factor_to_si
};

// The kind and factor of a unit spelling ("oz*in/A"), after NormalisedUnitSpelling;
// nothing when the spelling is not in the table.
std::optional<CompoundConversion> LookUpCompoundUnit(std::string_view spelling);

// The accepted spellings of one kind, in table order (canonical spelling first).
std::vector<std::string> AcceptedCompoundUnits(ConstantKind kind);

// One spelling per distinct factor of a kind (the first in table order), for
// searching which unit a mistaken figure was really written in.
struct CompoundUnitFactor {
  std::string spelling;
  double factor_to_si = 1.0;
};
std::vector<CompoundUnitFactor> DistinctCompoundUnits(ConstantKind kind);

struct MotorConstant {
  ConstantKind kind = ConstantKind::kTorqueConstant;
  double value = 0.0;      // the number as written
  std::string unit;        // the unit as looked up (NormalisedUnitSpelling: "N-m/A" → "N*m/A")
  std::string as_given;    // the whole text, trimmed
  double value_si = 0.0;   // in SiUnitOf(kind)
};

struct MotorConstantParse {
  std::optional<MotorConstant> constant;
  std::string error;  // when there is no constant: what is wrong and what is accepted
};

// Parses "<number> <unit>". The number must be finite; its sign is not judged here.
MotorConstantParse ParseMotorConstant(std::string_view text);

// Ke [V·s/rad] from Kv [(rad/s)/V]: Ke = 1/Kv (physics, see above).
double BackEmfConstantFromSpeedConstant_V_s_per_rad(double speed_constant_rad_per_s_per_V);

// The back-EMF constant [V·s/rad] a constant of kind back-EMF or speed stands for.
double BackEmfConstantOf_V_s_per_rad(const MotorConstant& constant);

}  // namespace coilspin::units
