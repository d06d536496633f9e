// The locked-rotor fitter recovers known R, L (and Vb) from simulated benches
// with noise, ADC quantisation and a supply with internal resistance. The
// truth comes from the forward model (src/model), which is itself checked
// against SciPy's solve_ivp in tests/model. Seeds are fixed: the same run
// every time.

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"

namespace coilspin::locked_rotor {
namespace {

struct BenchCase {
  std::string name;
  double resistance_ohm;
  double inductance_H;
  double brush_drop_V;
  double supply_resistance_ohm;
  std::uint64_t seed;
};

// Tolerances the issue sets for the locked-rotor fitter.
constexpr double kResistanceTolerance = 0.01;
constexpr double kInductanceTolerance = 0.03;

void PrintTo(const BenchCase& c, std::ostream* os) { *os << c.name; }

class LockedRotorRecovery : public ::testing::TestWithParam<BenchCase> {};

TEST_P(LockedRotorRecovery, RecoversResistanceAndInductanceWithHonestIntervals) {
  const BenchCase& c = GetParam();
  model::MotorParameters motor;
  motor.resistance_ohm = c.resistance_ohm;
  motor.inductance_H = c.inductance_H;
  motor.brush_drop_V = c.brush_drop_V;
  // Currents around 1 A: levels scale with R; noise like a 12-bit logger (common practice).
  const double full_scale_V = 2.0 * c.resistance_ohm + 1.0;
  model::BenchConditions bench;
  bench.supply_resistance_ohm = c.supply_resistance_ohm;
  bench.voltage_noise_sigma_V = 2e-4 * full_scale_V;
  bench.current_noise_sigma_A = 2e-3;
  bench.voltage_lsb_V = full_scale_V / 4096.0;
  bench.current_lsb_A = 4.0 / 4096.0;
  bench.seed = c.seed;

  model::PlateauPlan plateaus;
  for (double fraction : {0.25, 0.5, 0.75, 1.0, -0.4, -0.8}) plateaus.supply_levels_V.push_back(fraction * full_scale_V);
  plateaus.hold_s = 0.5;
  plateaus.sample_period_s = 1e-3;
  const BenchLog plateau_log =
      testing::ToBenchLog(model::SimulateLockedRotorPlateaus(motor, plateaus, bench), "plateaus.csv");

  model::StepPlan step;
  step.supply_before_V = 0.0;
  step.supply_after_V = full_scale_V;
  const double tau_s = c.inductance_H / (c.resistance_ohm + c.supply_resistance_ohm);
  step.sample_period_s = tau_s / 100.0;  // a scope resolving the rise (common practice: ≥ 10 samples per τ)
  step.before_s = 10 * tau_s;
  step.after_s = 10 * tau_s;
  // The scope: 8-bit vertical resolution over the channel's range, noise about one
  // step (common practice for oscilloscopes).
  const double step_current_A = full_scale_V / (c.resistance_ohm + c.supply_resistance_ohm);
  bench.voltage_lsb_V = 1.25 * full_scale_V / 256.0;
  bench.current_lsb_A = 1.25 * step_current_A / 256.0;
  bench.voltage_noise_sigma_V = bench.voltage_lsb_V;
  bench.current_noise_sigma_A = bench.current_lsb_A;
  bench.seed = c.seed + 1000;
  const BenchLog step_log = testing::ToBenchLog(model::SimulateLockedRotorStep(motor, step, bench), "step.csv");

  const MotorEstimate e = FitLockedRotor({&plateau_log, &step_log}, LockedRotorOptions{});
  const QuantityEstimate* r = e.Find("resistance");
  const QuantityEstimate* l = e.Find("inductance");
  ASSERT_NE(r, nullptr);
  ASSERT_NE(l, nullptr);
  EXPECT_NEAR(r->value, c.resistance_ohm, kResistanceTolerance * c.resistance_ohm);
  EXPECT_NEAR(l->value, c.inductance_H, kInductanceTolerance * c.inductance_H);
  EXPECT_LE(r->ci_low, c.resistance_ohm);
  EXPECT_GE(r->ci_high, c.resistance_ohm);
  EXPECT_LE(l->ci_low, c.inductance_H);
  EXPECT_GE(l->ci_high, c.inductance_H);
  EXPECT_EQ(e.Find("brush_drop") != nullptr, true);  // six plateaus at distinct levels separate Vb
  const QuantityEstimate* vb = e.Find("brush_drop");
  EXPECT_LE(vb->ci_low, c.brush_drop_V + 1e-12);
  EXPECT_GE(vb->ci_high, c.brush_drop_V - 1e-12);
}

INSTANTIATE_TEST_SUITE_P(
    Motors, LockedRotorRecovery,
    ::testing::Values(BenchCase{"half_ohm_100uH", 0.5, 0.1e-3, 0.0, 0.05, 11},
                      BenchCase{"2R2_1m5H", 2.2, 1.5e-3, 0.0, 0.3, 12},
                      BenchCase{"4R7_470uH_brushes", 4.7, 0.47e-3, 1.2, 0.2, 13},
                      BenchCase{"10_ohm_5mH", 10.0, 5e-3, 0.0, 0.5, 14},
                      BenchCase{"1R_2mH_brushes", 1.0, 2e-3, 0.6, 0.1, 15}),
    [](const auto& info) { return info.param.name; });

}  // namespace
}  // namespace coilspin::locked_rotor
