// Winding warm-up (src/model/winding_warm_up.h): the logged temperature and the
// resistance it sets, against the closed form θ_w(t) = θ_w0 + ΔT·(1 − e^(−t/τ_th))
// and the copper law, in a locked-rotor and a free-shaft log.

#include "src/model/winding_warm_up.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>

#include "src/model/copper_resistance.h"
#include "src/model/simulate_locked_rotor.h"
#include "src/model/simulate_no_load.h"
#include "src/model/simulate_step.h"
#include "model/small_motor.h"

namespace coilspin::model {
namespace {

constexpr double kStart_degC = 22.0, kRise_K = 20.0, kTimeConstant_s = 15.0;

BenchConditions Warming() {
  BenchConditions bench;
  bench.winding_temperature_degC = kStart_degC;
  bench.resistance_reference_temperature_degC = 25.0;
  bench.warm_up = {kRise_K, kTimeConstant_s};
  return bench;
}

// closed form: θ_w(t) = θ_w0 + ΔT·(1 − e^(−t/τ_th))
double ClosedForm_degC(double t_s) { return kStart_degC + kRise_K * (1.0 - std::exp(-t_s / kTimeConstant_s)); }

// L/R = 0.5 ms: settled within each 10 ms sample period of the locked-rotor test
MotorParameters Motor() {
  MotorParameters m = SmallMotor();  // R at 25 degC
  m.brush_drop_V = 0.4;
  return m;
}

TEST(WindingWarmUp, LockedRotorTemperatureAndCurrentFollowTheClosedForm) {
  PlateauPlan plan;
  plan.supply_levels_V = {4.0};
  plan.hold_s = 60.0;  // four thermal time constants
  plan.sample_period_s = 10e-3;
  plan.log_temperature = true;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), plan, Warming());
  ASSERT_EQ(log.temperature_degC.size(), 6000u);
  for (std::size_t k = 1; k < log.time_s.size(); ++k) {
    ASSERT_NEAR(log.temperature_degC[k], ClosedForm_degC(log.time_s[k]), 1e-12) << k;
    // R is held over [t_(k−1), t_k) at R(θ_w(t_(k−1))) (copper law, IEC 60028 constant), and
    // with L/R = Δ/20 the current has settled to (V − Vb)/R by t_k to e^(−20) ≈ 2e-9
    const double resistance_ohm = CopperResistanceAt(2.0, 25.0, ClosedForm_degC(log.time_s[k - 1]));
    ASSERT_NEAR(log.current_A[k] * resistance_ohm / (4.0 - 0.4), 1.0, 1e-8) << k;
  }
  // the warm-up is real: R rose by ΔT·(1 − e^(−4))/(234.5 + 22) ≈ 7.6 %
  EXPECT_GT(log.current_A[1] / log.current_A.back(), 1.07);
}

TEST(WindingWarmUp, AddsToTheHeatingPerPlateau) {
  PlateauPlan plan;
  plan.supply_levels_V = {2.0, 3.0, 4.0};
  plan.hold_s = 1.0;
  plan.sample_period_s = 1e-3;
  plan.log_temperature = true;
  BenchConditions bench = Warming();
  bench.heating_per_plateau_K = 0.5;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), plan, bench);
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    const double plateau = std::floor(static_cast<double>(k) / 1000.0);
    ASSERT_NEAR(log.temperature_degC[k], ClosedForm_degC(log.time_s[k]) + 0.5 * plateau, 1e-12) << k;
  }
}

TEST(WindingWarmUp, NoLoadSpeedFollowsTheWarmingResistance) {
  NoLoadPlan plan;
  plan.supply_levels_V = {6.0};
  plan.hold_s = 30.0;
  plan.sample_period_s = 1e-2;
  plan.log_temperature = true;
  const MotorParameters m = Motor();
  const SampledLog log = SimulateNoLoad(m, plan, Warming());
  // Settled no-load point (docs/methods.md §1) with R at θ_w(t): Kt·i = B·ω + Tc and
  // V − R·i − Vb = Ke·ω give ω = (V − Vb − R·Tc/Kt)/(Ke + R·B/Kt). Early in the warm-up R
  // rises by up to 0.5 % per second; the speed lags it by about the mechanical time constant
  // (44 ms) plus half a sample period, and depends on R weakly (d ln ω/d ln R ≈
  // −R·i/(V − Vb) ≈ −0.05): a quasi-static error of at most about 1.3e-5 relative.
  for (std::size_t k = 100; k < log.time_s.size(); k += 100) {
    ASSERT_NEAR(log.temperature_degC[k], ClosedForm_degC(log.time_s[k]), 1e-12) << k;
    const double r = CopperResistanceAt(m.resistance_ohm, 25.0, ClosedForm_degC(log.time_s[k]));
    const double kt = m.torque_constant_N_m_per_A;
    const double speed = (6.0 - 0.4 - r * m.coulomb_friction_N_m / kt) /
                         (m.back_emf_constant_V_s_per_rad + r * m.viscous_friction_N_m_s_per_rad / kt);
    ASSERT_NEAR(log.speed_rad_s[k] / speed, 1.0, 3e-5) << k;
  }
  EXPECT_LT(log.speed_rad_s.back(), log.speed_rad_s[100]);  // a warmer winding, a slower shaft
}

TEST(WindingWarmUp, StepTemperatureCountsTheUnloggedSettle) {
  // src/model/simulate_step.h: t keeps counting from the unlogged start; so does the warm-up
  FreeShaftStepPlan plan;
  plan.initial_supply_V = 3.0;
  plan.final_supply_V = 6.0;
  plan.settle_s = 2.0;
  plan.pre_step_s = 0.01;
  plan.hold_s = 0.5;
  plan.sample_period_s = 1e-4;
  plan.log_temperature = true;
  const SampledLog log = SimulateStep(Motor(), plan, Warming());
  EXPECT_NEAR(log.time_s.front(), 2.0, 1e-12);
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    ASSERT_NEAR(log.temperature_degC[k], ClosedForm_degC(log.time_s[k]), 1e-12) << k;
  }
}

TEST(WindingWarmUp, RejectsARiseWithoutATimeConstant) {
  BenchConditions bench = Warming();
  bench.warm_up.time_constant_s = 0.0;
  PlateauPlan plan;
  plan.supply_levels_V = {1.0};
  EXPECT_THROW(SimulateLockedRotorPlateaus(Motor(), plan, bench), std::invalid_argument);
  NoLoadPlan no_load;
  no_load.supply_levels_V = {1.0};
  EXPECT_THROW(SimulateNoLoad(Motor(), no_load, bench), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model
