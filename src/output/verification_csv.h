#pragma once
// Datasheet verification as CSV for a spreadsheet: one row per motor and line
// (RFC 4180: comma-separated, fields with a comma, quote or line break quoted),
// SI values in the unit named on the row, after '#' comment lines that name
// the datasheet and the confidence. Empty cells where a line has no value or
// a band no side. The lot's statistics are in the JSON and on stdout.

#include <string>

#include "src/verify/verification.h"

namespace coilspin::output {

std::string VerificationCsv(const verify::Verification& verification);

}  // namespace coilspin::output
