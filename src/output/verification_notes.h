#pragma once
// The words of a datasheet verification: one note per motor line and per
// relation of the sheet, shared by the table, the JSON and the CSV. The
// verdicts and figures are computed in src/verify; this only says them.

#include <string>

#include "src/verify/motor_check.h"
#include "src/verify/sheet_consistency.h"

namespace coilspin::output {

// A figure in the unit the sheet wrote the line in ("4750 rpm", "0.82 mH").
std::string InSheetUnit(double value_si, const verify::SpecLine& line, int significant = 5);
// The band in the sheet's unit: "[4275, 4988] rpm", ">= 70 mN*m", "<= 0.5 A".
std::string BandInSheetUnit(const verify::SpecLine& line);

// Why the verdict, and for an inconclusive line what would decide it.
std::string LineNote(const verify::LineCheck& check, double confidence);

// What the relation found and, when inconsistent, which single line explains it.
std::string RelationNote(const verify::RelationCheck& check, const verify::Datasheet& sheet);

// One explanation: "no_load_speed fits a rated voltage of 12 V, not the sheet's 6 V".
std::string ExplanationText(const verify::Explanation& explanation, const verify::Datasheet& sheet);

}  // namespace coilspin::output
