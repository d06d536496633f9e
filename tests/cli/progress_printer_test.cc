// The progress printer (src/cli/progress_printer.h), with a clock the test
// sets: silent during the first second, then one line per stage and per
// second in a log file, or one line rewritten in place on a terminal and
// cleared at the end (common practice for terminal progress).

#include "src/cli/progress_printer.h"

#include <gtest/gtest.h>

#include <sstream>

namespace coilspin::cli {
namespace {

TEST(ProgressPrinter, SilentDuringTheFirstSecond) {
  double now_s = 0.0;
  std::ostringstream out;
  ProgressPrinter printer(out, /*terminal=*/false, [&] { return now_s; });
  now_s = 0.9;
  printer.Report("reading log.csv", 0, 1);
  printer.Callback()(core::ProgressStage::kSolving, 1, 4);
  printer.Finish();
  EXPECT_EQ(out.str(), "");
}

TEST(ProgressPrinter, ALogFileGetsALinePerStageAndPerSecond) {
  double now_s = 0.0;
  std::ostringstream out;
  ProgressPrinter printer(out, /*terminal=*/false, [&] { return now_s; });
  const core::Progress progress = printer.Callback();
  now_s = 1.5;
  progress(core::ProgressStage::kBootstrapReplicates, 40, 200);   // a new stage: written
  now_s = 1.7;
  progress(core::ProgressStage::kBootstrapReplicates, 60, 200);   // within a second: not
  now_s = 2.6;
  progress(core::ProgressStage::kBootstrapReplicates, 120, 200);  // a second later: written
  now_s = 2.7;
  progress(core::ProgressStage::kBootstrapReplicates, 200, 200);  // the stage's end: written
  printer.Finish();
  EXPECT_EQ(out.str(),
            "coilspin: bootstrap replicates 40/200 (20 %)\n"
            "coilspin: bootstrap replicates 120/200 (60 %)\n"
            "coilspin: bootstrap replicates 200/200 (100 %)\n");
}

TEST(ProgressPrinter, ATerminalLineIsRewrittenAndClearedAtTheEnd) {
  double now_s = 2.0;
  std::ostringstream out;
  ProgressPrinter printer(out, /*terminal=*/true, [&] { return now_s; });
  now_s = 3.5;
  printer.Report("solving (least squares)", 1, 4);
  printer.Report("covariance", 0, 1);
  printer.Finish();
  const std::string first = "coilspin: solving (least squares) 1/4 (25 %)";
  const std::string second = "coilspin: covariance 0/1 (0 %)";
  EXPECT_EQ(out.str(), "\r" + first + "\r" + second + std::string(first.size() - second.size(), ' ') + "\r" +
                           std::string(first.size(), ' ') + "\r");
}

TEST(ProgressPrinter, EveryStageHasItsText) {
  EXPECT_EQ(ProgressStageText(core::ProgressStage::kPlanning), "segmenting the logs");
  EXPECT_EQ(ProgressStageText(core::ProgressStage::kSolving), "solving (least squares)");
  EXPECT_EQ(ProgressStageText(core::ProgressStage::kCovariance), "covariance");
  EXPECT_EQ(ProgressStageText(core::ProgressStage::kProfileIntervals), "profile intervals");
  EXPECT_EQ(ProgressStageText(core::ProgressStage::kBootstrapReplicates), "bootstrap replicates");
}

}  // namespace
}  // namespace coilspin::cli
