#pragma once
// Numbers for people: a value is printed to the digits its standard error
// supports (two significant digits of the error), in fixed notation for
// magnitudes a reader takes in at a glance and scientific notation otherwise.

#include <string>

namespace coilspin::output {

// Digits follow `std_error` (when > 0); otherwise `fallback_significant` digits.
std::string FormatValue(double value, double std_error, int fallback_significant = 6);

// For comments and notes: %g with `significant` digits, e.g. 95, 12, 25.5, 3.2e-05.
std::string ShortNumber(double value, int significant = 6);

// For machines: the shortest text that reads back as the same double (std::to_chars,
// C locale), e.g. "0.95", "3.2e-05", "12". Not finite: "nan", "inf", "-inf".
std::string ExactNumber(double value);

}  // namespace coilspin::output
