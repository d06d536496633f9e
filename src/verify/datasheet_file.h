#pragma once
// The datasheet file (TOML), docs/file-formats.md "Datasheet":
//
//   [datasheet]
//   label = "supplier X, type 12-40"
//   rated_voltage = "12 V"
//   reference_temperature = "25 degC"      # optional: the temperature R is stated at
//   [spec]
//   resistance      = { nominal = "2.3 ohm", tolerance = "8 %" }
//   torque_constant = { nominal = "28.5 mN*m/A", tolerance = "5 %" }
//   no_load_speed   = { nominal = "4000 rpm", minus = "10 %", plus = "5 %" }
//   stall_torque    = { min = "0.12 N*m" }
//   inertia         = { nominal = "12 g*cm^2", tolerance = "0.2 g*cm^2" }
//
// Keys of [spec] are the result file's keys (spec_keys.h); every figure is a
// string "<number> <unit>" in a unit of the line's dimension
// (src/units/datasheet_units.h), a tolerance in the same dimension or in %.
// A dimensionless line (peak_efficiency) may be a bare number or in %.
//
// Anything else is an InputError (kind kBadDatasheet; exit status 2) naming
// the file, the line and column, and the key: a key the table does not know,
// a unit of another dimension, a tolerance without a nominal, a line with
// neither a nominal nor a limit, a negative tolerance, an empty band
// (min above max), a missing or non-positive rated voltage.

#include <string>

#include "src/verify/datasheet.h"

namespace coilspin::verify {

// Throws InputError (kCannotOpen, kBadDatasheet).
Datasheet LoadDatasheet(const std::string& path);

// The same from text; `file` names it in errors.
Datasheet ParseDatasheet(const std::string& text, const std::string& file);

}  // namespace coilspin::verify
