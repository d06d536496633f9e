// `fit --report`: the target is checked before any fitting, refused when it is
// not a regular file or its folder is missing (exit status 2, nothing written),
// and the page holds every test's charts.

#include <gtest/gtest.h>

#include <chrono>
#include <filesystem>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

const std::string kPlateaus = std::string(COILSPIN_DEMO_DIR) + "/locked-rotor-plateaus.csv";

TEST(ReportOption, RefusesAFolderAMissingFolderAndALinkBeforeFitting) {
  ScratchFolder folder("report_refused");
  std::filesystem::create_directory(folder.path() / "page.html");  // a folder where the page would go
  RunResult r = RunCoilspin("fit --locked-rotor '" + kPlateaus + "' --report page.html", folder.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("not a regular file"), std::string::npos) << r.err;
  EXPECT_TRUE(r.out.empty()) << r.out;  // refused before the fit: no table
  r = RunCoilspin("fit --locked-rotor '" + kPlateaus + "' --report no/such/folder/page.html", folder.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("does not exist"), std::string::npos) << r.err;
  folder.Write("real.html", "keep me");
  std::filesystem::create_symlink(folder.path() / "real.html", folder.path() / "link.html");
  r = RunCoilspin("fit --locked-rotor '" + kPlateaus + "' --report link.html", folder.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_EQ(Slurp(folder.path() / "real.html"), "keep me");
  r = RunCoilspin("fit '" + std::string(COILSPIN_DEMO_DIR) + "/session.toml' --out-dir out --report page2.html",
                  folder.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_FALSE(std::filesystem::exists(folder.path() / "page2.html"));
}

TEST(ReportOption, WritesOnePageWithTheModelOverTheLog) {
  ScratchFolder folder("report_written");
  folder.Write("page.html", "an older page");  // a regular file is replaced
  const RunResult r = RunCoilspin("fit --locked-rotor '" + kPlateaus + "' --report page.html --quiet", folder.path());
  ASSERT_EQ(r.status, 0) << r.err;
  const std::string html = Slurp(folder.path() / "page.html");
  EXPECT_EQ(html.rfind("<!DOCTYPE html>", 0), 0u);
  EXPECT_NE(html.find("id=\"test1-voltage\""), std::string::npos);
  EXPECT_NE(html.find("id=\"test1-voltage-residual\""), std::string::npos);  // the plateau voltage is fitted
  EXPECT_NE(html.find("model (plateau means)"), std::string::npos);
  for (const auto& entry : std::filesystem::directory_iterator(folder.path()))  // no temporary file left
    EXPECT_EQ(entry.path().filename().string().find(".tmp-"), std::string::npos) << entry.path();
}

}  // namespace
}  // namespace coilspin::testing
