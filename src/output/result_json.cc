#include "src/output/result_json.h"

#include <nlohmann/json.hpp>
#include <regex>

#include "src/result/parameter_covariance.h"

namespace coilspin::output {
namespace {

using Json = nlohmann::ordered_json;

Json QuantityJson(const QuantityEstimate& q) {
  Json j;
  j["symbol"] = q.symbol;
  j["unit"] = q.unit;
  j["value"] = q.value;
  j["std_error"] = q.std_error;
  j["ci"] = Json::array({q.ci_low, q.ci_high});
  j["degrees_of_freedom"] = q.degrees_of_freedom;
  j["tests"] = q.tests;
  if (!q.basis.empty()) j["basis"] = q.basis;
  if (q.at_voltage_V) j["at_voltage"] = *q.at_voltage_V;
  if (q.at_temperature_degC) j["at_temperature_degC"] = *q.at_temperature_degC;
  if (!q.note.empty()) j["note"] = q.note;
  if (!q.assumes.empty()) j["assumes"] = q.assumes;
  return j;
}

Json QuantitiesJson(const std::vector<QuantityEstimate>& quantities) {
  Json j = Json::object();
  for (const auto& q : quantities) j[q.key] = QuantityJson(q);
  return j;
}

Json TestJson(const TestSummary& t) {
  Json j;
  j["kind"] = t.kind;
  j["file"] = t.file;
  j["samples"] = t.samples;
  j["method"] = t.method;
  Json rms = Json::object(), sigma = Json::object(), lag1 = Json::object(), used = Json::object();
  for (const auto& r : t.residuals) {
    rms[r.channel] = r.rms;
    sigma[r.channel] = r.sigma;
    lag1[r.channel] = r.lag1_autocorrelation;
    used[r.channel] = r.samples;
  }
  j["rms_residual"] = rms;
  j["noise_sigma"] = sigma;
  j["residual_lag1_autocorrelation"] = lag1;
  j["residuals_used"] = used;
  Json share = Json::object();
  for (const auto& [key, value] : t.information_share) share[key] = value;
  j["information_share"] = share;
  Json set_aside = Json::object();
  for (const auto& [channel, lines] : t.set_aside) set_aside[channel] = {{"count", lines.size()}, {"lines", lines}};
  j["set_aside"] = set_aside;
  j["contributed"] = t.contributed;
  j["warnings"] = t.warnings;
  return j;
}

Json MatrixJson(const result::NamedMatrix& m) { return {{"names", m.names}, {"matrix", m.matrix}}; }

// A setting is held as text; one that reads as a JSON number (RFC 8259, 6) is
// written as that number.
Json SettingJson(const std::string& text) {
  static const std::regex number(R"(-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?)");
  if (std::regex_match(text, number)) return Json::parse(text);
  return text;
}

std::string Document(const MotorEstimate& e, const Json* verification) {
  Json j;
  j["format"] = kResultFormat;
  if (!e.motor_label.empty()) j["motor"] = {{"label", e.motor_label}};
  j["confidence"] = e.confidence;
  Json intervals = {{"method", e.intervals.method}, {"robust_loss", e.intervals.robust_loss}};
  if (e.intervals.method == "bootstrap")
    intervals.update({{"replicates", e.intervals.replicates},
                      {"failed_replicates", e.intervals.failed_replicates},
                      {"seed", e.intervals.seed}});
  intervals["notes"] = e.intervals.notes;
  j["intervals"] = intervals;
  j["parameters"] = QuantitiesJson(e.parameters);
  Json missing = Json::object();
  for (const auto& [key, reason] : e.not_identified) missing[key] = reason;
  j["not_identified"] = missing;
  j["ratios"] = QuantitiesJson(e.ratios);
  j["covariance"] = MatrixJson(result::FullCovariance(e));
  j["correlation"] = MatrixJson(result::FullCorrelation(e));
  j["derived"] = QuantitiesJson(e.derived);
  j["sensor_offsets"] = QuantitiesJson(e.sensor_offsets);
  if (e.torque_speed) {
    Json points = Json::array();
    for (const auto& p : e.torque_speed->points)
      points.push_back({{"speed", p.speed_rad_s}, {"torque", p.torque_N_m}, {"ci", Json::array({p.ci_low, p.ci_high})}});
    j["torque_speed"] = {{"at_voltage", e.torque_speed->at_voltage_V},
                         {"speed_unit", "rad/s"},
                         {"torque_unit", "N*m"},
                         {"includes_friction", e.torque_speed->includes_friction},
                         {"points", points}};
  }
  if (e.consistency) {
    const Consistency& c = *e.consistency;
    Json k;
    k["kt_over_ke"] = c.kt_over_ke ? Json(*c.kt_over_ke) : Json(nullptr);
    k["ci"] = c.ci_low && c.ci_high ? Json::array({*c.ci_low, *c.ci_high}) : Json(nullptr);
    k["tolerance"] = c.tolerance;
    k["verdict"] = c.verdict;
    k["note"] = c.note;
    j["consistency"] = k;
  }
  Json tests = Json::array();
  for (const auto& t : e.tests) tests.push_back(TestJson(t));
  j["tests"] = tests;
  j["warnings"] = e.warnings;
  Json solver = Json::array();
  for (const auto& s : e.solver)
    solver.push_back({{"converged", s.converged}, {"termination", s.termination}, {"iterations", s.iterations},
                      {"initial_cost", s.initial_cost}, {"final_cost", s.final_cost}});
  j["solver"] = solver;
  if (verification) j["verification"] = *verification;
  Json settings = Json::object();
  for (const auto& [key, value] : e.settings) settings[key] = SettingJson(value);
  j["settings"] = settings;
  return j.dump(2) + "\n";
}

}  // namespace

std::string ResultJson(const MotorEstimate& e) { return Document(e, nullptr); }

std::string ResultJson(const MotorEstimate& e, const Json& verification) { return Document(e, &verification); }

}  // namespace coilspin::output
