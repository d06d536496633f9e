#include "src/output/verification_json.h"

#include <cmath>

#include "src/output/verification_notes.h"

namespace coilspin::output {
namespace {

using Json = nlohmann::ordered_json;

Json Number(double x) { return std::isfinite(x) ? Json(x) : Json(nullptr); }

Json DatasheetJson(const verify::Datasheet& sheet) {
  Json j = {{"file", sheet.file}, {"label", sheet.label}, {"rated_voltage", sheet.rated_voltage_V}};
  if (sheet.reference_temperature_degC) j["reference_temperature_degC"] = *sheet.reference_temperature_degC;
  return j;
}

Json ExplanationJson(const verify::Explanation& e, const verify::Datasheet& sheet) {
  Json j = {{"line", e.line}, {"cause", verify::CauseName(e.cause)}};
  using Cause = verify::Explanation::Cause;
  if (e.cause == Cause::kAnotherVoltage) {
    j["at_voltage"] = e.voltage_V;
  } else {
    j["printed_over_meant"] = e.printed_over_meant;
  }
  if (e.cause == Cause::kUnitSlip) j["meant_unit"] = e.meant_unit;
  if (e.cause == Cause::kWindingConvention) j["convention"] = e.convention.name;
  j["whole_sheet"] = e.whole_sheet;
  j["text"] = ExplanationText(e, sheet);
  return j;
}

Json ConsistencyJson(const verify::Verification& v) {
  Json list = Json::array();
  for (const verify::RelationCheck& c : v.consistency) {
    Json explained = Json::array();
    for (const verify::Explanation& e : c.explained_by) explained.push_back(ExplanationJson(e, v.sheet));
    list.push_back({{"relation", c.relation},
                    {"lines", c.lines},
                    {"stated", c.stated},
                    {"predicted", Number(c.predicted)},
                    {"predicted_range", Json::array({Number(c.predicted_low), Number(c.predicted_high)})},
                    {"mismatch", Number(c.mismatch)},
                    {"verdict", c.consistent ? "consistent" : "inconsistent"},
                    {"note", RelationNote(c, v.sheet)},
                    {"explained_by", explained}});
  }
  return list;
}

Json LineJson(const verify::LineCheck& c, double confidence) {
  Json j;
  j["unit"] = c.unit;
  j["band"] = Json::array({Number(c.line.band.low), Number(c.line.band.high)});
  j["value"] = c.value ? Number(*c.value) : Json(nullptr);
  j["ci"] = c.value ? Json::array({Number(c.ci_low), Number(c.ci_high)}) : Json(nullptr);
  j["verdict"] = verify::VerdictName(c.decision.verdict);
  if (c.decision.verdict == verify::Verdict::kInconclusive) {
    j["narrowing_needed"] = c.decision.narrowing_needed;
    j["would_be"] = verify::VerdictName(c.decision.would_be);
  }
  j["tests"] = c.tests;
  if (c.at_voltage_V) j["at_voltage"] = *c.at_voltage_V;
  if (c.at_temperature_degC) j["at_temperature_degC"] = *c.at_temperature_degC;
  if (!c.missing.empty()) {
    Json missing = Json::object();
    for (const auto& [key, reason] : c.missing) missing[key] = reason;
    j["missing"] = missing;
  }
  j["note"] = LineNote(c, confidence);
  return j;
}

Json LinesJson(const verify::MotorCheck& m) {
  Json lines = Json::object();
  for (const verify::LineCheck& c : m.lines) lines[c.key] = LineJson(c, m.confidence);
  return lines;
}

Json LotJson(const verify::Verification& v) {
  const verify::Lot& lot = v.lot;
  Json lines = Json::object();
  for (const verify::LotLine& l : lot.lines) {
    Json z = Json::object();
    for (std::size_t m = 0; m < v.motors.size(); ++m)
      z[v.motors[m].result_file] = l.robust_z[m] ? Json(*l.robust_z[m]) : Json(nullptr);
    const bool measured = l.measured > 0;
    lines[l.key] = {{"unit", l.unit},
                    {"measured", l.measured},
                    {"mean", measured ? Number(l.mean) : Json(nullptr)},
                    {"std", measured ? Number(l.std) : Json(nullptr)},
                    {"min", measured ? Number(l.min) : Json(nullptr)},
                    {"max", measured ? Number(l.max) : Json(nullptr)},
                    {"cpk", l.cpk ? Number(*l.cpk) : Json(nullptr)},
                    {"robust_z", z},
                    {"outliers", l.outliers},
                    {"pass", l.pass},
                    {"fail", l.fail},
                    {"inconclusive", l.inconclusive},
                    {"not_tested", l.not_tested}};
  }
  return {{"motors", lot.motors},
          {"motors_passing", lot.motors_passing},
          {"pass", lot.pass},
          {"fail", lot.fail},
          {"inconclusive", lot.inconclusive},
          {"not_tested", lot.not_tested},
          {"lines", lines}};
}

}  // namespace

std::string VerificationJson(const verify::Verification& v) {
  Json j;
  j["format"] = kVerificationFormat;
  j["datasheet"] = DatasheetJson(v.sheet);
  j["datasheet_consistency"] = ConsistencyJson(v);
  Json motors = Json::array();
  for (const verify::MotorCheck& m : v.motors)
    motors.push_back({{"result", m.result_file}, {"label", m.label}, {"confidence", m.confidence},
                      {"verdict", verify::VerdictName(m.Worst())}, {"lines", LinesJson(m)}});
  j["motors"] = motors;
  j["lot"] = LotJson(v);
  return j.dump(2) + "\n";
}

Json ResultVerificationBlock(const verify::Verification& v) {
  Json j;
  j["datasheet"] = DatasheetJson(v.sheet);
  j["datasheet_consistency"] = ConsistencyJson(v);
  if (!v.motors.empty()) {
    j["verdict"] = verify::VerdictName(v.motors.front().Worst());
    j["lines"] = LinesJson(v.motors.front());
  }
  return j;
}

}  // namespace coilspin::output
