#pragma once
// The header row of a bench log and the plan it gives for reading data rows
// (internal to ingest).
//
// A header cell is `quantity [unit]` or `quantity (unit)`; the quantity word is
// matched without regard to case, the unit exactly (units::LookUpUnit). The
// column map of ReadOptions may name any cell for a quantity, by its full text
// or by the part before the unit bracket, and the unit map may give or replace
// a unit. Cells that name no known quantity are ignored.

#include <string>
#include <vector>

#include "src/ingest/bench_log.h"
#include "src/ingest/read_bench_log.h"

namespace coilspin::ingest {

struct HeaderCell {
  std::string text;  // unquoted and trimmed, as written otherwise
  std::string name;  // the part before the unit bracket, trimmed
  std::string unit;  // inside the bracket, trimmed; empty without a bracket
  bool has_unit = false;
  long column = 0;  // 1-based
};

// Splits the header line (in place) into cells.
std::vector<HeaderCell> SplitHeader(char* line, char delimiter);

// How one header column turns into an SI channel: x_SI = x·scale + offset.
struct ColumnPlan {
  ColumnSource source;
  double scale = 1.0;  // unit factor, ÷ counts per revolution, × gear ratio
  double offset = 0.0;
};

// The columns to read, in header order. Throws InputError (kMissingHeader,
// kMissingColumn, kDuplicateColumn, kUnknownUnit, kCountsWithoutCpr, kBadOption).
std::vector<ColumnPlan> PlanColumns(const std::vector<HeaderCell>& cells, const ReadOptions& options,
                                    const std::string& path, long header_line);

}  // namespace coilspin::ingest
