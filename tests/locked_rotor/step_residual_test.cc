// The step-capture residual: zero at the truth on a noise-free capture, and
// its automatic-differentiation Jacobian equal to a numerical one (central
// differences; Ceres' gradient-checker practice, style.md habit 9).

#include <gtest/gtest.h>

#include <ceres/jet.h>

#include <cmath>
#include <vector>

#include "fitters/locked_rotor/step_residual.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"

namespace coilspin::locked_rotor {
namespace {

constexpr int kParameters = 5;  // R, L, Vb, i0, i_z

struct Capture {
  BenchLog log;
  StepCurrentResidual residual;
};

Capture MakeCapture(double brush_drop_V) {
  model::MotorParameters m;
  m.resistance_ohm = 2.2;
  m.inductance_H = 1.5e-3;
  m.brush_drop_V = brush_drop_V;
  model::StepPlan plan;
  plan.supply_before_V = 0.0;
  plan.supply_after_V = 6.0;
  plan.before_s = 0.5e-3;
  plan.after_s = 6e-3;
  plan.sample_period_s = 10e-6;
  Capture c{testing::ToBenchLog(model::SimulateLockedRotorStep(m, plan, {}), "step"), {}};
  c.residual = StepCurrentResidual{&c.log.time_s, &c.log.voltage_V, &c.log.current_A, 1.0, {}};
  return c;
}

std::vector<double> Evaluate(const StepCurrentResidual& r, const double p[kParameters]) {
  std::vector<double> out(r.time_s->size());
  const double* pointers[kParameters] = {&p[0], &p[1], &p[2], &p[3], &p[4]};
  r(pointers, out.data());
  return out;
}

TEST(StepResidual, ZeroAtTheTruthOnANoiseFreeCapture) {
  // The simulator holds V_s between samples with R_s = 0, which is the model's
  // zero-order hold exactly (physics: the exact solution of a first-order ODE).
  const Capture c = MakeCapture(0.8);
  const double truth[kParameters] = {2.2, 1.5e-3, 0.8, 0.0, 0.0};
  for (double r : Evaluate(c.residual, truth)) EXPECT_NEAR(r, 0.0, 1e-9);
}

TEST(StepResidual, JacobianMatchesCentralDifferences) {
  const Capture c = MakeCapture(0.8);
  const double at[kParameters] = {2.0, 1.3e-3, 0.7, 0.01, 0.02};  // away from the truth: residuals non-zero
  using Jet = ceres::Jet<double, kParameters>;
  Jet p[kParameters];
  const Jet* pointers[kParameters];
  for (int j = 0; j < kParameters; ++j) {
    p[j] = Jet(at[j], j);
    pointers[j] = &p[j];
  }
  std::vector<Jet> automatic(c.log.size());
  c.residual(pointers, automatic.data());
  for (int j = 0; j < kParameters; ++j) {
    const double h = 1e-6 * std::max(std::fabs(at[j]), 1e-3);
    double up[kParameters], down[kParameters];
    std::copy(at, at + kParameters, up);
    std::copy(at, at + kParameters, down);
    up[j] += h;
    down[j] -= h;
    const auto ru = Evaluate(c.residual, up), rd = Evaluate(c.residual, down);
    for (std::size_t k = 0; k < automatic.size(); k += 37) {  // a spread of samples
      const double numerical = (ru[k] - rd[k]) / (2.0 * h);
      EXPECT_NEAR(automatic[k].v[j], numerical, 1e-6 * (std::fabs(numerical) + 1.0)) << "parameter " << j << " sample " << k;
    }
  }
}

}  // namespace
}  // namespace coilspin::locked_rotor
