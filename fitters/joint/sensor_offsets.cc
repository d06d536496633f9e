#include "fitters/joint/sensor_offsets.h"

#include <algorithm>
#include <cmath>

#include "fitters/core/estimate_from_fit.h"
#include "src/model/sensor_offsets.h"

namespace coilspin::joint {
namespace {

// i_z is solved in units of this fraction of the largest current logged: an offset is
// a few tenths of a per cent of a sensor's full scale (common practice).
constexpr double kZeroScaleOfPeak = 1e-3;

// The parameters whose residuals use a logged current directly (plateau means and
// sample-by-sample currents): R and Vb from locked-rotor and no-load plateaus, B and
// Tc from the no-load currents, L and the mechanics of a step through its current.
constexpr const char* kCurrentDependent[] = {"resistance", "brush_drop", "viscous_friction", "coulomb_friction",
                                             "inductance"};

}  // namespace

CurrentZero FindCurrentZero(const locked_rotor::LockedRotorPlan& lr, const spin_down::SpinDownPlan& sd,
                            const step::StepTestPlan& st, double peak_current_A, bool one_sensor) {
  CurrentZero zero;
  zero.one_sensor = one_sensor;
  if (!one_sensor) return zero;
  if (sd.shows_current_at_zero) {
    zero.sources.push_back("the spin-down's coast with open terminals");
    zero.start_A = sd.zero_current_start_A;
  }
  if (std::any_of(st.logs.begin(), st.logs.end(), [](const step::StepLog& s) { return s.from_rest; }))
    zero.sources.push_back("the rest before a free-shaft step from 0 V");
  if (lr.resistance_identified &&
      std::any_of(lr.step_logs.begin(), lr.step_logs.end(), [](const locked_rotor::StepLog& s) { return s.from_rest; }))
    zero.sources.push_back("the rest before a locked-rotor step capture from 0 V");
  zero.seen = !zero.sources.empty();
  zero.scale_A = std::max(std::fabs(zero.start_A), kZeroScaleOfPeak * peak_current_A);
  if (!(zero.scale_A > 0.0)) zero.scale_A = 1.0;
  return zero;
}

void AddCurrentZero(const CurrentZero& zero, core::SharedParameters* parameters) {
  parameters->Ensure({model::kCurrentOffsetKey, zero.seen ? zero.start_A : 0.0, zero.scale_A, {}, {}, !zero.seen});
}

void ReportCurrentZero(const CurrentZero& zero, const core::SharedParameters& parameters, const core::FitResult& fit,
                       MotorEstimate* estimate) {
  const std::vector<std::string> users = parameters.TestsFor(model::kCurrentOffsetKey);
  if (zero.seen && fit.usable && fit.IndexOf(model::kCurrentOffsetKey) >= 0) {
    QuantityEstimate q = core::ToQuantity(fit, model::kCurrentOffsetKey, "i_z", "A", users);
    q.key = "current";
    std::string from;
    for (const auto& s : zero.sources) from += (from.empty() ? "" : "; ") + s;
    q.note = "the current sensor's reading at zero current, seen in " + from +
             "; subtracted from every logged current of the session";
    estimate->sensor_offsets.push_back(q);
    return;
  }
  if (zero.seen) return;
  const std::string assumption =
      zero.one_sensor
          ? "the current sensor reads 0 A at zero current: no log shows the current at zero to measure its offset "
            "(a spin-down with the current logged, or a capture or step from 0 V, would)"
          : "each log's current sensor reads 0 A at zero current: the session says the logs' sensors differ, so an "
            "offset seen in one log cannot correct another (zero each sensor at open circuit before logging)";
  for (auto& q : estimate->parameters)
    if (std::find(std::begin(kCurrentDependent), std::end(kCurrentDependent), q.key) != std::end(kCurrentDependent))
      q.assumes.push_back(assumption);
}

}  // namespace coilspin::joint
