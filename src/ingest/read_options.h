#pragma once
// Checks on ReadOptions, run by ReadBenchLog before a file is opened (and
// callable earlier, e.g. by the CLI once the options are assembled).

#include "src/ingest/read_bench_log.h"

namespace coilspin {

// Throws InputError kBadOption unless counts_per_rev (when given) and
// gear_ratio are finite and > 0 and no header name in column_for is empty, and
// kUnknownUnit when a unit in unit_for is not accepted for its quantity.
void ValidateReadOptions(const ReadOptions& options);

}  // namespace coilspin
