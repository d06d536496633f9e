#pragma once
// Refusing a fit the machine cannot hold, before a log is read.
//
// A fit keeps every log's channels and, for the tests fitted sample by sample
// (step captures, steps, coasts), residuals, Jacobian rows and their copies
// for each sample: its peak memory grows in proportion to the logs' size. A
// log too large for the memory would otherwise run for minutes and end in a
// swap storm or an out-of-memory kill, so the logs' total size times the
// measured peak per byte is compared with the memory available (the least of
// the system's available memory, the cgroup's limit and the address-space
// limit, `ulimit -v`) before anything is read.

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "src/ingest/test_kind.h"

namespace coilspin::cli {

// Peak resident memory of `coilspin fit` per byte of CSV log, measured on
// simulated logs of 4-36 MB (maximum resident set size over the file size,
// GNU time; docs/fuzzing.md, "Bounded work"), each rounded up so that a fit the
// check lets through does not then run out:
inline constexpr double kStepFitBytesPerLogByte = 42.0;        // encoder position 41, speed column 29
inline constexpr double kLockedRotorFitBytesPerLogByte = 12.0;  // a step capture 11; plateaus less
inline constexpr double kSpinDownFitBytesPerLogByte = 13.0;     // encoder position and voltage 12
inline constexpr double kNoLoadFitBytesPerLogByte = 3.0;        // plateaus 2.5

double FitBytesPerLogByte(TestKind kind);

struct PlannedLog {
  std::string path;
  TestKind kind;
};

// The bytes this process can still allocate, or nothing when it cannot be told.
std::optional<std::uint64_t> AvailableMemoryBytes();

// Throws InputError (kTooLarge, naming the largest log, with both figures) when
// the logs need more memory than `available_bytes`; nothing when that is unknown.
void RequireMemoryForLogs(const std::vector<PlannedLog>& logs, std::optional<std::uint64_t> available_bytes);

}  // namespace coilspin::cli
