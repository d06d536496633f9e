#include "src/output/report_charts.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include "src/output/envelope.h"

namespace coilspin::output {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
// Digits of the numbers in a chart: enough to tell 10⁶ samples apart on the
// time axis, and more than a screen resolves on the value axis.
constexpr int kTimeDigits = 10;
constexpr int kValueDigits = 7;

const char* const kLoggedColour = "#3d5a80";
const char* const kModelColour = "#e07a1f";
const char* const kSetAsideColour = "#b5179e";
const char* const kResidualColour = "#4f772d";
const char* const kLineColour = "#1b7f79";

std::string Number(double value, int digits) {
  if (!std::isfinite(value)) return "null";
  char buffer[40];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
  return buffer;
}

// JSON string text: quotes, backslashes, control characters and '<' escaped (so
// that no text can close the page's script element).
std::string Quoted(const std::string& text) {
  std::string out = "\"";
  for (unsigned char c : text) {
    if (c == '"' || c == '\\') {
      out += '\\';
      out += static_cast<char>(c);
    } else if (c < 0x20 || c == '<' || c == '>' || c == '&') {
      char buffer[8];
      std::snprintf(buffer, sizeof buffer, "\\u%04x", c);
      out += buffer;
    } else {
      out += static_cast<char>(c);
    }
  }
  return out + "\"";
}

std::string QuotedList(const std::vector<std::string>& items) {
  std::string out = "[";
  for (std::size_t k = 0; k < items.size(); ++k) out += (k ? "," : "") + Quoted(items[k]);
  return out + "]";
}

struct Channel {
  units::Quantity quantity;
  const char* name;
  const char* unit;
};
const Channel kChannels[] = {
    {units::Quantity::kVoltage, "voltage", "V"},         {units::Quantity::kCurrent, "current", "A"},
    {units::Quantity::kSpeed, "speed", "rad/s"},         {units::Quantity::kPosition, "position", "rad"},
    {units::Quantity::kTorque, "torque", "N*m"},         {units::Quantity::kTemperature, "temperature", "degC"},
};

// The model and residual of one channel, sample by sample (NaN where the fit has none),
// and the samples where a fitted stretch begins or ends.
struct Overlay {
  std::vector<double> model, residual;
  std::vector<std::size_t> edges;
  bool plateau_means = false;
};

// A fitted stretch of samples [begin, end): its first and last sample, and the
// samples just outside it, where the model is absent, so that the chart breaks
// the model's line there rather than joining one stretch to the next.
void AddEdges(std::size_t begin, std::size_t end, std::vector<std::size_t>* edges) {
  if (begin >= end) return;
  if (begin > 0) edges->push_back(begin - 1);
  edges->push_back(begin);
  edges->push_back(end - 1);
  edges->push_back(end);  // may be one past the log: the envelope ignores it
}

Overlay OverlayOf(const MotorEstimate& e, std::size_t test, const std::string& channel, std::size_t samples) {
  Overlay o;
  for (const ModelTrace& t : e.model_traces) {
    if (t.test != test || t.channel != channel) continue;
    if (o.model.empty()) {
      o.model.assign(samples, kNaN);
      o.residual.assign(samples, kNaN);
    }
    o.plateau_means = o.plateau_means || t.plateau_means;
    for (std::size_t k = 0; k < t.model.size(); ++k) {
      const auto span = t.plateau_means ? t.spans[k] : std::make_pair(t.first_sample + k, t.first_sample + k + 1);
      for (std::size_t i = span.first; i < std::min(span.second, samples); ++i) {
        o.model[i] = t.model[k];
        o.residual[i] = t.residual[k];
      }
      if (t.plateau_means) AddEdges(span.first, span.second, &o.edges);
    }
    if (!t.plateau_means && !t.model.empty()) AddEdges(t.first_sample, t.first_sample + t.model.size(), &o.edges);
  }
  return o;
}

// The x ranges of the log that any residual of the test stands for, merged.
std::vector<std::pair<double, double>> UsedRanges(const MotorEstimate& e, std::size_t test, const BenchLog& log) {
  std::vector<std::pair<double, double>> ranges;
  const std::size_t n = log.size();
  const auto add = [&](std::size_t begin, std::size_t end) {  // samples [begin, end)
    if (begin < end && end <= n) ranges.push_back({log.time_s[begin], log.time_s[end - 1]});
  };
  for (const ModelTrace& t : e.model_traces) {
    if (t.test != test) continue;
    if (t.plateau_means)
      for (const auto& s : t.spans) add(s.first, s.second);
    else
      add(t.first_sample, t.first_sample + t.model.size());
  }
  std::sort(ranges.begin(), ranges.end());
  std::vector<std::pair<double, double>> merged;
  for (const auto& r : ranges) {
    if (!merged.empty() && r.first <= merged.back().second)
      merged.back().second = std::max(merged.back().second, r.second);
    else
      merged.push_back(r);
  }
  return merged;
}

// Rows of the log whose readings of `channel` were set aside at ingest (by file line).
std::vector<std::size_t> SetAsideRows(const TestSummary& summary, const std::string& channel, const BenchLog& log) {
  std::vector<std::size_t> rows;
  for (const auto& [name, lines] : summary.set_aside) {
    if (name != channel) continue;
    for (long line : lines) {
      const auto at = std::lower_bound(log.line_of_row.begin(), log.line_of_row.end(), line);
      if (at != log.line_of_row.end() && *at == line) rows.push_back(static_cast<std::size_t>(at - log.line_of_row.begin()));
    }
  }
  std::sort(rows.begin(), rows.end());
  return rows;
}

std::string Rows(const std::vector<double>& x, const std::vector<const std::vector<double>*>& columns,
                 const std::vector<std::size_t>& samples) {
  std::string rows = "[";
  bool first = true;
  for (std::size_t k : samples) {
    rows += first ? "[" : ",[";
    first = false;
    rows += Number(x[k], kTimeDigits);
    for (const auto* c : columns) rows += "," + Number((*c)[k], kValueDigits);
    rows += "]";
  }
  return rows + "]";
}

}  // namespace

