#pragma once
// `coilspin fit SESSION.toml [SESSION.toml ...] --out-dir DIR`: a lot of
// motors, one session file each, fitted on all cores.
//
// Each fit is independent (its own logs, its own least-squares problem), so
// the sessions are shared out to a pool of std::thread workers, one per core
// (std::thread::hardware_concurrency), each taking the next session not yet
// started. Each result goes to DIR/<session file's stem>.json, atomically;
// progress goes to stderr as each motor finishes; a motor whose logs are bad
// or whose fit fails is reported there and the others go on. With
// --datasheet, every result gains its verification and the lot's
// verification is printed at the end (the same as `coilspin verify` on the
// results written).
//
// Exit status: 2 when the command itself is wrong (no sessions, two sessions
// with the same stem, --json with --out-dir, a bad datasheet, DIR not
// creatable) and nothing is fitted; 2 also when every motor failed on bad
// input (nothing written); 1 when some motor failed or has a status reason of
// its own (fit_command.h: StatusReasons); 0 otherwise.
//
// Beyond one machine the same command runs per motor as an array job of an
// existing scheduler, with `coilspin verify` as the reduce step
// (docs/procedures.md, "Incoming inspection of a lot").

#include <iosfwd>

#include "src/cli/fit_command.h"

namespace coilspin::cli {

int RunBatchFit(const FitArguments& arguments, std::ostream& out);

}  // namespace coilspin::cli
