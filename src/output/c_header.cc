#include "src/output/c_header.h"

#include <cctype>
#include <cmath>
#include <sstream>

#include "src/output/number_format.h"

namespace coilspin::output {
namespace {

void Replace(std::string* text, const std::string& from, const std::string& to) {
  for (std::size_t at = text->find(from); at != std::string::npos; at = text->find(from, at + to.size()))
    text->replace(at, from.size(), to);
}

std::string Upper(std::string text) {
  for (char& c : text) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return text;
}

void Section(std::ostringstream& out, const char* title, const std::vector<QuantityEstimate>& quantities,
             double confidence) {
  if (quantities.empty()) return;
  out << "\n// ---- " << title << " ----\n";
  for (const auto& q : quantities) {
    if (!std::isfinite(q.value)) {
      out << "// " << q.key << ": not a finite number in the result\n";
      continue;
    }
    const std::string suffix = UnitSuffix(q.unit);
    out << "constexpr double " << q.key << (suffix.empty() ? "" : "_" + suffix) << " = " << ExactNumber(q.value)
        << ";\n";
    out << "//   " << q.symbol << " [" << q.unit << "], " << ShortNumber(100.0 * confidence, 4)
        << " % interval [" << FormatValue(q.ci_low, q.std_error) << ", " << FormatValue(q.ci_high, q.std_error)
        << "], standard error " << FormatValue(q.std_error, 0.0, 2);
    if (q.at_voltage_V) out << ", at " << ShortNumber(*q.at_voltage_V) << " V";
    if (q.at_temperature_degC) out << ", at " << ShortNumber(*q.at_temperature_degC) << " degC";
    if (!q.tests.empty()) {
      std::string tests;
      for (const auto& t : q.tests) tests += (tests.empty() ? "" : ", ") + t;
      out << "; from " << tests;
    }
    if (!q.basis.empty()) out << "; basis " << q.basis;
    out << "\n";
  }
}

}  // namespace

std::string UnitSuffix(const std::string& unit) {
  if (unit == "1") return "";
  std::string s = unit;
  Replace(&s, "sqrt(", "sqrt_");
  Replace(&s, "(", "");
  Replace(&s, ")", "");
  Replace(&s, "^", "");
  Replace(&s, "*", "_");
  Replace(&s, "/", "_per_");
  return s;
}

std::string CHeader(const MotorEstimate& e, const std::string& name, const ExportSource& source) {
  std::ostringstream out;
  const std::string guard = "COILSPIN_MOTOR_" + Upper(name) + "_H_";
  out << "// Parameters of the permanent-magnet DC motor"
      << (source.motor_label.empty() ? "" : " \"" + source.motor_label + "\"") << ", fitted by coilspin\n"
      << "// (" << source.result_file << ", " << source.result_format << "). SI units; intervals are two-sided at "
      << ShortNumber(100.0 * source.confidence, 4) << " %.\n"
      << "// Model: v = R*i + L*di/dt + Ke*w + Vb*sgn(i);  J*dw/dt = Kt*i - B*w - Tc*sgn(w) - T_load\n"
      << "// Written by `coilspin export --format c-header`; regenerate rather than edit.\n"
      << "#ifndef " << guard << "\n#define " << guard << "\n\nnamespace " << name << " {\n";
  Section(out, "parameters", e.parameters, source.confidence);
  if (!e.not_identified.empty()) {
    out << "\n// ---- not determined by the fit ----\n";
    for (const auto& [key, reason] : e.not_identified) out << "// " << key << ": " << reason << "\n";
  }
  Section(out, "ratios", e.ratios, source.confidence);
  for (const auto& q : e.derived)
    if (q.at_voltage_V) {
      out << "\n// ---- operating voltage of the derived figures marked \"at ... V\" ----\n"
          << "constexpr double at_voltage_V = " << ExactNumber(*q.at_voltage_V) << ";\n";
      break;
    }
  Section(out, "derived", e.derived, source.confidence);
  out << "\n}  // namespace " << name << "\n\n#endif  // " << guard << "\n";
  return out.str();
}

}  // namespace coilspin::output
