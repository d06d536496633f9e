#pragma once
// Progress of a long computation, for whoever runs it to show.
//
// The core and the fitters never print, and never time anything for display:
// at each step of a long stage they call a Progress with the stage and how much
// of it is done, and the caller decides what, if anything, the user sees (the
// command line's printer, src/cli/progress_printer.h, writes to stderr after
// the first second and nothing with --quiet). An empty Progress is silent.

#include <functional>

namespace coilspin::core {

enum class ProgressStage {
  kPlanning,             // segmenting the logs and finding starting values, per test log
  kSolving,              // the least-squares solves: the first, then one per noise re-estimation round
  kCovariance,           // the covariance step and its counted noise terms
  kProfileIntervals,     // one profile interval per parameter
  kBootstrapReplicates,  // bootstrap refits
};

// `done` of `total` units of `stage` are finished (0 <= done <= total, total > 0).
// Called on the thread that started the computation.
using Progress = std::function<void(ProgressStage stage, int done, int total)>;

// Calls `progress` when it is set.
inline void ReportProgress(const Progress& progress, ProgressStage stage, int done, int total) {
  if (progress) progress(stage, done, total);
}

}  // namespace coilspin::core
