#pragma once
// Numbers for people: a value is printed to the digits its standard error
// supports (two significant digits of the error), in fixed notation for
// magnitudes a reader takes in at a glance and scientific notation otherwise.

#include <string>

namespace coilspin::output {

// Digits follow `std_error` (when > 0); otherwise `fallback_significant` digits.
std::string FormatValue(double value, double std_error, int fallback_significant = 6);

}  // namespace coilspin::output
