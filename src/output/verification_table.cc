#include "src/output/verification_table.h"

#include <filesystem>
#include <sstream>

#include "src/output/aligned_columns.h"
#include "src/output/number_format.h"
#include "src/output/verification_notes.h"

namespace coilspin::output {
namespace {

constexpr double kPercentPerUnit = 100.0;
constexpr int kStatisticDigits = 4;  // significant digits of lot statistics
// Digits of a value follow its interval's width over 4 (about two standard errors
// either side at 95 %; number_format.h shows two digits of the error).
constexpr double kInterval95Sigmas = 4.0;

std::string Title(const verify::Datasheet& sheet) {
  return "datasheet" + (sheet.label.empty() ? "" : " \"" + sheet.label + "\"") + " (" + sheet.file + "), rated " +
         ShortNumber(sheet.rated_voltage_V) + " V" +
         (sheet.reference_temperature_degC ? ", R at " + ShortNumber(*sheet.reference_temperature_degC) + " degC" : "");
}

void Consistency(std::ostringstream& out, const verify::Verification& v) {
  out << Title(v.sheet) << "\n";
  if (v.consistency.empty()) {
    out << "  the sheet's own lines: no relation of the motor model ties them together (nothing to check)\n";
    return;
  }
  out << "  the sheet's own lines against the motor model (within the stated tolerances)\n";
  for (const verify::RelationCheck& c : v.consistency) {
    out << "  " << (c.consistent ? "consistent    " : "INCONSISTENT  ") << c.relation << "\n";
    if (!c.consistent) out << "      " << RelationNote(c, v.sheet) << "\n";
  }
}

// "[4275, 4987.5]", ">= 70", "<= 0.5": the band in the sheet's unit, without it.
std::string BandNumbers(const verify::SpecLine& line) {
  const std::string band = BandInSheetUnit(line);
  const std::string unit = line.unit.empty() ? "" : " " + line.unit;
  return unit.empty() || band.size() < unit.size() ? band : band.substr(0, band.size() - unit.size());
}

std::string Verdict(const verify::LineCheck& c) {
  const std::string name(verify::VerdictName(c.decision.verdict));
  return c.decision.verdict == verify::Verdict::kFail ? "FAIL" : name;
}

void OneMotor(std::ostringstream& out, const verify::MotorCheck& m) {
  out << "\nverification of " << (m.label.empty() ? m.result_file : m.label + " (" + m.result_file + ")") << " — "
      << ShortNumber(kPercentPerUnit * m.confidence, 4)
      << " % intervals against the bands, guard bands per ISO 14253-1 / JCGM 106\n";
  std::vector<std::vector<std::string>> rows = {{"line", "value", "interval", "band", "unit", "verdict"}};
  for (const verify::LineCheck& c : m.lines) {
    std::vector<std::string> row = {c.key, "-", "-", BandNumbers(c.line), c.line.unit, Verdict(c)};
    if (c.value) {
      const double f = c.line.unit_factor_to_si;
      row[1] = FormatValue(*c.value / f, (c.ci_high - c.ci_low) / f / kInterval95Sigmas);
      row[2] = "[" + FormatValue(c.ci_low / f, (c.ci_high - c.ci_low) / f / kInterval95Sigmas) + ", " +
               FormatValue(c.ci_high / f, (c.ci_high - c.ci_low) / f / kInterval95Sigmas) + "]";
    }
    rows.push_back(row);
  }
  const std::string table = AlignedColumns(rows, "  ", {false, true});
  std::istringstream lines(table);
  std::string line;
  std::getline(lines, line);
  out << line << "\n";
  for (const verify::LineCheck& c : m.lines) {
    std::getline(lines, line);
    out << line << "\n";
    if (c.decision.verdict != verify::Verdict::kPass) out << "      " << LineNote(c, m.confidence) << "\n";
  }
}

std::string Stem(const std::string& file) { return std::filesystem::path(file).stem().string(); }

std::string Cell(verify::Verdict v) {
  switch (v) {
    case verify::Verdict::kPass:
      return "pass";
    case verify::Verdict::kFail:
      return "FAIL";
    case verify::Verdict::kInconclusive:
      return "inconcl.";
    case verify::Verdict::kNotTested:
      break;
  }
  return "-";
}

void Lot(std::ostringstream& out, const verify::Verification& v) {
  const verify::Lot& lot = v.lot;
  out << "\nlot of " << lot.motors << " motors — verdict per line (pass, FAIL, inconcl. = inconclusive, - = not tested)\n";
  std::vector<std::vector<std::string>> verdicts = {{"line"}};
  for (const verify::MotorCheck& m : v.motors) verdicts[0].push_back(Stem(m.result_file));
  for (std::size_t k = 0; k < lot.lines.size(); ++k) {
    std::vector<std::string> row = {lot.lines[k].key};
    for (const verify::MotorCheck& m : v.motors) row.push_back(Cell(m.lines[k].decision.verdict));
    verdicts.push_back(row);
  }
  out << AlignedColumns(verdicts, "  ");

  out << "\nline statistics over the measured motors (in the sheet's units; Cpk per ISO 22514-2 with the lot's s; "
         "outliers: |robust z| > 3.5, Iglewicz-Hoaglin)\n";
  std::vector<std::vector<std::string>> stats = {{"line", "band", "n", "mean", "std", "min", "max", "Cpk", "outliers"}};
  for (std::size_t k = 0; k < lot.lines.size(); ++k) {
    const verify::LotLine& l = lot.lines[k];
    const verify::SpecLine& sheet_line = v.motors.front().lines[k].line;
    std::vector<std::string> row = {l.key, BandInSheetUnit(sheet_line), std::to_string(l.measured)};
    if (l.measured > 0) {
      const double f = sheet_line.unit_factor_to_si;
      for (double x : {l.mean, l.std, l.min, l.max}) row.push_back(ShortNumber(x / f, kStatisticDigits));
      row.push_back(l.cpk ? ShortNumber(*l.cpk, 3) : "-");
      std::vector<std::string> names;
      for (const std::string& o : l.outliers) names.push_back(Stem(o));
      std::string joined;
      for (const auto& n : names) joined += (joined.empty() ? "" : ", ") + n;
      row.push_back(joined.empty() ? "none" : joined);
    } else {
      row.insert(row.end(), {"-", "-", "-", "-", "-", "-"});
    }
    stats.push_back(row);
  }
  out << AlignedColumns(stats, "  ", {false, false, true, true, true, true, true, true, false});

  bool any = false;
  for (std::size_t k = 0; k < lot.lines.size(); ++k) {
    const verify::LotLine& l = lot.lines[k];
    if (l.not_tested == lot.motors && lot.motors > 0) {
      if (!any) out << "\nwhy\n";
      any = true;
      out << "  " << l.key << ", on every motor: " << LineNote(v.motors.front().lines[k], v.motors.front().confidence)
          << "\n";
      continue;
    }
    for (const verify::MotorCheck& m : v.motors) {
      const verify::LineCheck& c = m.lines[k];
      if (c.decision.verdict == verify::Verdict::kPass) continue;
      if (!any) out << "\nwhy\n";
      any = true;
      out << "  " << l.key << ", " << Stem(m.result_file)
          << (c.value ? " (" + InSheetUnit(*c.value, c.line, 6) + ")" : "") << ": " << LineNote(c, m.confidence)
          << "\n";
    }
  }
  out << "\nmotors: " << lot.motors_passing << " of " << lot.motors << " pass every line; lines: " << lot.pass
      << " pass, " << lot.fail << " fail, " << lot.inconclusive << " inconclusive, " << lot.not_tested
      << " not tested\n";
  out << "results:";
  for (const verify::MotorCheck& m : v.motors)
    out << "\n  " << Stem(m.result_file) << " = " << m.result_file << (m.label.empty() ? "" : " (" + m.label + ")");
  out << "\n";
}

}  // namespace

std::string VerificationText(const verify::Verification& v) {
  std::ostringstream out;
  Consistency(out, v);
  if (v.motors.size() == 1) {
    OneMotor(out, v.motors.front());
  } else if (!v.motors.empty()) {
    Lot(out, v);
  }
  return out.str();
}

}  // namespace coilspin::output
