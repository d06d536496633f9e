#pragma once
// Parsing of one numeric data cell (internal to ingest).
//
// std::from_chars, so the result does not depend on the locale. The cell is
// already trimmed of spaces; a leading '+' is accepted. With a decimal comma
// the ',' is rewritten to '.' in place before parsing.

#include "src/ingest/csv_cells.h"

namespace coilspin::ingest {

enum class NumberStatus {
  kOk,
  kEmpty,       // nothing in the cell
  kNotANumber,  // text that is not a number (or has trailing characters)
  kNotFinite,   // nan, inf, or beyond the range of a double
};

struct ParsedNumber {
  NumberStatus status = NumberStatus::kOk;
  double value = 0.0;
};

ParsedNumber ParseNumber(Cell cell, bool decimal_comma);

}  // namespace coilspin::ingest
