#include "fitters/joint/assumptions.h"

#include <algorithm>
#include <cmath>

#include "src/ingest/small_text_and_statistics.h"

namespace coilspin::joint {
namespace {

// A step's settled current and speed: the medians of its last tenth.
constexpr std::size_t kSettledDivisor = 10;

double SettledMedian(const std::vector<double>& x) {
  if (x.empty()) return 0.0;
  const std::size_t begin = x.size() - std::max<std::size_t>(1, x.size() / kSettledDivisor);
  return std::fabs(Median(std::vector<double>(x.begin() + static_cast<std::ptrdiff_t>(begin), x.end())));
}

QuantityEstimate* Find(MotorEstimate* e, const char* key) {
  for (auto& q : e->parameters)
    if (q.key == key) return &q;
  return nullptr;
}

// Parameters that cannot be negative (physics: dissipation, storage and the brush contact).
constexpr const char* kNonNegative[] = {"resistance", "inductance", "inertia", "viscous_friction", "coulomb_friction",
                                        "brush_drop"};

}  // namespace

void NoteBrushDropHeldAtZero(const locked_rotor::LockedRotorPlan& lr, const step::StepTestPlan& st,
                             MotorEstimate* estimate) {
  if (estimate->Find("brush_drop") != nullptr) return;  // determined: nothing assumed
  QuantityEstimate* r = Find(estimate, "resistance");
  if (r == nullptr) return;
  // dR/dVb = Σ|ī|/Σī² over the plateaus; else 1/i∞ of the first capture or step.
  double sum_abs = 0.0, sum_squares = 0.0;
  for (const auto& pl : lr.plateau_logs)
    for (const auto& p : pl.plateaus) {
      sum_abs += std::fabs(p.mean_current_A);
      sum_squares += p.mean_current_A * p.mean_current_A;
    }
  double per_volt_ohm = sum_squares > 0.0 ? sum_abs / sum_squares : 0.0;
  if (!(per_volt_ohm > 0.0) && !lr.step_logs.empty()) {
    const double settled = SettledMedian(lr.step_logs.front().log->current_A);
    if (settled > 0.0) per_volt_ohm = 1.0 / settled;
  }
  if (!(per_volt_ohm > 0.0) && !st.logs.empty()) {
    const double settled = SettledMedian(st.logs.front().log->current_A);
    if (settled > 0.0) per_volt_ohm = 1.0 / settled;
  }
  std::string text = "brush_drop = 0 V: no locked-rotor plateaus at 2 or more current levels separate Vb from R";
  if (per_volt_ohm > 0.0)
    text += "; on a brushed motor R reads high by " + Format("%.3g", per_volt_ohm) + " ohm per volt of brush drop";
  r->assumes.push_back(text);
  QuantityEstimate* ke = Find(estimate, "back_emf_constant");
  if (ke != nullptr && st.usable && !st.logs.empty()) {
    const double speed = SettledMedian(st.logs.front().speed_rad_s);
    std::string ke_text = "brush_drop = 0 V: the step cannot separate Vb from R and Ke";
    if (speed > 0.0)
      ke_text += "; Ke reads high by up to " + Format("%.3g", 1.0 / speed) + " V*s/rad per volt of brush drop";
    ke->assumes.push_back(ke_text);
  }
}

void NoteTorqueConstantTakenAsBackEmf(MotorEstimate* estimate) {
  const QuantityEstimate* kt = estimate->Find("torque_constant");
  if (kt == nullptr || kt->basis != "equal-to-Ke") return;
  for (auto& q : estimate->parameters) {
    if (q.key == "torque_constant")
      q.assumes.push_back("Kt = Ke in SI units, the ideal machine's power balance: no torque column measured Kt "
                          "(real motors differ by a few per cent, common practice)");
    if ((q.key == "inertia" || q.key == "viscous_friction" || q.key == "coulomb_friction") && q.basis != "given")
      q.assumes.push_back("Kt = Ke in SI units (" + q.symbol + " scales with the Kt used)");
  }
}

void CutIntervalsAtPhysicalBounds(MotorEstimate* estimate) {
  for (auto& q : estimate->parameters) {
    if (std::find(std::begin(kNonNegative), std::end(kNonNegative), q.key) == std::end(kNonNegative)) continue;
    if (!(q.ci_low < 0.0)) continue;
    q.ci_low = 0.0;
    q.note += std::string(q.note.empty() ? "" : "; ") + "interval cut at 0 (" + q.symbol + " cannot be negative)";
  }
}

}  // namespace coilspin::joint
