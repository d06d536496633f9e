#include "src/output/parameter_table.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "src/output/number_format.h"

namespace coilspin::output {
namespace {

std::string Join(const std::vector<std::string>& items, const char* separator) {
  std::string text;
  for (const auto& item : items) text += (text.empty() ? "" : separator) + item;
  return text;
}

// One row's cells, as printed.
struct Cells {
  std::string key, symbol, value, unit, interval, tests;
};

Cells CellsOf(const QuantityEstimate& q) {
  return {q.key,
          q.symbol,
          FormatValue(q.value, q.std_error),
          q.unit,
          "[" + FormatValue(q.ci_low, q.std_error) + ", " + FormatValue(q.ci_high, q.std_error) + "]",
          Join(q.tests, ", ")};
}

// Column widths: the widest cell of each column over every section, so that
// the columns line up whatever the length of a key, symbol or unit.
struct Widths {
  std::size_t key, symbol, value, unit, interval;
};

const Cells kHeader = {"quantity", "sym", "value", "unit", "interval", "from"};

Widths WidthsOf(const std::vector<const std::vector<QuantityEstimate>*>& sections) {
  Widths w{kHeader.key.size(), kHeader.symbol.size(), kHeader.value.size(), kHeader.unit.size(),
           kHeader.interval.size()};
  for (const auto* quantities : sections)
    for (const auto& q : *quantities) {
      const Cells c = CellsOf(q);
      w.key = std::max(w.key, c.key.size());
      w.symbol = std::max(w.symbol, c.symbol.size());
      w.value = std::max(w.value, c.value.size());
      w.unit = std::max(w.unit, c.unit.size());
      w.interval = std::max(w.interval, c.interval.size());
    }
  return w;
}

std::string Padded(const std::string& text, std::size_t width, bool right = false) {
  const std::string fill(width > text.size() ? width - text.size() : 0, ' ');
  return right ? fill + text : text + fill;
}

// "  key  sym  value  unit  interval  from": keys, symbols, units and intervals
// left-aligned, values right-aligned.
std::string Line(const Cells& c, const Widths& w) {
  std::string line = "  " + Padded(c.key, w.key) + "  " + Padded(c.symbol, w.symbol) + "  " +
                     Padded(c.value, w.value, true) + "  " + Padded(c.unit, w.unit) + "  " +
                     Padded(c.interval, w.interval) + "  " + c.tests;
  while (!line.empty() && line.back() == ' ') line.pop_back();
  return line + "\n";
}

std::string Row(const QuantityEstimate& q, const Widths& w) {
  std::string row = Line(CellsOf(q), w);
  if (!q.basis.empty()) row += "      basis: " + q.basis + "\n";
  if (!q.note.empty()) row += "      " + q.note + "\n";
  for (const auto& a : q.assumes) row += "      assumes " + a + "\n";
  return row;
}

void Section(std::ostringstream& out, const char* title, const std::vector<QuantityEstimate>& quantities,
             const Widths& widths) {
  if (quantities.empty()) return;
  out << title << "\n" << Line(kHeader, widths);
  for (const auto& q : quantities) out << Row(q, widths);
}

}  // namespace

std::string ParameterTable(const MotorEstimate& e) {
  std::ostringstream out;
  char title[128];
  const std::string& m = e.intervals.method;
  const std::string kind = m == "bootstrap" ? "moving-block bootstrap, percentile"
                           : m == "profile" ? "profile likelihood"
                                            : "Student-t";
  const std::string loss = e.intervals.robust_loss == "none" ? "" : ", " + e.intervals.robust_loss + " loss";
  std::snprintf(title, sizeof title, "%.4g %% intervals (two-sided, %s%s)", 100.0 * e.confidence, kind.c_str(),
                loss.c_str());
  out << "coilspin fit" << (e.motor_label.empty() ? "" : " of " + e.motor_label) << " — " << title << "\n\n";
  const Widths widths = WidthsOf({&e.parameters, &e.ratios, &e.derived, &e.sensor_offsets});
  Section(out, "parameters", e.parameters, widths);
  if (!e.ratios.empty()) out << "\n";
  Section(out, "ratios", e.ratios, widths);
  if (!e.derived.empty()) out << "\n";
  std::string derived_title = "derived";
  for (const auto& q : e.derived)
    if (q.at_voltage_V) {
      char at[96];
      std::snprintf(at, sizeof at, " (quantities of the torque-speed line at V = %.4g V)", *q.at_voltage_V);
      derived_title += at;
      break;
    }
  Section(out, derived_title.c_str(), e.derived, widths);
  if (!e.sensor_offsets.empty()) out << "\n";
  Section(out, "sensor zero readings (subtracted from the logs)", e.sensor_offsets, widths);
  if (!e.not_identified.empty()) {
    out << "\nnot identified\n";
    for (const auto& [key, reason] : e.not_identified) out << "  " << key << ": " << reason << "\n";
  }
  if (e.consistency) {
    out << "\nKt/Ke consistency: " << e.consistency->verdict;
    if (!e.consistency->note.empty()) out << " — " << e.consistency->note;
    out << "\n";
  }
  out << "\ntests\n";
  for (const auto& t : e.tests) {
    out << "  " << t.kind << "  " << t.file << "  (" << t.samples << " rows; " << t.method << ")\n";
    for (const auto& r : t.residuals) {
      out << "      " << r.channel << " residual RMS " << FormatValue(r.rms, 0.0, 3) << " " << r.unit << " over "
          << r.samples << (r.samples == 1 ? " residual" : " residuals") << ", lag-1 autocorrelation "
          << FormatValue(r.lag1_autocorrelation, 0.0, 2) << "\n";
    }
    for (const auto& [channel, lines] : t.set_aside) {
      out << "      " << lines.size() << " isolated " << channel << (lines.size() == 1 ? " reading" : " readings")
          << " set aside as outliers (line";
      constexpr std::size_t kLinesShown = 5;
      out << (lines.size() == 1 ? " " : "s ");
      for (std::size_t k = 0; k < std::min(lines.size(), kLinesShown); ++k) out << (k ? ", " : "") << lines[k];
      if (lines.size() > kLinesShown) out << ", ...";
      out << "): replaced by the line between their neighbours\n";
    }
  }
  if (!e.intervals.notes.empty()) {
    out << "\nintervals\n";
    for (const auto& n : e.intervals.notes) out << "  " << n << "\n";
  }
  if (!e.warnings.empty()) {
    out << "\nwarnings\n";
    for (const auto& w : e.warnings) out << "  " << w << "\n";
  }
  return out.str();
}

}  // namespace coilspin::output
