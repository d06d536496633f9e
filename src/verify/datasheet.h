#pragma once
// A supplier's datasheet as coilspin verifies it: the rated voltage the
// derived lines refer to, and per line a tolerance band in SI.
//
// A line's band [low, high] comes from how the sheet states it:
//   nominal n and tolerance t         [n − t, n + t]   (t relative when written in %: t·|n|)
//   nominal n, minus m and plus p     [n − m, n + p]   (each relative when in %)
//   min and/or max (nominal optional) [min, max], a missing side open (±∞)
// The file format and its errors: datasheet_file.h.

#include <limits>
#include <optional>
#include <string>
#include <vector>

#include "src/verify/spec_keys.h"

namespace coilspin::verify {

// A tolerance band in SI; a side without a limit is ±∞.
struct Band {
  double low = -std::numeric_limits<double>::infinity();
  double high = std::numeric_limits<double>::infinity();
  bool HasLow() const { return low > -std::numeric_limits<double>::infinity(); }
  bool HasHigh() const { return high < std::numeric_limits<double>::infinity(); }
  bool Contains(double x) const { return x >= low && x <= high; }
};

struct SpecLine {
  const SpecKey* spec = nullptr;  // its row of the key table (never null in a loaded sheet)
  std::string key;                // spec->key
  std::optional<double> nominal;  // SI; a line given only as min/max may have none
  Band band;                      // SI
  std::string unit;               // the unit the sheet wrote the figure in (normalised), for the table
  double unit_factor_to_si = 1.0;
  long line = 0;                  // in the datasheet file
};

struct Datasheet {
  std::string file;
  std::string label;
  double rated_voltage_V = 0.0;
  std::optional<double> reference_temperature_degC;  // R's temperature on the sheet, when stated
  std::vector<SpecLine> lines;                        // in the file's order

  const SpecLine* Find(const std::string& key) const {
    for (const SpecLine& l : lines)
      if (l.key == key) return &l;
    return nullptr;
  }
};

}  // namespace coilspin::verify
