// The free-shaft step residual: zero at the truth on a noise-free log (the
// simulator integrates the same equations independently, by RK4 with exact
// switching events), and its automatic-differentiation Jacobian equal to a
// numerical one (central differences; Ceres' gradient-checker practice,
// style.md habit 9).

#include <gtest/gtest.h>

#include <ceres/jet.h>

#include <cmath>
#include <vector>

#include "fitters/step/step_residual.h"
#include "step/step_bench.h"

namespace coilspin::step {
namespace {

constexpr int kParameters = 10;  // R, L, Ke, Kt, J, B, Tc, Vb, i0, ω0
constexpr int kCurrentParameters = kParameters + 1;  // and i_z, the current sensor's zero reading

struct Log {
  BenchLog log;
  model::MotorParameters motor;
};

// With R_s = 0 the logged terminal voltage is the supply, held between
// samples: exactly the model's zero-order hold.
Log NoiseFree(double brush_drop_V) {
  Log l;
  l.motor = testing::ServoMotor();
  l.motor.brush_drop_V = brush_drop_V;
  model::FreeShaftStepPlan plan = testing::StepFromRest(l.motor, 12.0, false);
  l.log = testing::ToBenchLog(model::SimulateStep(l.motor, plan, {}), "step");
  return l;
}

std::vector<double> Truth(const model::MotorParameters& m) {
  return {m.resistance_ohm, m.inductance_H, m.back_emf_constant_V_s_per_rad, m.torque_constant_N_m_per_A,
          m.inertia_kg_m2,  m.viscous_friction_N_m_s_per_rad, m.coulomb_friction_N_m, m.brush_drop_V, 0.0, 0.0};
}

// The parameters a channel's functor reads: the current channel's end with i_z (0: no offset).
std::vector<double> ForChannel(std::vector<double> p, StepChannel channel, double zero_A = 0.0) {
  if (channel == StepChannel::kCurrent) p.push_back(zero_A);
  return p;
}

std::vector<double> Evaluate(const StepResidual& r, std::vector<double> p) {
  if (static_cast<int>(p.size()) < r.ParameterCount()) p = ForChannel(p, r.channel);
  std::vector<double> out(r.time_s->size());
  std::vector<const double*> pointers;
  for (const double& value : p) pointers.push_back(&value);
  r(pointers.data(), out.data());
  return out;
}

StepResidual ResidualOf(const BenchLog& log, StepChannel channel) {
  const std::vector<double>* measured = channel == StepChannel::kCurrent ? &log.current_A : &log.speed_rad_s;
  return StepResidual{&log.time_s, &log.voltage_V, measured, channel, false, 1.0, {}};
}

TEST(StepResidual, ZeroAtTheTruthOnANoiseFreeStep) {
  for (double brush_drop_V : {0.0, 0.9}) {
    const Log l = NoiseFree(brush_drop_V);
    const double peak_A = 12.0 / l.motor.resistance_ohm;
    const double top_speed = 12.0 / l.motor.back_emf_constant_V_s_per_rad;
    // Agreement to 1e-7 of full scale: the simulator's RK4 error (about 3e-9 per
    // time constant, src/model/free_shaft_dynamics.h) accumulated over the log.
    for (double r : Evaluate(ResidualOf(l.log, StepChannel::kCurrent), Truth(l.motor)))
      ASSERT_NEAR(r, 0.0, 1e-7 * peak_A) << "Vb " << brush_drop_V;
    for (double r : Evaluate(ResidualOf(l.log, StepChannel::kSpeed), Truth(l.motor)))
      ASSERT_NEAR(r, 0.0, 1e-7 * top_speed) << "Vb " << brush_drop_V;
  }
}

TEST(StepResidual, PositionIsTheIntegralOfTheModelledSpeed) {
  Log l = NoiseFree(0.5);
  model::FreeShaftStepPlan plan = testing::StepFromRest(l.motor, 12.0, true);
  const BenchLog log = testing::ToBenchLog(model::SimulateStep(l.motor, plan, {}), "step");
  StepResidual position{&log.time_s, &log.voltage_V, &log.position_rad, StepChannel::kPosition, false, 1.0, {}};
  std::vector<double> p = Truth(l.motor);
  p.push_back(0.0);  // θ0
  const double final_angle = std::fabs(log.position_rad.back());
  for (double r : Evaluate(position, p)) ASSERT_NEAR(r, 0.0, 1e-7 * final_angle);
}

TEST(StepResidual, JacobianMatchesCentralDifferences) {
  const Log l = NoiseFree(0.9);
  std::vector<double> at = Truth(l.motor);
  // Away from the truth, so residuals are not zero: every parameter moved by a few per cent.
  const double offsets[kParameters] = {1.04, 0.95, 1.03, 0.97, 1.05, 1.2, 0.9, 0.8, 0.0, 0.0};
  for (int j = 0; j < kParameters; ++j) at[j] *= offsets[j];
  at[8] = 0.01;  // i0 [A]
  using Jet = ceres::Jet<double, kCurrentParameters>;
  for (StepChannel channel : {StepChannel::kCurrent, StepChannel::kSpeed}) {
    const StepResidual r = ResidualOf(l.log, channel);
    const std::vector<double> here = ForChannel(at, channel, 0.02);  // i_z = 20 mA on the current channel
    const int count = static_cast<int>(here.size());
    std::vector<Jet> p(static_cast<std::size_t>(count));
    std::vector<const Jet*> pointers;
    for (int j = 0; j < count; ++j) {
      p[j] = Jet(here[j], j);
      pointers.push_back(&p[j]);
    }
    std::vector<Jet> automatic(l.log.size());
    r(pointers.data(), automatic.data());
    for (int j = 0; j < count; ++j) {
      if (j == 9) continue;  // ω0 is held at 0 from rest (its derivative crosses the stiction rule)
      const double h = 1e-6 * std::max(std::fabs(here[j]), 1e-6);
      std::vector<double> up = here, down = here;
      up[j] += h;
      down[j] -= h;
      const auto ru = Evaluate(r, up), rd = Evaluate(r, down);
      double scale = 0.0;
      for (std::size_t k = 0; k < automatic.size(); ++k) scale = std::max(scale, std::fabs(automatic[k].v[j]));
      for (std::size_t k = 0; k < automatic.size(); k += 13) {  // a spread of samples
        const double numerical = (ru[k] - rd[k]) / (2.0 * h);
        EXPECT_NEAR(automatic[k].v[j], numerical, 1e-5 * scale) << "parameter " << j << " sample " << k;
      }
    }
  }
}

}  // namespace
}  // namespace coilspin::step
