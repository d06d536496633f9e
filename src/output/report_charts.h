#pragma once
// The charts of the HTML report as data for the page's script (html_report.h):
// per test, each logged channel with the fitted model over it and the
// residuals beneath (long logs reduced by envelope.h, never by dropping
// extremes), readings set aside at ingest marked, and the spans of the log the
// fit used (the rest is shaded as not used); the torque–speed line with its
// band. Numbers are SI, as the logs are after ingest.

#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/ingest/bench_log.h"

namespace coilspin::output {

// Pixel columns of a chart's plot area: the envelope keeps a minimum and a
// maximum per column and series (the page draws charts this wide, html_report.cc).
inline constexpr std::size_t kChartColumns = 800;

struct ChartSpec {
  std::string id;       // the element the chart is drawn into
  std::string title;
  std::string x_label, y_label;
  std::vector<std::string> series;       // labels of the y series, in column order
  std::vector<std::string> colours;      // one per series (CSS colour)
  std::vector<std::string> points_only;  // series drawn as marks without lines
  bool band = false;                     // rows are [x, [low, y, high]] (torque–speed)
  bool residual = false;                 // a residual chart: a line at zero
  bool shade_unused = false;             // shade the x ranges outside `used`
  std::vector<std::pair<double, double>> used;  // x ranges the fit used
  std::string rows;                      // the data rows as JSON text: [[x, y1, ...], ...]
};

// The charts of test `test` of `estimate`, drawn from its log. `log` may be
// null (no charts then).
std::vector<ChartSpec> TestCharts(const MotorEstimate& estimate, std::size_t test, const BenchLog* log,
                                  const std::string& id_prefix);

// The torque–speed line with its band; empty when the estimate has none.
std::vector<ChartSpec> TorqueSpeedChart(const MotorEstimate& estimate);

// The specs as one JSON array for the page's script.
std::string ChartsJson(const std::vector<ChartSpec>& charts);

}  // namespace coilspin::output
