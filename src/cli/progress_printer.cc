#include "src/cli/progress_printer.h"

#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>

namespace coilspin::cli {
namespace {

double SteadySeconds() {
  return std::chrono::duration<double>(std::chrono::steady_clock::now().time_since_epoch()).count();
}

}  // namespace

std::string ProgressStageText(core::ProgressStage stage) {
  switch (stage) {
    case core::ProgressStage::kPlanning: return "segmenting the logs";
    case core::ProgressStage::kSolving: return "solving (least squares)";
    case core::ProgressStage::kCovariance: return "covariance";
    case core::ProgressStage::kProfileIntervals: return "profile intervals";
    case core::ProgressStage::kBootstrapReplicates: return "bootstrap replicates";
  }
  return "working";
}

ProgressPrinter::ProgressPrinter(std::ostream& out, bool terminal, Clock clock)
    : out_(out), terminal_(terminal), clock_(clock ? std::move(clock) : Clock(SteadySeconds)), start_s_(clock_()) {}

ProgressPrinter::~ProgressPrinter() { Finish(); }

bool ProgressPrinter::StderrIsTerminal() { return ::isatty(STDERR_FILENO) == 1; }

void ProgressPrinter::Report(const std::string& stage, int done, int total) {
  const double now_s = clock_();
  if (now_s - start_s_ < kProgressDelaySeconds || total <= 0) return;
  const bool new_stage = stage != last_stage_;
  const bool stage_end = done >= total;
  if (!terminal_ && !new_stage && !stage_end && now_s - last_write_s_ < kProgressIntervalSeconds) return;
  char percent[16];
  std::snprintf(percent, sizeof percent, "%.0f", 100.0 * static_cast<double>(done) / static_cast<double>(total));
  const std::string line = "coilspin: " + stage + " " + std::to_string(done) + "/" + std::to_string(total) + " (" +
                           percent + " %)";
  if (terminal_) {
    out_ << '\r' << line;
    if (line.size() < shown_width_) out_ << std::string(shown_width_ - line.size(), ' ');  // over the longer line
    shown_width_ = std::max(shown_width_, line.size());
  } else {
    out_ << line << '\n';
  }
  out_.flush();
  last_stage_ = stage;
  last_write_s_ = now_s;
}

core::Progress ProgressPrinter::Callback() {
  return [this](core::ProgressStage stage, int done, int total) { Report(ProgressStageText(stage), done, total); };
}

void ProgressPrinter::Finish() {
  if (!terminal_ || shown_width_ == 0) return;
  out_ << '\r' << std::string(shown_width_, ' ') << '\r';
  out_.flush();
  shown_width_ = 0;
}

}  // namespace coilspin::cli
