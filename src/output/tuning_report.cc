#include "src/output/tuning_report.h"

#include <nlohmann/json.hpp>
#include <sstream>

#include "src/output/number_format.h"
#include "src/units/constants.h"

namespace coilspin::output {
namespace {

using Json = nlohmann::ordered_json;

double Hz(double rad_s) { return rad_s / units::kRadiansPerRevolution; }

Json GainJson(const tune::GainEstimate& g, const char* unit) {
  return {{"value", g.value}, {"unit", unit}, {"std_error", g.std_error}, {"ci", Json::array({g.ci_low, g.ci_high})}};
}

struct LoopWords {
  const char* kp_unit;
  const char* ki_unit;
  const char* rule;
  const char* default_rule;
};

const LoopWords kCurrentWords = {"V/A", "V/(A*s)", "pole-zero cancellation of L/R: kp = L*wc, ki = R*wc",
                                 "wc = 5/tau_e (tau_e = L/R)"};
const LoopWords kSpeedWords = {
    "A*s/rad", "A/rad",
    "SIMC (Skogestad 2003) on Kt/(J*s + B) with the closed current loop as a lag 1/wc, half rule: "
    "theta = 1/(2*wc), kp = (J + B*theta)/(Kt*(1/ws + theta)), ki = kp/min(J/B + theta, 4*(1/ws + theta))",
    "ws = wc/10"};

Json LoopJson(const tune::LoopTuning& loop, const LoopWords& words) {
  Json j;
  j["kp"] = GainJson(loop.kp, words.kp_unit);
  j["ki"] = GainJson(loop.ki, words.ki_unit);
  j["bandwidth_hz"] = Hz(loop.bandwidth_rad_s);
  j["bandwidth_basis"] = loop.bandwidth_given ? std::string("given") : std::string("default: ") + words.default_rule;
  j["crossover_hz"] = loop.margin ? Json(Hz(loop.margin->crossover_rad_s)) : Json(nullptr);
  j["phase_margin_deg"] = loop.margin ? Json(loop.margin->phase_margin_deg) : Json(nullptr);
  j["rule"] = words.rule;
  return j;
}

std::vector<std::string> Assumptions(const std::vector<std::string>& taken_as_zero) {
  std::vector<std::string> notes = {
      "parallel form u = kp*e + ki*integral(e); the current loop commands voltage, the speed loop current",
      "no sampling, computation or PWM delay is modelled: each costs phase w*T_delay at the crossover",
      "Coulomb friction and brush drop are constant disturbances here; the integral terms remove them"};
  for (const auto& key : taken_as_zero) notes.push_back(key + " not determined by the fit: taken as 0");
  return notes;
}

void LoopText(std::ostringstream& out, const char* title, const tune::LoopTuning& loop, const LoopWords& words,
              double confidence) {
  const auto gain = [&](const char* name, const tune::GainEstimate& g, const char* unit) {
    out << "  " << name << " = " << FormatValue(g.value, g.std_error) << " " << unit << "   "
        << ShortNumber(100.0 * confidence, 4) << " % interval [" << FormatValue(g.ci_low, g.std_error) << ", "
        << FormatValue(g.ci_high, g.std_error) << "]\n";
  };
  out << title << ": bandwidth " << ShortNumber(Hz(loop.bandwidth_rad_s), 4) << " Hz ("
      << (loop.bandwidth_given ? std::string("given") : std::string("default: ") + words.default_rule) << ")\n";
  gain("kp", loop.kp, words.kp_unit);
  gain("ki", loop.ki, words.ki_unit);
  if (loop.margin)
    out << "  phase margin " << ShortNumber(loop.margin->phase_margin_deg, 3) << " deg at crossover "
        << ShortNumber(Hz(loop.margin->crossover_rad_s), 4) << " Hz\n";
  else
    out << "  phase margin: no gain crossover found\n";
  out << "  rule: " << words.rule << "\n";
}

}  // namespace

std::string TuningJson(const tune::Tuning& t, const std::vector<std::string>& taken_as_zero,
                       const ExportSource& source) {
  Json j;
  j["format"] = kTuningFormat;
  j["source"] = SourceJson(source);
  j["confidence"] = t.confidence;
  j["current_loop"] = LoopJson(t.current, kCurrentWords);
  j["speed_loop"] = LoopJson(t.speed, kSpeedWords);
  j["assumptions"] = Assumptions(taken_as_zero);
  return j.dump(2) + "\n";
}

std::string TuningText(const tune::Tuning& t, const std::vector<std::string>& taken_as_zero,
                       const ExportSource& source) {
  std::ostringstream out;
  out << "coilspin tune" << (source.motor_label.empty() ? "" : " of " + source.motor_label) << " — PI gains, "
      << "u = kp*e + ki*integral(e)\n\n";
  LoopText(out, "current loop (voltage from current error)", t.current, kCurrentWords, t.confidence);
  out << "\n";
  LoopText(out, "speed loop (current from speed error)", t.speed, kSpeedWords, t.confidence);
  out << "\nassumptions\n";
  for (const auto& a : Assumptions(taken_as_zero)) out << "  " << a << "\n";
  return out.str();
}

}  // namespace coilspin::output
