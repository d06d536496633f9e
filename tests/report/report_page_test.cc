// The HTML report's page (src/output/html_report.h): nothing fetched from a
// network, text that cannot break out of the page, the same bytes each time.

#include <gtest/gtest.h>

#include <regex>

#include "src/output/html_report.h"
#include "src/output/plotting_library.h"

namespace coilspin::testing {
namespace {

MotorEstimate SmallEstimate(const std::string& label) {
  MotorEstimate e;
  e.motor_label = label;
  QuantityEstimate r;
  r.key = "resistance";
  r.symbol = "R";
  r.unit = "ohm";
  r.value = 1.37;
  r.std_error = 0.002;
  r.ci_low = 1.366;
  r.ci_high = 1.374;
  r.tests = {"locked-rotor"};
  r.assumes = {"brush_drop = 0 V: <0.1 % of R"};
  e.parameters.push_back(r);
  e.correlation_names = {"resistance"};
  e.correlation = {{1.0}};
  e.torque_speed = TorqueSpeedLine{12.0, true, {{0.0, 0.2, 0.19, 0.21}, {400.0, 0.0, -0.01, 0.01}}};
  e.tests.push_back({"locked-rotor", "a.csv", 3, "plateaus", {}, {}, {}, {}});
  return e;
}

BenchLog SmallLog() {
  BenchLog log;
  log.path = "a.csv";
  log.time_s = {0.0, 0.1, 0.2};
  log.voltage_V = {1.0, 2.0, 3.0};
  log.current_A = {0.7, 1.4, 2.1};
  return log;
}

TEST(ReportPage, FetchesNothingFromANetwork) {
  // An address a browser would fetch: src=, href=, CSS url() or @import naming http(s) or a
  // scheme-relative //host (HTML Living Standard: these attributes load resources). The
  // library's licence comment names its home page as text, which nothing fetches.
  const BenchLog log = SmallLog();
  const std::string html = output::HtmlReport(SmallEstimate("m"), {&log}, nullptr);
  const std::regex fetch(R"(((src|href|action|poster|data)\s*=\s*["']?\s*(https?:|//))|url\(\s*["']?\s*(https?:|//)|@import)",
                         std::regex::icase);
  std::smatch m;
  EXPECT_FALSE(std::regex_search(html, m, fetch)) << m.str();
  EXPECT_EQ(html.find("sourceMappingURL"), std::string::npos);
  // The library is inlined whole: its script is in the page.
  EXPECT_NE(html.find(output::ThePlottingLibrary().script.substr(0, 200)), std::string::npos);
  EXPECT_EQ(output::ThePlottingLibrary().name, "dygraphs");
}

TEST(ReportPage, TextCannotCloseItsElements) {
  const BenchLog log = SmallLog();
  const std::string html = output::HtmlReport(SmallEstimate("</script><b>x"), {&log}, nullptr);
  EXPECT_EQ(html.find("</script><b>x"), std::string::npos);
  EXPECT_NE(html.find("&lt;/script&gt;&lt;b&gt;x"), std::string::npos);
  EXPECT_NE(html.find("brush_drop = 0 V: &lt;0.1 % of R"), std::string::npos);  // assumptions shown
}

TEST(ReportPage, SameInputSameBytes) {
  const BenchLog log = SmallLog();
  EXPECT_EQ(output::HtmlReport(SmallEstimate("m"), {&log}, nullptr),
            output::HtmlReport(SmallEstimate("m"), {&log}, nullptr));
}

TEST(ReportPage, ChartsOfEveryChannelAndTheTorqueSpeedBand) {
  const BenchLog log = SmallLog();
  const std::string html = output::HtmlReport(SmallEstimate("m"), {&log}, nullptr);
  for (const char* id : {"id=\"torque-speed\"", "id=\"test1-voltage\"", "id=\"test1-current\""})
    EXPECT_NE(html.find(id), std::string::npos) << id;
  EXPECT_NE(html.find("[400,[-0.01,0,0.01]]"), std::string::npos);  // a band row: [speed, [low, torque, high]]
}

}  // namespace
}  // namespace coilspin::testing
