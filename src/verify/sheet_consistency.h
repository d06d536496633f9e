#pragma once
// A datasheet checked against itself before any measurement (sheet_relations.h
// for the relations).
//
// A relation y = f(x₁ … xₙ) is "consistent" when some choice of the lines
// within their stated tolerances satisfies it: the range of f over the box of
// the input lines' bands (evaluated at its 2ⁿ corners, exact because every
// relation is monotonic in each line over positive values) overlaps the band
// of the stated line y. Otherwise it is "inconsistent", and its mismatch is
// y/f − 1 at the nominal values (a one-sided line's limit stands for its
// nominal). An input line with an open band cannot bound f, and a relation
// with one is not checked.
//
// Which one line explains a mismatch: each line of an inconsistent relation is
// corrected in turn by one known cause —
//   a unit slip        the figure meant in another unit of its dimension (f_w/f_m),
//   a decimal slip     a misplaced decimal point or SI prefix (10^k, k = ±1 … ±6),
//   a winding convention (Kt, Ke, Kv only) one of the brushless factors √2, √3, 3/2 …
//                      of src/check/winding_conventions.h,
//   another voltage    a line that depends on V printed for a common rated
//                      voltage other than the sheet's (units::kCommonRatedVoltages_V)
// — and the correction can explain the mismatch when, with it, every relation
// that line takes part in is consistent. Of these, the ones that mend the most
// of the sheet's inconsistent relations are listed (one line explaining two
// mismatches accounts for the sheet better than another explaining one),
// nearest (smallest |ln(y/f)| after correction) first. A correction that makes
// the whole sheet consistent explains it by one line alone ("whole_sheet");
// when none does, the sheet has more than one fault, and the corrections
// listed are only what could account for this relation.

#include <string>
#include <vector>

#include "src/check/mismatch_factor.h"
#include "src/verify/datasheet.h"

namespace coilspin::verify {

struct Explanation {
  enum class Cause { kUnitSlip, kDecimalSlip, kWindingConvention, kAnotherVoltage };
  std::string line;                // the key of the line that alone explains the mismatch
  Cause cause = Cause::kUnitSlip;
  double printed_over_meant = 1.0;  // slips and conventions: the line as printed over what it should be
  std::string written_unit;        // unit slip: the unit on the sheet ...
  std::string meant_unit;          // ... and the one the figure fits
  int decimal_exponent = 0;        // decimal slip: 10^k
  check::MismatchFactor convention;  // winding convention: its factor (Kt/Ke) and the conventions that give it
  double voltage_V = 0.0;          // another voltage: the voltage the line fits
  bool whole_sheet = false;        // with it, every relation of the sheet is consistent
};

// "unit-slip", "decimal-slip", "winding-convention", "another-voltage".
std::string CauseName(Explanation::Cause cause);

struct RelationCheck {
  std::string relation;              // "stall_torque = Kt*(V - Vb)/R"
  std::vector<std::string> lines;    // the stated line first, then the lines it is predicted from
  double stated = 0.0;               // the stated line's nominal (or limit), SI
  double predicted = 0.0;            // f at the nominals
  double predicted_low = 0.0;        // f over the tolerance box
  double predicted_high = 0.0;
  double mismatch = 0.0;             // stated/predicted − 1
  bool consistent = true;
  std::vector<Explanation> explained_by;  // inconsistent only; nearest first
};

std::vector<RelationCheck> CheckSheet(const Datasheet& sheet);

}  // namespace coilspin::verify