std::vector<ChartSpec> TestCharts(const MotorEstimate& e, std::size_t test, const BenchLog* log,
                                  const std::string& id_prefix) {
  std::vector<ChartSpec> charts;
  if (log == nullptr || log->size() == 0 || test >= e.tests.size()) return charts;
  const TestSummary& summary = e.tests[test];
  const std::size_t n = log->size();
  const std::vector<std::pair<double, double>> used = UsedRanges(e, test, *log);
  for (const Channel& c : kChannels) {
    const std::vector<double>& logged = log->Channel(c.quantity);
    if (logged.size() != n) continue;
    const Overlay overlay = OverlayOf(e, test, c.name, n);
    const std::vector<std::size_t> set_aside = SetAsideRows(summary, c.name, *log);
    std::vector<double> marks;
    if (!set_aside.empty()) {
      marks.assign(n, kNaN);
      for (std::size_t k : set_aside) marks[k] = logged[k];
    }
    std::vector<std::size_t> also = overlay.edges;
    also.insert(also.end(), set_aside.begin(), set_aside.end());

    ChartSpec chart;
    chart.id = id_prefix + "-" + c.name;
    chart.title = std::string(c.name) + (overlay.model.empty() ? ", logged" : ", logged and fitted model");
    chart.x_label = "time [s]";
    chart.y_label = std::string(c.name) + " [" + c.unit + "]";
    chart.shade_unused = true;
    chart.used = used;
    std::vector<const std::vector<double>*> columns = {&logged};
    chart.series = {"logged"};
    chart.colours = {kLoggedColour};
    if (!overlay.model.empty()) {
      columns.push_back(&overlay.model);
      chart.series.push_back(overlay.plateau_means ? "model (plateau means)" : "model");
      chart.colours.push_back(kModelColour);
    }
    if (!marks.empty()) {
      columns.push_back(&marks);
      chart.series.push_back("set aside (repaired)");
      chart.colours.push_back(kSetAsideColour);
      chart.points_only.push_back("set aside (repaired)");
    }
    const std::vector<const std::vector<double>*> envelope(columns.begin(),
                                                           columns.begin() + (overlay.model.empty() ? 1 : 2));
    chart.rows = Rows(log->time_s, columns, EnvelopeSamples(log->time_s, envelope, kChartColumns, also));
    charts.push_back(chart);

    if (overlay.model.empty()) continue;
    ChartSpec residual;
    residual.id = chart.id + "-residual";
    residual.title = std::string(c.name) + " residual, measured - model" +
                     (overlay.plateau_means ? " (of each plateau mean, drawn over its plateau)" : "");
    residual.x_label = "time [s]";
    residual.y_label = "residual [" + std::string(c.unit) + "]";
    residual.series = {"residual"};
    residual.colours = {kResidualColour};
    residual.residual = true;
    residual.shade_unused = true;
    residual.used = used;
    residual.rows = Rows(log->time_s, {&overlay.residual},
                         EnvelopeSamples(log->time_s, {&overlay.residual}, kChartColumns, overlay.edges));
    charts.push_back(residual);
  }
  return charts;
}

