#pragma once
// Datasheet verification, whole: the sheet checked against itself
// (sheet_consistency.h), each motor's result against the sheet
// (motor_check.h), and the lot's statistics (lot.h). What `coilspin verify`
// and `coilspin fit --datasheet` compute; src/output renders it.

#include <string>
#include <utility>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/verify/datasheet.h"
#include "src/verify/lot.h"
#include "src/verify/motor_check.h"
#include "src/verify/sheet_consistency.h"

namespace coilspin::verify {

struct Verification {
  Datasheet sheet;
  std::vector<RelationCheck> consistency;
  std::vector<MotorCheck> motors;  // in the order given
  Lot lot;                         // over `motors` (one motor: its counts, no spread)
};

// A result as verify reads it: the name it was given by, and the estimate.
struct NamedResult {
  std::string name;
  MotorEstimate estimate;
};

Verification Verify(const Datasheet& sheet, const std::vector<NamedResult>& results);

}  // namespace coilspin::verify
