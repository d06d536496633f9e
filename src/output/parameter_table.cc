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

std::string Row(const QuantityEstimate& q) {
  char line[512];
  const std::string interval =
      "[" + FormatValue(q.ci_low, q.std_error) + ", " + FormatValue(q.ci_high, q.std_error) + "]";
  std::snprintf(line, sizeof line, "  %-26s %-5s %14s  %-11s %-32s %s\n", q.key.c_str(), q.symbol.c_str(),
                FormatValue(q.value, q.std_error).c_str(), q.unit.c_str(), interval.c_str(), Join(q.tests, ", ").c_str());
  std::string row = line;
  if (!q.basis.empty()) row += "      basis: " + q.basis + "\n";
  if (!q.note.empty()) row += "      " + q.note + "\n";
  return row;
}

void Section(std::ostringstream& out, const char* title, const std::vector<QuantityEstimate>& quantities) {
  if (quantities.empty()) return;
  out << title << "\n";
  char header[256];
  std::snprintf(header, sizeof header, "  %-26s %-5s %14s  %-11s %-32s %s\n", "quantity", "sym", "value", "unit",
                "interval", "from");
  out << header;
  for (const auto& q : quantities) out << Row(q);
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
  Section(out, "parameters", e.parameters);
  if (!e.ratios.empty()) out << "\n";
  Section(out, "ratios", e.ratios);
  if (!e.derived.empty()) out << "\n";
  std::string derived_title = "derived";
  for (const auto& q : e.derived)
    if (q.at_voltage_V) {
      char at[96];
      std::snprintf(at, sizeof at, " (quantities of the torque-speed line at V = %.4g V)", *q.at_voltage_V);
      derived_title += at;
      break;
    }
  Section(out, derived_title.c_str(), e.derived);
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
