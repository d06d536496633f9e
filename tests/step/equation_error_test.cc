// The equation-error start of the step fit, on its own: on a noise-free step it
// recovers the parameters the simulator was given (the integral form has no
// derivative to approximate; what remains is the trapezoidal rule's error, of
// order (Δ/τ_e)², with Δ = τ_e/20 here), and with bench noise it stays close
// enough to start the output-error fit.

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "fitters/step/equation_error.h"
#include "src/ingest/segmentation.h"
#include "step/step_bench.h"

namespace coilspin::step {
namespace {

struct Case {
  model::MotorParameters motor;
  BenchLog log;
};

std::optional<EquationErrorStart> StartOf(const BenchLog& log, double brush_drop_V, std::string* why) {
  StepSignals s;
  s.time_s = &log.time_s;
  s.voltage_V = &log.voltage_V;
  s.current_A = &log.current_A;
  s.speed_rad_s = &log.speed_rad_s;
  s.brush_drop_V = brush_drop_V;
  s.speed_noise_rad_s = NoiseFromDifferences(log.speed_rad_s);
  return EstimateStepStart(s, why);
}

// Friction deceleration at speed ω: b·ω + c. The start takes b = 0 (equation_error.h:
// b and c are nearly collinear in a step) and c then carries the friction at the
// run's speeds; at the settled speed the sum is what the run pins down. The
// Kt/J tolerance allows for the b = 0 assumption: b/(Kt·Ke/(R·J)) is 0.3 % and
// 0.5 % for the two motors here.
double FrictionDeceleration(double b, double c, double speed_rad_s) { return b * speed_rad_s + c; }

void ExpectClose(const EquationErrorStart& e, const model::MotorParameters& m, double tolerance, double top_speed) {
  const double j = m.inertia_kg_m2;
  const double b = m.viscous_friction_N_m_s_per_rad / j, c = m.coulomb_friction_N_m / j;
  EXPECT_NEAR(FrictionDeceleration(e.viscous_over_inertia, e.coulomb_over_inertia, top_speed) /
                  FrictionDeceleration(b, c, top_speed), 1.0, 2.0 * tolerance);
  EXPECT_NEAR(e.resistance_ohm / m.resistance_ohm, 1.0, tolerance);
  EXPECT_NEAR(e.inductance_H / m.inductance_H, 1.0, tolerance);
  EXPECT_NEAR(e.back_emf / m.back_emf_constant_V_s_per_rad, 1.0, tolerance);
  EXPECT_NEAR(e.torque_over_inertia / (m.torque_constant_N_m_per_A / j), 1.0, tolerance);
}

TEST(EquationErrorStart, RecoversANoiseFreeStep) {
  for (const auto& motor : {testing::SmallMotor(), testing::ServoMotor()}) {
    model::MotorParameters m = motor;
    m.brush_drop_V = 0.6;
    const BenchLog log =
        testing::ToBenchLog(model::SimulateStep(m, testing::StepFromRest(m, 12.0, false), {}), "step");
    std::string why;
    const auto start = StartOf(log, m.brush_drop_V, &why);
    ASSERT_TRUE(start) << why;
    ExpectClose(*start, m, 0.01, log.speed_rad_s.back());
  }
}

TEST(EquationErrorStart, StaysCloseWithBenchNoise) {
  const model::MotorParameters m = testing::ServoMotor();
  model::BenchConditions bench = testing::StepNoise(3, false);
  bench.supply_resistance_ohm = 0.1;  // the logged terminal voltage sags with the current
  const BenchLog log = testing::ToBenchLog(model::SimulateStep(m, testing::StepFromRest(m, 12.0, false), bench), "s");
  std::string why;
  const auto start = StartOf(log, 0.0, &why);
  ASSERT_TRUE(start) << why;
  ExpectClose(*start, m, 0.1, log.speed_rad_s.back());
}

TEST(EquationErrorStart, SaysWhyWhenTheRotorNeverTurns) {
  model::MotorParameters m = testing::ServoMotor();
  m.coulomb_friction_N_m = 1.0;  // far above Kt·V/R: stiction holds the rotor
  const BenchLog log = testing::ToBenchLog(model::SimulateStep(m, testing::StepFromRest(m, 12.0, false), {}), "s");
  std::string why;
  EXPECT_FALSE(StartOf(log, 0.0, &why));
  EXPECT_NE(why.find("hardly turns"), std::string::npos) << why;
}

}  // namespace
}  // namespace coilspin::step
