#pragma once
// Progress of a long run on stderr, never on stdout (which may carry the
// result: --json -). The fitters report stages and fractions through
// core::Progress (fitters/core/progress.h); this turns them into text.
//
// Nothing is written during the first kProgressDelaySeconds of the run: a line
// that flashes for a fraction of a second is noise (common practice). After
// that: "coilspin: bootstrap replicates 120/200 (60 %)". On a terminal the line
// is rewritten in place ('\r') and cleared at the end; elsewhere (a log file) a
// line is written when the stage changes, when a stage ends, and at most once
// per kProgressIntervalSeconds in between, so the file stays short.
// --quiet makes no printer at all.

#include <functional>
#include <ostream>
#include <string>

#include "fitters/core/progress.h"

namespace coilspin::cli {

inline constexpr double kProgressDelaySeconds = 1.0;
inline constexpr double kProgressIntervalSeconds = 1.0;

class ProgressPrinter {
 public:
  using Clock = std::function<double()>;  // seconds, from any fixed start

  // `terminal`: rewrite one line in place. The clock defaults to a steady clock.
  ProgressPrinter(std::ostream& out, bool terminal, Clock clock = {});
  ~ProgressPrinter();  // Finish()
  ProgressPrinter(const ProgressPrinter&) = delete;
  ProgressPrinter& operator=(const ProgressPrinter&) = delete;

  // For stderr: a terminal when stderr is one.
  static bool StderrIsTerminal();

  void Report(const std::string& stage, int done, int total);
  // A callback for the fitters; valid while the printer lives.
  core::Progress Callback();
  // Clears the terminal line; nothing elsewhere (every line ended already).
  void Finish();

 private:
  std::ostream& out_;
  bool terminal_;
  Clock clock_;
  double start_s_;
  double last_write_s_ = -1.0;
  std::string last_stage_;
  std::size_t shown_width_ = 0;  // of the line in place on a terminal
};

// What a person reads for a stage: "solving (least squares)", "bootstrap replicates".
std::string ProgressStageText(core::ProgressStage stage);

}  // namespace coilspin::cli
