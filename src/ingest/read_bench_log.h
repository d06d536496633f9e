#pragma once
// Reads a bench-log CSV (docs/file-formats.md) into SI channels.
//
// Streaming: the file is read line by line (fast-cpp-csv-parser's LineReader),
// cells are split in place and parsed with std::from_chars, so the cost is one
// pass and no allocation per cell; memory is the channels themselves.
// Throws InputError for every problem it can describe.

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "src/ingest/bench_log.h"
#include "src/ingest/test_kind.h"

namespace coilspin {

struct ReadOptions {
  // --column speed="Tach (RPM)": the header cell to use for a quantity.
  std::map<units::Quantity, std::string> column_for;
  // --unit current=mA: the unit of a quantity whose header cell names none (or to replace it).
  std::map<units::Quantity, std::string> unit_for;
  // Encoder counts per revolution, needed for position [counts].
  std::optional<double> counts_per_rev;
  // Motor turns per output turn: speed and position read at a gearbox output are
  // multiplied by it so that they refer to the motor shaft.
  double gear_ratio = 1.0;
};

BenchLog ReadBenchLog(const std::string& path, const ReadOptions& options);

// Checks a log against what a test kind needs (required columns, enough
// samples, signals that must vary). Throws InputError naming what is missing.
void RequireForTest(const BenchLog& log, TestKind kind);

}  // namespace coilspin
