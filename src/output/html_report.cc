#include "src/output/html_report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "src/output/number_format.h"
#include "src/output/plotting_library.h"
#include "src/output/report_charts.h"
#include "src/output/report_page_script.h"
#include "src/output/verification_table.h"

namespace coilspin::output {
namespace {

std::string Html(const std::string& text) {
  std::string out;
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string Join(const std::vector<std::string>& items, const char* separator) {
  std::string text;
  for (const auto& item : items) text += (text.empty() ? "" : separator) + item;
  return text;
}

std::string Format2(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.2f", value);
  return buffer;
}

std::string Percent(double fraction) { return ShortNumber(100.0 * fraction, 4) + " %"; }

// A table of estimates: value, unit, interval, the tests behind it, and its notes and assumptions.
void QuantityTable(std::ostringstream& out, const std::vector<QuantityEstimate>& quantities, double confidence,
                   bool with_voltage) {
  out << "<table><tr><th>quantity</th><th>symbol</th><th>value</th><th>unit</th><th>" << Percent(confidence)
      << " interval</th><th>std. error</th><th>from</th><th>notes and assumptions</th></tr>\n";
  for (const QuantityEstimate& q : quantities) {
    std::vector<std::string> notes;
    if (!q.basis.empty()) notes.push_back("basis: " + q.basis);
    if (with_voltage && q.at_voltage_V) notes.push_back("at " + ShortNumber(*q.at_voltage_V, 6) + " V");
    if (q.at_temperature_degC) notes.push_back("at " + ShortNumber(*q.at_temperature_degC, 4) + " degC");
    if (!q.note.empty()) notes.push_back(q.note);
    for (const auto& a : q.assumes) notes.push_back("assumes " + a);
    out << "<tr><td>" << Html(q.key) << "</td><td>" << Html(q.symbol) << "</td><td class=\"num\">"
        << FormatValue(q.value, q.std_error) << "</td><td>" << Html(q.unit) << "</td><td class=\"num\">["
        << FormatValue(q.ci_low, q.std_error) << ", " << FormatValue(q.ci_high, q.std_error)
        << "]</td><td class=\"num\">" << ShortNumber(q.std_error, 2) << "</td><td>" << Html(Join(q.tests, ", "))
        << "</td><td class=\"note\">" << Html(Join(notes, "; ")) << "</td></tr>\n";
  }
  out << "</table>\n";
}

// Background of a correlation cell: white at 0, deepening to teal for +1 and to
// brick red for −1 (linear in |ρ|).
std::string CorrelationColour(double rho) {
  const double a = std::min(1.0, std::fabs(rho));
  const int target[2][3] = {{27, 127, 121}, {178, 58, 38}};
  const int* t = rho >= 0.0 ? target[0] : target[1];
  char buffer[16];
  std::snprintf(buffer, sizeof buffer, "#%02x%02x%02x", static_cast<int>(std::lround(255 + (t[0] - 255) * a)),
                static_cast<int>(std::lround(255 + (t[1] - 255) * a)),
                static_cast<int>(std::lround(255 + (t[2] - 255) * a)));
  return buffer;
}

void CorrelationMap(std::ostringstream& out, const MotorEstimate& e) {
  const auto& names = e.correlation_names;
  if (names.empty() || e.correlation.size() != names.size()) {
    out << "<p>No correlation matrix: the fit has no usable covariance.</p>\n";
    return;
  }
  std::vector<std::string> symbols;
  for (const auto& n : names) {
    std::string symbol = n;
    for (const auto* section : {&e.parameters, &e.ratios})
      for (const auto& q : *section)
        if (q.key == n) symbol = q.symbol;
    symbols.push_back(symbol);
  }
  out << "<table class=\"correlation\"><tr><th></th>";
  for (const auto& s : symbols) out << "<th>" << Html(s) << "</th>";
  out << "</tr>\n";
  for (std::size_t a = 0; a < names.size(); ++a) {
    out << "<tr><th title=\"" << Html(names[a]) << "\">" << Html(symbols[a]) << "</th>";
    for (std::size_t b = 0; b < names.size(); ++b) {
      const double rho = e.correlation[a][b];
      out << "<td style=\"background:" << CorrelationColour(rho) << (std::fabs(rho) > 0.6 ? ";color:#fff" : "")
          << "\">" << Format2(rho) << "</td>";
    }
    out << "</tr>\n";
  }
  out << "</table>\n<p class=\"key\"><span class=\"swatch\" style=\"background:" << CorrelationColour(-1.0)
      << "\"></span> &minus;1 &nbsp; <span class=\"swatch\" style=\"background:#ffffff\"></span> 0 &nbsp; "
      << "<span class=\"swatch\" style=\"background:" << CorrelationColour(1.0)
      << "\"></span> +1 &nbsp; (correlation of the estimates, from the fit's covariance)</p>\n";
}

void ChartElements(std::ostringstream& out, const std::vector<ChartSpec>& charts) {
  for (const ChartSpec& c : charts)
    out << "<div class=\"chart" << (c.residual ? " residual" : "") << "\" id=\"" << Html(c.id)
        << "\"></div><div class=\"legend\" id=\"" << Html(c.id) << "-legend\"></div>\n";
}

void TestSection(std::ostringstream& out, const MotorEstimate& e, std::size_t k, const BenchLog* log,
                 std::vector<ChartSpec>* charts) {
  const TestSummary& t = e.tests[k];
  out << "<h3>" << Html(t.kind) << ": " << Html(t.file) << "</h3>\n<p class=\"lead\">" << t.samples
      << " rows; " << Html(t.method) << (t.contributed ? "" : " <b>(contributed nothing to the fit)</b>") << "</p>\n";
  if (!t.residuals.empty()) {
    out << "<table><tr><th>channel</th><th>residual RMS</th><th>noise sigma weighted by</th><th>lag-1 "
           "autocorrelation</th><th>residuals</th></tr>\n";
    for (const ChannelResidual& r : t.residuals)
      out << "<tr><td>" << Html(r.channel) << "</td><td class=\"num\">" << ShortNumber(r.rms, 3) << " "
          << Html(r.unit) << "</td><td class=\"num\">" << ShortNumber(r.sigma, 3) << " " << Html(r.unit)
          << "</td><td class=\"num\">" << Format2(r.lag1_autocorrelation) << "</td><td class=\"num\">" << r.samples
          << "</td></tr>\n";
    out << "</table>\n";
  }
  for (const auto& [channel, lines] : t.set_aside) {
    std::vector<std::string> shown;
    for (std::size_t i = 0; i < lines.size() && i < 20; ++i) shown.push_back(std::to_string(lines[i]));
    out << "<p>" << lines.size() << " " << Html(channel)
        << " reading(s) set aside as isolated outliers and repaired (marked on the chart), file line(s) "
        << Join(shown, ", ") << (lines.size() > shown.size() ? ", ..." : "") << ".</p>\n";
  }
  if (!t.warnings.empty()) {
    out << "<ul class=\"findings\">";
    for (const auto& w : t.warnings) out << "<li>" << Html(w) << "</li>";
    out << "</ul>\n";
  }
  const std::vector<ChartSpec> mine = TestCharts(e, k, log, "test" + std::to_string(k + 1));
  if (!mine.empty())
    out << "<p class=\"key\">Shaded: parts of the log the fit did not use (transients, rejected segments, "
           "samples outside the coast or plateaus). Long logs are drawn as the minimum and maximum of the samples "
           "under each pixel column, so no extreme is lost.</p>\n";
  ChartElements(out, mine);
  charts->insert(charts->end(), mine.begin(), mine.end());
}

}  // namespace

std::string HtmlReport(const MotorEstimate& e, const std::vector<const BenchLog*>& logs,
                       const verify::Verification* verification) {
  const PlottingLibrary& library = ThePlottingLibrary();
  std::ostringstream out;
  const std::string title = "coilspin report" + (e.motor_label.empty() ? std::string() : ": " + e.motor_label);
  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" << Html(title)
      << "</title>\n<style>\n" << library.style << "\n" << ReportStyle() << "</style>\n</head>\n<body>\n";
  out << "<h1>" << Html(title) << "</h1>\n<p class=\"lead\">" << e.tests.size() << " bench test(s) fitted jointly; "
      << Percent(e.confidence) << " intervals (" << Html(e.intervals.method)
      << (e.intervals.robust_loss != "none" ? ", robust loss " + Html(e.intervals.robust_loss) : std::string())
      << "); all values in SI units.</p>\n";
  out << "<div id=\"report-problems\" hidden><b>Problems drawing this page</b><ul></ul></div>\n";

  out << "<h2>Parameters</h2>\n";
  QuantityTable(out, e.parameters, e.confidence, false);
  if (!e.not_identified.empty()) {
    out << "<p>Not identified by these tests:</p><ul class=\"findings\">";
    for (const auto& [key, reason] : e.not_identified) out << "<li>" << Html(key) << ": " << Html(reason) << "</li>";
    out << "</ul>\n";
  }
  if (!e.ratios.empty()) {
    out << "<h3>Ratios the mechanical tests determine on their own</h3>\n";
    QuantityTable(out, e.ratios, e.confidence, false);
  }
  if (!e.derived.empty()) {
    out << "<h3>Derived quantities</h3>\n";
    QuantityTable(out, e.derived, e.confidence, true);
  }
  if (!e.sensor_offsets.empty()) {
    out << "<h3>Sensor zero readings</h3>\n";
    QuantityTable(out, e.sensor_offsets, e.confidence, false);
  }
  if (e.consistency) {
    const Consistency& c = *e.consistency;
    out << "<h3>Kt/Ke consistency</h3>\n<p>" << Html(c.verdict);
    if (c.kt_over_ke) out << ": Kt/Ke = " << ShortNumber(*c.kt_over_ke, 5);
    if (c.ci_low && c.ci_high)
      out << ", interval [" << ShortNumber(*c.ci_low, 5) << ", " << ShortNumber(*c.ci_high, 5) << "]";
    out << (c.note.empty() ? "" : ". " + Html(c.note)) << "</p>\n";
  }
  if (verification) {
    out << "<h2>Datasheet verification</h2>\n<pre>" << Html(VerificationText(*verification)) << "</pre>\n";
  }

  std::vector<ChartSpec> charts = TorqueSpeedChart(e);
  out << "<h2>Torque-speed line</h2>\n";
  if (charts.empty())
    out << "<p>No torque-speed line: the tests do not determine it (or no operating voltage).</p>\n";
  ChartElements(out, charts);

  out << "<h2>Correlation of the estimates</h2>\n";
  CorrelationMap(out, e);

  out << "<h2>Tests</h2>\n";
  for (std::size_t k = 0; k < e.tests.size(); ++k)
    TestSection(out, e, k, k < logs.size() ? logs[k] : nullptr, &charts);

  out << "<h2>Warnings and findings</h2>\n<ul class=\"findings\">";
  for (const auto& w : e.warnings) out << "<li>" << Html(w) << "</li>";
  for (const auto& n : e.intervals.notes) out << "<li>intervals: " << Html(n) << "</li>";
  for (const SolverSummary& s : e.solver)
    out << "<li>solver: " << (s.converged ? "converged" : "did not converge") << " (" << Html(s.termination) << ", "
        << s.iterations << " iterations, cost " << ShortNumber(s.initial_cost, 4) << " to "
        << ShortNumber(s.final_cost, 6) << ")</li>";
  out << "</ul>\n";
  if (!e.settings.empty()) {
    out << "<h3>Settings</h3>\n<p class=\"key\">";
    std::vector<std::string> settings;
    for (const auto& [key, value] : e.settings) settings.push_back(Html(key) + " = " + Html(value));
    out << Join(settings, "; ") << "</p>\n";
  }
  out << "<footer>Made by coilspin. Charts drawn by " << Html(library.name) << " " << Html(library.version) << " ("
      << Html(library.licence) << " licence), inlined from the Debian package libjs-dygraphs; the page fetches "
      << "nothing.</footer>\n";
  out << "<script>\n" << library.script << "\n</script>\n";
  out << "<script type=\"application/json\" id=\"chart-data\">\n" << ChartsJson(charts) << "\n</script>\n";
  out << "<script>\n" << ReportScript() << "</script>\n</body>\n</html>\n";
  return out.str();
}

}  // namespace coilspin::output
