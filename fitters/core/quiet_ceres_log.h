#pragma once
// Keeps Ceres from writing to stderr while the core runs it.
//
// Ceres logs through glog. With Solver::Options::logging_type = SILENT its
// progress output stops, but some failure paths still log at WARNING or ERROR
// level (Ceres 2.1: "Terminating: Number of consecutive invalid steps …").
// The core reports every such outcome in FitResult (termination, message),
// and library code must not print (docs: style.md, anti-patterns), so while a
// guard is alive glog drops everything below FATAL. FATAL (a Ceres CHECK
// failure, i.e. a bug) still prints and aborts.
//
// The guards nest and may be held by several threads at once: the first one
// in saves glog's level, the last one out restores it.

namespace coilspin::core {

class QuietCeresLog {
 public:
  QuietCeresLog();
  ~QuietCeresLog();
  QuietCeresLog(const QuietCeresLog&) = delete;
  QuietCeresLog& operator=(const QuietCeresLog&) = delete;
};

}  // namespace coilspin::core
