#include "src/verify/motor_check.h"

#include <algorithm>
#include <cmath>

#include "src/model/copper_resistance.h"
#include "src/model/derived_quantities.h"
#include "src/result/derived_intervals.h"
#include "src/result/parameter_covariance.h"

namespace coilspin::verify {
namespace {

const char* const kResistance = "resistance";
const char* const kTorqueConstant = "torque_constant";

// R (value, interval, standard error and its row and column of the covariance)
// scaled by `factor`, as the copper law carries it to another temperature: a
// linear map R' = c·R, so se' = c·se and Cov(R', x) = c·Cov(R, x).
void ScaleResistance(double factor, double to_degC, MotorEstimate* e) {
  for (QuantityEstimate& q : e->parameters) {
    if (q.key != kResistance) continue;
    q.value *= factor;
    q.std_error *= factor;
    q.ci_low *= factor;
    q.ci_high *= factor;
    q.at_temperature_degC = to_degC;
  }
  const auto it = std::find(e->correlation_names.begin(), e->correlation_names.end(), kResistance);
  if (it == e->correlation_names.end()) return;
  const std::size_t r = static_cast<std::size_t>(it - e->correlation_names.begin());
  for (std::size_t k = 0; k < e->covariance.size(); ++k) {
    e->covariance[r][k] *= factor;
    e->covariance[k][r] *= factor;  // the diagonal term is scaled twice: c²·Var(R)
  }
}

std::string ReasonFor(const MotorEstimate& e, const std::string& key) {
  for (const auto& [missing, reason] : e.not_identified)
    if (missing == key) return reason;
  return "";  // the result neither gives it nor says why
}

bool KtTiedToKe(const MotorEstimate& e) {
  const QuantityEstimate* kt = e.Find(kTorqueConstant);
  return kt && kt->basis == result::kTiedToKeBasis;
}

// The parameters a derived quantity uses (whether or not the estimate has them).
std::vector<std::string> UsesOf(const std::string& derived_key, double voltage_V) {
  model::ParameterValues every;
  for (const SpecKey& k : SpecKeys())
    if (k.source == KeySource::kParameter) every[std::string(k.key)] = 1.0;
  for (const model::DerivedFormula& f : model::DerivedFormulas(every, voltage_V))
    if (f.key == derived_key) return f.uses;
  return {};
}

void SetValue(const QuantityEstimate& q, LineCheck* check) {
  if (!std::isfinite(q.value) || !std::isfinite(q.ci_low) || !std::isfinite(q.ci_high)) {
    check->not_tested = LineCheck::NotTested::kNoInterval;
    return;
  }
  check->value = q.value;
  check->ci_low = std::min(q.ci_low, q.value);
  check->ci_high = std::max(q.ci_high, q.value);
  check->tests = q.tests;
  check->value_note = q.note;
}

void CheckParameter(const MotorEstimate& e, LineCheck* check) {
  const std::string key(check->line.spec->evaluated_as);
  const QuantityEstimate* q = e.Find(key);
  if (!q) {
    check->not_tested = LineCheck::NotTested::kNotDetermined;
    check->missing.push_back({key, ReasonFor(e, key)});
    return;
  }
  if (q->basis == result::kGivenBasis) {
    check->not_tested = LineCheck::NotTested::kGiven;
    check->missing.push_back({key, q->note});
    return;
  }
  SetValue(*q, check);
  check->rests_on_kt_equal_to_ke = key == kTorqueConstant && KtTiedToKe(e);
  if (check->rests_on_kt_equal_to_ke) check->value_note.clear();  // the flag says it
  if (key == kResistance) check->at_temperature_degC = q->at_temperature_degC;
}

void CheckDerived(const MotorEstimate& e, double voltage_V, LineCheck* check) {
  const std::string key(check->line.spec->evaluated_as);
  const std::vector<std::string> uses = UsesOf(key, voltage_V);
  for (const std::string& parameter : uses) {
    if (!e.Find(parameter)) check->missing.push_back({parameter, ReasonFor(e, parameter)});
  }
  if (check->missing.empty() && e.covariance.size() != e.correlation_names.size()) {
    check->not_tested = LineCheck::NotTested::kNoInterval;  // no covariance to propagate
    return;
  }
  std::optional<QuantityEstimate> q;
  if (check->missing.empty()) {
    for (const model::DerivedFormula& f : model::DerivedFormulas(result::ValuesOf(e), voltage_V))
      if (f.key == key) q = result::DeriveWithInterval(f, e, voltage_V);
  }
  if (!q) {
    check->not_tested = LineCheck::NotTested::kNotDetermined;
    return;
  }
  SetValue(*q, check);
  check->at_voltage_V = q->at_voltage_V;
  check->rests_on_kt_equal_to_ke =
      KtTiedToKe(e) && std::find(uses.begin(), uses.end(), kTorqueConstant) != uses.end();
}

int Severity(Verdict v) {
  switch (v) {
    case Verdict::kFail:
      return 3;
    case Verdict::kInconclusive:
      return 2;
    case Verdict::kNotTested:
      return 1;
    case Verdict::kPass:
      break;
  }
  return 0;
}

}  // namespace

Verdict MotorCheck::Worst() const {
  Verdict worst = Verdict::kPass;
  for (const LineCheck& l : lines)
    if (Severity(l.decision.verdict) > Severity(worst)) worst = l.decision.verdict;
  return worst;
}

MotorCheck CheckMotor(const Datasheet& sheet, const MotorEstimate& estimate, const std::string& result_file) {
  MotorEstimate e = estimate;
  bool temperature_unknown = false;
  if (sheet.reference_temperature_degC) {
    const QuantityEstimate* r = e.Find(kResistance);
    if (r && r->at_temperature_degC) {
      const double factor = model::CopperResistanceAt(1.0, *r->at_temperature_degC, *sheet.reference_temperature_degC);
      ScaleResistance(factor, *sheet.reference_temperature_degC, &e);
    } else if (r) {
      temperature_unknown = true;
    }
  }
  MotorCheck motor;
  motor.result_file = result_file;
  motor.label = e.motor_label;
  motor.confidence = e.confidence;
  for (const SpecLine& line : sheet.lines) {
    LineCheck check;
    check.line = line;
    check.key = line.key;
    check.unit = std::string(units::SiUnitOf(line.spec->dimension));
    if (line.spec->source == KeySource::kParameter) {
      CheckParameter(e, &check);
    } else {
      CheckDerived(e, sheet.rated_voltage_V, &check);
    }
    if (check.key == kResistance) check.temperature_unknown = temperature_unknown;
    if (check.value) {
      check.decision = Decide(line.band, *check.value, check.ci_low, check.ci_high);
    } else {
      check.decision.verdict = Verdict::kNotTested;
    }
    motor.lines.push_back(std::move(check));
  }
  return motor;
}

bool AllPass(const std::vector<MotorCheck>& motors) {
  return std::all_of(motors.begin(), motors.end(), [](const MotorCheck& m) { return m.Worst() == Verdict::kPass; });
}

}  // namespace coilspin::verify
