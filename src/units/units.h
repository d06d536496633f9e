#pragma once
// Units of the bench-log quantities and their conversion to SI.
//
// Every conversion factor of the project lives in units.cc, in one table, with
// its source. A logged value x in unit u becomes x_SI = x·factor + offset.
// Internal quantities are SI: s, V, A, rad/s, rad, N·m; temperature stays in
// degC because the copper correction (docs/methods.md §7) is written in degC.

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace coilspin::units {

enum class Quantity { kTime, kVoltage, kCurrent, kSpeed, kPosition, kTorque, kTemperature };

// "time", "voltage", ... as written in a header cell and in --column.
std::string_view QuantityName(Quantity quantity);
std::optional<Quantity> QuantityFromName(std::string_view name);
const std::vector<Quantity>& AllQuantities();

// The SI unit the tool works in for the quantity ("s", "V", "A", "rad/s", ...).
std::string_view InternalUnit(Quantity quantity);

struct Conversion {
  double factor = 1.0;  // x_SI = x·factor + offset
  double offset = 0.0;
  bool needs_counts_per_rev = false;  // position [counts]: factor is 2π per rev, divide by CPR
};

// Looks up a unit spelling for a quantity ("ms" for time, "rpm" for speed).
// Accepted spellings are exact (case as in docs/file-formats.md) plus a few
// listed synonyms; nothing is guessed.
std::optional<Conversion> LookUpUnit(Quantity quantity, std::string_view spelling);

// The spellings accepted for a quantity, for error messages.
std::vector<std::string> AcceptedUnits(Quantity quantity);

}  // namespace coilspin::units
