#pragma once
// Writes a simulated bench log as a bench-log CSV (the input contract of
// ingest: optional "# ..." comment lines, one header row of
// "quantity [unit]" cells, then one row per sample).
//
// Only the channels the log has (non-empty) are written, in the order time,
// voltage, current, speed, position, torque, temperature. Values are converted
// from SI to the chosen units with the factors of the one unit table
// (units::LookUpUnit: x_SI = x·factor + offset, so x = (x_SI − offset)/factor)
// and printed with `significant_digits` significant digits in the C locale
// (std::to_chars, "%g" style); 10 digits keep a relative error below 5e-11,
// 17 reproduce every double exactly.
//
// Position in counts: the table's factor is 2π rad per revolution, divided by
// the encoder's counts per revolution (counts_per_rev, required then), so
// n = θ·cpr/2π. An encoder count is a whole number: it is written as the
// nearest integer, in full (no exponent, whatever significant_digits says).
//
// The file is written atomically (src/output/atomic_file.h: a temporary file
// in the same folder, flushed, then renamed over `path`), so a failure leaves
// any existing file untouched.

#include <map>
#include <string>
#include <vector>

#include "src/model/sampled_log.h"
#include "src/units/units.h"

namespace coilspin::output {

struct CsvStyle {
  // Unit spellings as the unit table accepts them for the quantity, e.g.
  // s | ms | us, V | mV, A | mA, rad/s | rpm, N*m | mN*m, degC | K.
  std::string time_unit = "s";
  std::string voltage_unit = "V";
  std::string current_unit = "A";
  std::string speed_unit = "rad/s";       // rad/s | rpm | rev/s
  std::string position_unit = "rad";     // rad | deg | rev | counts
  int counts_per_rev = 0;                // encoder counts per revolution, needed for counts
  std::string torque_unit = "N*m";
  std::string temperature_unit = "degC";
  char delimiter = ',';                 // ',', ';' or '\t'
  bool decimal_comma = false;           // "1,25"; only with ';'
  int significant_digits = 10;          // 1 … 17
  // A header cell to write instead of "quantity [unit]" (values still in the unit above).
  std::map<units::Quantity, std::string> header_for;
  // Lines written before the header, each as "# " + line.
  std::vector<std::string> comment_lines;

  // False, with the reason in *error, for an unknown unit, position in counts
  // without counts_per_rev > 0, a delimiter other than ',' ';' '\t', a decimal
  // comma without ';', digits outside 1 … 17, or a header cell or comment that
  // holds a line break (or, for a header, the delimiter).
  bool IsValid(std::string* error) const;
};

// Throws std::invalid_argument for an invalid style or a log whose channels are
// not all as long as time_s (or that has no samples, or a value that is not
// finite); std::runtime_error, naming the file, when it cannot be written.
void WriteBenchLogCsv(const model::SampledLog& log, const std::string& path,
                      const CsvStyle& style);

}  // namespace coilspin::output
