#include "src/output/verification_notes.h"

#include <cmath>

#include "src/output/number_format.h"

namespace coilspin::output {
namespace {

constexpr int kPercentDigits = 3;  // significant digits of percentages in notes
constexpr double kPercentPerUnit = 100.0;

std::string Joined(const std::vector<std::string>& items, const char* separator) {
  std::string text;
  for (const auto& item : items) text += (text.empty() ? "" : separator) + item;
  return text;
}

std::string UnitOf(const verify::SpecLine& line) { return line.unit.empty() ? "" : " " + line.unit; }

std::string Confidence(double confidence) { return ShortNumber(kPercentPerUnit * confidence, 4) + " %"; }

std::string Flags(const verify::LineCheck& c) {
  std::vector<std::string> flags;
  if (c.at_voltage_V) flags.push_back("evaluated at the rated " + ShortNumber(*c.at_voltage_V) + " V");
  if (c.at_temperature_degC) flags.push_back("R at " + ShortNumber(*c.at_temperature_degC) + " degC");
  if (c.temperature_unknown)
    flags.push_back("R compared as fitted: the result states no temperature for it, the sheet does");
  if (c.rests_on_kt_equal_to_ke) flags.push_back("rests on Kt taken equal to Ke (no torque was measured)");
  if (!c.value_note.empty()) flags.push_back(c.value_note);
  return flags.empty() ? "" : " (" + Joined(flags, "; ") + ")";
}

std::string Deciding(const verify::LineCheck& c) {
  const verify::Decision& d = c.decision;
  const verify::Band& band = c.line.band;
  const double value = *c.value;
  std::string edges;
  if (c.ci_low < band.low && value >= band.low) edges = "lower edge";
  if (c.ci_high > band.high && value <= band.high) edges += std::string(edges.empty() ? "" : " and the ") + "upper edge";
  if (edges.empty()) edges = value > band.high ? "upper edge" : "lower edge";
  std::string text = "the interval straddles the band's " + edges;
  if (!(d.narrowing_needed > 0.0)) {
    return text + "; the value lies on the edge, so no narrower interval decides it";
  }
  const double data_factor = 1.0 / (d.narrowing_needed * d.narrowing_needed);
  text += "; it decides (" + std::string(verify::VerdictName(d.would_be)) + ") once the interval narrows to " +
          ShortNumber(kPercentPerUnit * d.narrowing_needed, kPercentDigits) +
          " % of its width about the same value, i.e. about " + ShortNumber(data_factor, 2) + " times the data";
  if (!c.tests.empty()) text += " (longer or repeated " + Joined(c.tests, ", ") + " logs)";
  if (c.rests_on_kt_equal_to_ke) text += "; a measured Kt (a torque column in a locked-rotor log) would replace the assumption Kt = Ke";
  return text;
}

}  // namespace

std::string InSheetUnit(double value_si, const verify::SpecLine& line, int significant) {
  if (!std::isfinite(value_si)) return value_si > 0 ? "inf" : "-inf";
  return ShortNumber(value_si / line.unit_factor_to_si, significant) + UnitOf(line);
}

std::string BandInSheetUnit(const verify::SpecLine& line) {
  const double f = line.unit_factor_to_si;
  const verify::Band& b = line.band;
  if (b.HasLow() && b.HasHigh())
    return "[" + ShortNumber(b.low / f, 5) + ", " + ShortNumber(b.high / f, 5) + "]" + UnitOf(line);
  if (b.HasLow()) return ">= " + ShortNumber(b.low / f, 5) + UnitOf(line);
  return "<= " + ShortNumber(b.high / f, 5) + UnitOf(line);
}

std::string LineNote(const verify::LineCheck& c, double confidence) {
  using verify::LineCheck;
  switch (c.not_tested) {
    case LineCheck::NotTested::kNotDetermined: {
      std::vector<std::string> reasons;
      for (const auto& [key, reason] : c.missing)
        reasons.push_back(key + (reason.empty() ? " is not in the result" : ": " + reason));
      return "not determined by the given tests: " + Joined(reasons, "; ");
    }
    case LineCheck::NotTested::kGiven:
      return "given to the fit, not measured" +
             (c.missing.empty() || c.missing.front().second.empty() ? "" : " (" + c.missing.front().second + ")");
    case LineCheck::NotTested::kNoInterval:
      return "the result gives no finite value and interval for it";
    case LineCheck::NotTested::kNo:
      break;
  }
  const std::string interval = "the " + Confidence(confidence) + " interval";
  switch (c.decision.verdict) {
    case verify::Verdict::kPass:
      return interval + " lies inside the band" + Flags(c);
    case verify::Verdict::kFail:
      return interval + " lies entirely " + (c.ci_low > c.line.band.high ? "above" : "below") + " the band" + Flags(c);
    default:
      return Deciding(c) + Flags(c);
  }
}

std::string ExplanationText(const verify::Explanation& e, const verify::Datasheet& sheet) {
  using Cause = verify::Explanation::Cause;
  switch (e.cause) {
    case Cause::kUnitSlip:
      return e.line + " looks like a figure in " + e.meant_unit + " written as " + e.written_unit +
             " (printed " + ShortNumber(e.printed_over_meant, 4) + " times what it should be)";
    case Cause::kDecimalSlip:
      return e.line + " looks off by a decimal slip of 10^" + std::to_string(e.decimal_exponent) +
             " (a misplaced decimal point or SI prefix)";
    case Cause::kWindingConvention:
      return e.line + " matches a brushless winding convention, Kt/Ke = " + e.convention.name + ": " +
             e.convention.explanation;
    case Cause::kAnotherVoltage:
      break;
  }
  return e.line + " fits a rated voltage of " + ShortNumber(e.voltage_V) + " V, not the sheet's " +
         ShortNumber(sheet.rated_voltage_V) + " V: it looks printed for another voltage";
}

std::string RelationNote(const verify::RelationCheck& c, const verify::Datasheet& sheet) {
  const verify::SpecLine& stated = *sheet.Find(c.lines.front());
  const std::string predicted = "the sheet's other lines give " + InSheetUnit(c.predicted_low, stated, 4) + " to " +
                                InSheetUnit(c.predicted_high, stated, 4) + " within their tolerances";
  const std::string against = " against the stated " + BandInSheetUnit(stated);
  if (c.consistent) return predicted + against + ": they agree";
  std::string text = predicted + against + ": no figures within the tolerances satisfy it (mismatch " +
                     ShortNumber(kPercentPerUnit * c.mismatch, kPercentDigits) + " %)";
  if (c.explained_by.empty()) return text + "; no single line explains it by a known cause";
  std::vector<std::string> each;
  for (const verify::Explanation& e : c.explained_by) each.push_back(ExplanationText(e, sheet));
  if (!c.explained_by.front().whole_sheet) {
    return text + ". No one line explains all the sheet's mismatches; this one could come from: " +
           Joined(each, "; or ");
  }
  if (each.size() == 1) return text + ". Explained by one line alone: " + each.front();
  return text + ". Each of these alone would explain it, nearest first: " + Joined(each, "; or ");
}

}  // namespace coilspin::output
