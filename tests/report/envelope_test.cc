// The report's reduction of long logs (src/output/envelope.h) and what it does
// to a page drawn from a log of a million rows: every extreme kept, the page's
// size bounded by the chart width, not by the log.

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>

#include "src/output/envelope.h"
#include "src/output/html_report.h"
#include "src/output/report_charts.h"

namespace coilspin::testing {
namespace {

constexpr std::size_t kMillion = 1000000;

std::vector<double> Times(std::size_t n, double period_s) {
  std::vector<double> t(n);
  for (std::size_t k = 0; k < n; ++k) t[k] = static_cast<double>(k) * period_s;
  return t;
}

TEST(Envelope, ShortLogsAreKeptWhole) {
  const std::vector<double> t = Times(100, 1e-3), y(100, 1.0);
  const auto kept = output::EnvelopeSamples(t, {&y}, 800);
  ASSERT_EQ(kept.size(), 100u);
  EXPECT_EQ(kept.back(), 99u);
}

TEST(Envelope, AMillionRowsKeepEveryColumnsExtremesAndSpikes) {
  // Noise with single-sample spikes at known rows: every spike must survive, and every
  // pixel column's minimum and maximum must be among the samples kept (the definition).
  std::mt19937_64 random(14);
  std::normal_distribution<double> noise(0.0, 1.0);
  const std::vector<double> t = Times(kMillion, 1e-5);
  std::vector<double> y(kMillion);
  for (auto& v : y) v = noise(random);
  const std::size_t spikes[] = {3, 123457, 500000, 999998};
  y[spikes[0]] = 50.0;
  y[spikes[1]] = -75.0;
  y[spikes[2]] = 1000.0;
  y[spikes[3]] = -1000.0;
  const std::size_t columns = 800;
  const auto kept = output::EnvelopeSamples(t, {&y}, columns);
  EXPECT_LE(kept.size(), 2 * columns + 2);
  EXPECT_TRUE(std::is_sorted(kept.begin(), kept.end()));
  for (std::size_t s : spikes) EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), s)) << s;
  // Column by column (the same equal-width bins over [t0, tN]): the kept samples reach the column's extremes.
  const double span = t.back() - t.front();
  std::vector<double> low(columns, INFINITY), high(columns, -INFINITY), kept_low(columns, INFINITY),
      kept_high(columns, -INFINITY);
  const auto bin = [&](std::size_t k) {
    return std::min(columns - 1, static_cast<std::size_t>((t[k] - t.front()) / span * columns));
  };
  for (std::size_t k = 0; k < kMillion; ++k) {
    low[bin(k)] = std::min(low[bin(k)], y[k]);
    high[bin(k)] = std::max(high[bin(k)], y[k]);
  }
  for (std::size_t k : kept) {
    kept_low[bin(k)] = std::min(kept_low[bin(k)], y[k]);
    kept_high[bin(k)] = std::max(kept_high[bin(k)], y[k]);
  }
  for (std::size_t b = 0; b < columns; ++b) {
    EXPECT_EQ(kept_low[b], low[b]) << "column " << b;
    EXPECT_EQ(kept_high[b], high[b]) << "column " << b;
  }
}

TEST(Envelope, SamplesAskedForAndGapsInASeries) {
  std::vector<double> t = Times(10000, 1e-3), y(10000, 0.0), model(10000, NAN);
  for (std::size_t k = 4000; k < 6000; ++k) model[k] = 1.0;  // a fitted stretch: NaN elsewhere
  const auto kept = output::EnvelopeSamples(t, {&y, &model}, 100, {7777});
  EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), 7777u));
  EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), 4000u));  // the first of the stretch, its column's min
  EXPECT_LE(kept.size(), 2u * 100u * 2u + 3u);
}

TEST(ReportOfALongLog, KeepsItsExtremesAndStaysSmall) {
  // One test whose log has a million rows and two one-sample spikes; no fit behind it.
  BenchLog log;
  log.path = "long.csv";
  log.time_s = Times(kMillion, 1e-5);
  log.voltage_V.assign(kMillion, 12.0);
  log.current_A.resize(kMillion);
  for (std::size_t k = 0; k < kMillion; ++k) log.current_A[k] = 1.5 + 0.01 * std::sin(1e-3 * static_cast<double>(k));
  log.current_A[654321] = 9.875;
  log.current_A[10] = -3.25;
  MotorEstimate e;
  e.motor_label = "long log";
  e.tests.push_back({"locked-rotor", "long.csv", static_cast<long>(kMillion), "test of the envelope", {}, {}, {}, {}});
  const std::string html = output::HtmlReport(e, {&log}, nullptr);
  EXPECT_NE(html.find(",9.875]"), std::string::npos);
  EXPECT_NE(html.find(",-3.25]"), std::string::npos);
  // Two channels of at most 2·800 + 2 rows of two numbers each, beside the ~130 kB library: far below 1 MB.
  EXPECT_LT(html.size(), 1000000u) << html.size();
  // Each chart's rows: bounded by the columns, whatever the log's length.
  const auto charts = output::TestCharts(e, 0, &log, "t");
  ASSERT_EQ(charts.size(), 2u);  // voltage and current, no model
  for (const auto& c : charts) EXPECT_LE(std::count(c.rows.begin(), c.rows.end(), '['), 2 * 800 + 2 + 1) << c.id;
}

}  // namespace
}  // namespace coilspin::testing