std::vector<ChartSpec> TorqueSpeedChart(const MotorEstimate& e) {
  if (!e.torque_speed || e.torque_speed->points.empty()) return {};
  ChartSpec chart;
  chart.id = "torque-speed";
  chart.title = "torque-speed line at " + Number(e.torque_speed->at_voltage_V, 6) + " V" +
                (e.torque_speed->includes_friction ? ", shaft torque after friction" : ", friction not included") +
                ", with its " + Number(100.0 * e.confidence, 4) + " % band";
  chart.x_label = "speed [rad/s]";
  chart.y_label = "torque [N*m]";
  chart.series = {"torque"};
  chart.colours = {kLineColour};
  chart.band = true;
  chart.rows = "[";
  bool first = true;
  for (const TorqueSpeedPoint& p : e.torque_speed->points) {
    chart.rows += std::string(first ? "" : ",") + "[" + Number(p.speed_rad_s, kTimeDigits) + ",[" +
                  Number(p.ci_low, kValueDigits) + "," + Number(p.torque_N_m, kValueDigits) + "," +
                  Number(p.ci_high, kValueDigits) + "]]";
    first = false;
  }
  chart.rows += "]";
  return {chart};
}

std::string ChartsJson(const std::vector<ChartSpec>& charts) {
  std::string out = "[";
  for (std::size_t k = 0; k < charts.size(); ++k) {
    const ChartSpec& c = charts[k];
    out += k ? ",\n{" : "{";
    out += "\"id\":" + Quoted(c.id) + ",\"title\":" + Quoted(c.title) + ",\"xlabel\":" + Quoted(c.x_label) +
           ",\"ylabel\":" + Quoted(c.y_label) + ",\"series\":" + QuotedList(c.series) +
           ",\"colours\":" + QuotedList(c.colours) + ",\"points\":" + QuotedList(c.points_only) +
           ",\"band\":" + (c.band ? "true" : "false") + ",\"residual\":" + (c.residual ? "true" : "false") +
           ",\"shade\":" + (c.shade_unused ? "true" : "false") + ",\"used\":[";
    for (std::size_t u = 0; u < c.used.size(); ++u)
      out += (u ? ",[" : "[") + Number(c.used[u].first, kTimeDigits) + "," + Number(c.used[u].second, kTimeDigits) + "]";
    out += "],\"rows\":" + c.rows + "}";
  }
  return out + "]";
}

}  // namespace coilspin::output
