#include "src/output/verification_csv.h"

#include <cmath>
#include <sstream>

#include "src/output/number_format.h"
#include "src/output/verification_notes.h"

namespace coilspin::output {
namespace {

// RFC 4180, 2.6–2.7: a field holding a comma, a quote or a line break is quoted, quotes doubled.
std::string Field(const std::string& text) {
  if (text.find_first_of(",\"\n\r") == std::string::npos) return text;
  std::string quoted = "\"";
  for (char c : text) quoted += c == '"' ? std::string("\"\"") : std::string(1, c);
  return quoted + "\"";
}

std::string Number(double x) { return std::isfinite(x) ? ExactNumber(x) : ""; }

}  // namespace

std::string VerificationCsv(const verify::Verification& v) {
  std::ostringstream out;
  out << "# datasheet verification by coilspin: " << v.sheet.file
      << (v.sheet.label.empty() ? "" : " (" + v.sheet.label + ")") << ", rated " << ExactNumber(v.sheet.rated_voltage_V)
      << " V\n"
      << "# verdicts: pass, fail, inconclusive (the interval straddles a band edge), not-tested; "
         "guard bands per ISO 14253-1 / JCGM 106 at each result's confidence\n"
      << "result,label,confidence,line,unit,band_low,band_high,value,ci_low,ci_high,verdict,robust_z,note\n";
  for (std::size_t m = 0; m < v.motors.size(); ++m) {
    const verify::MotorCheck& motor = v.motors[m];
    for (std::size_t k = 0; k < motor.lines.size(); ++k) {
      const verify::LineCheck& c = motor.lines[k];
      const std::optional<double>& z = v.lot.lines[k].robust_z[m];
      out << Field(motor.result_file) << "," << Field(motor.label) << "," << ExactNumber(motor.confidence) << ","
          << c.key << "," << Field(c.unit) << "," << Number(c.line.band.low) << "," << Number(c.line.band.high) << ","
          << (c.value ? Number(*c.value) : "") << "," << (c.value ? Number(c.ci_low) : "") << ","
          << (c.value ? Number(c.ci_high) : "") << "," << verify::VerdictName(c.decision.verdict) << ","
          << (z ? Number(*z) : "") << "," << Field(LineNote(c, motor.confidence)) << "\n";
    }
  }
  return out.str();
}

}  // namespace coilspin::output
