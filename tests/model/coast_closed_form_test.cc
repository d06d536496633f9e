#include "src/model/coast_closed_form.h"

#include <gtest/gtest.h>

#include <cmath>

namespace coilspin::model {
namespace {

constexpr double kRoundingTolerance = 1e-12;

// R, L, Ke, Kt, J, B, Tc, Vb (only J, B and Tc act while coasting open)
const MotorParameters kMotor{1.0, 1e-3, 0.05, 0.05, 4e-5, 2e-5, 3e-3, 0.0};

TEST(CoastClosedForm, SpeedAndStopTimeAreTheSolutionOfTheCoastOde) {
  // physics (references.md): ω(t) = (ω₀ + Tc/B)·e^(−t·B/J) − Tc/B, stopping at (J/B)·ln(1 + B·ω₀/Tc)
  const double w0 = 300.0;
  const double j = kMotor.inertia_kg_m2, b = kMotor.viscous_friction_N_m_s_per_rad, tc = kMotor.coulomb_friction_N_m;
  const double stop_s = j / b * std::log(1.0 + b * w0 / tc);
  EXPECT_NEAR(CoastStopTime_s(kMotor, w0), stop_s, kRoundingTolerance * stop_s);
  const double t_s = 0.4 * stop_s;
  EXPECT_NEAR(CoastSpeed_rad_s(kMotor, w0, t_s), (w0 + tc / b) * std::exp(-t_s * b / j) - tc / b,
              kRoundingTolerance * w0);
  EXPECT_EQ(CoastSpeed_rad_s(kMotor, w0, 1.01 * stop_s), 0.0);
  // physics: the ODE is odd in ω, so a reversed coast is the mirror image
  EXPECT_DOUBLE_EQ(CoastSpeed_rad_s(kMotor, -w0, t_s), -CoastSpeed_rad_s(kMotor, w0, t_s));
  EXPECT_DOUBLE_EQ(CoastStopTime_s(kMotor, -w0), CoastStopTime_s(kMotor, w0));
}

TEST(CoastClosedForm, WithoutViscousFrictionTheSpeedFallsLinearly) {
  // physics: B = 0 leaves J·dω/dt = −Tc: ω = ω₀ − (Tc/J)·t, stopping at J·ω₀/Tc
  MotorParameters motor = kMotor;
  motor.viscous_friction_N_m_s_per_rad = 0.0;
  const double w0 = 100.0, j = motor.inertia_kg_m2, tc = motor.coulomb_friction_N_m, t_s = 0.5;
  EXPECT_NEAR(CoastStopTime_s(motor, w0), j * w0 / tc, kRoundingTolerance);
  EXPECT_NEAR(CoastSpeed_rad_s(motor, w0, t_s), w0 - tc / j * t_s, kRoundingTolerance * w0);
  // physics (limit B → 0 of the exponential law): t_stop = (J·ω₀/Tc)·(1 − B·ω₀/(2·Tc) + …), so a
  // tiny B changes it by a relative B·ω₀/(2·Tc) ≈ 2e-11, and expm1/log1p keep those digits
  const double tiny_b = 1e-15;
  motor.viscous_friction_N_m_s_per_rad = tiny_b;
  const double first_order_s = j * w0 / tc * (1.0 - tiny_b * w0 / (2.0 * tc));
  EXPECT_NEAR(CoastStopTime_s(motor, w0), first_order_s, kRoundingTolerance * first_order_s);
  EXPECT_NEAR(CoastSpeed_rad_s(motor, w0, t_s), w0 - tc / j * t_s, 1e-9 * w0);
}

TEST(CoastClosedForm, WithoutCoulombFrictionTheRotorNeverStops) {
  // physics: Tc = 0 leaves ω₀·e^(−t·B/J), positive for every t
  MotorParameters motor = kMotor;
  motor.coulomb_friction_N_m = 0.0;
  const double w0 = 50.0, t_s = 2.0;
  const double rate_per_s = motor.viscous_friction_N_m_s_per_rad / motor.inertia_kg_m2;  // B/J
  EXPECT_TRUE(std::isinf(CoastStopTime_s(motor, w0)));
  EXPECT_NEAR(CoastSpeed_rad_s(motor, w0, t_s), w0 * std::exp(-t_s * rate_per_s), kRoundingTolerance * w0);
  EXPECT_EQ(CoastStopTime_s(motor, 0.0), 0.0);
}

}  // namespace
}  // namespace coilspin::model
