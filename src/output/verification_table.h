#pragma once
// The datasheet verification on stdout: the sheet checked against itself,
// then one motor's lines (value, interval, band, verdict and why), or for a
// lot the verdict of every line of every motor, each line's statistics and
// outliers, and the counts. Renders a verify::Verification; computes nothing.

#include <string>

#include "src/verify/verification.h"

namespace coilspin::output {

std::string VerificationText(const verify::Verification& verification);

}  // namespace coilspin::output
