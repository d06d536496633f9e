#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <vector>

#include "src/model/simulate_locked_rotor.h"

namespace coilspin::model {
namespace {

constexpr double kTorqueConstant_N_m_per_A = 0.045;
constexpr double kRoundingTolerance = 1e-12;

MotorParameters Motor() {
  MotorParameters motor;
  motor.resistance_ohm = 2.0;
  motor.inductance_H = 1e-3;
  motor.brush_drop_V = 0.5;
  motor.torque_constant_N_m_per_A = kTorqueConstant_N_m_per_A;
  return motor;
}

PlateauPlan TorquePlan() {
  PlateauPlan plan;
  plan.supply_levels_V = {2.0, 4.0, 6.0, -3.0, -6.0};
  plan.hold_s = 0.02;
  plan.sample_period_s = 1e-4;
  plan.log_torque = true;
  return plan;
}

// Least-squares slope of y on x through the origin: Σxy/Σx².
double SlopeThroughOrigin(const std::vector<double>& x, const std::vector<double>& y) {
  double xy = 0.0, xx = 0.0;
  for (std::size_t k = 0; k < x.size(); ++k) {
    xy += x[k] * y[k];
    xx += x[k] * x[k];
  }
  return xy / xx;
}

TEST(LockedRotorTorque, TheLoadCellReadsKtTimesTheCurrent) {
  // physics (J·dω/dt = Kt·i − … with the shaft held): the load cell takes τ = Kt·i
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), TorquePlan(), BenchConditions{});
  ASSERT_EQ(log.torque_N_m.size(), log.time_s.size());
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    EXPECT_NEAR(log.torque_N_m[k], kTorqueConstant_N_m_per_A * log.current_A[k], kRoundingTolerance) << k;
  }
  EXPECT_NEAR(SlopeThroughOrigin(log.current_A, log.torque_N_m), kTorqueConstant_N_m_per_A,
              kRoundingTolerance * kTorqueConstant_N_m_per_A);
}

TEST(LockedRotorTorque, NoisySlopeIsKtWithinItsStandardError) {
  // common practice (least squares through the origin): the slope's standard error is
  // σ_τ/√Σi²; a fixed seed, a 4-SE band
  BenchConditions bench;
  bench.torque_noise_sigma_N_m = 2e-3;
  bench.seed = 5;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), TorquePlan(), bench);
  double sum_squares_A2 = 0.0;
  for (double i_A : log.current_A) sum_squares_A2 += i_A * i_A;
  const double standard_error = bench.torque_noise_sigma_N_m / std::sqrt(sum_squares_A2);
  const double slope = SlopeThroughOrigin(log.current_A, log.torque_N_m);
  EXPECT_NEAR(slope, kTorqueConstant_N_m_per_A, 4.0 * standard_error);
  EXPECT_GT(std::abs(slope - kTorqueConstant_N_m_per_A), 0.0) << "the noise is there";
}

TEST(LockedRotorTorque, TorqueColumnLeavesTheOtherChannelsAsTheyWere) {
  // noise streams per channel (src/model/noise_streams.h): asking for torque changes nothing else
  BenchConditions bench;
  bench.voltage_noise_sigma_V = 0.01;
  bench.current_noise_sigma_A = 0.003;
  bench.torque_noise_sigma_N_m = 1e-3;
  PlateauPlan without = TorquePlan();
  without.log_torque = false;
  const SampledLog plain = SimulateLockedRotorPlateaus(Motor(), without, bench);
  const SampledLog with = SimulateLockedRotorPlateaus(Motor(), TorquePlan(), bench);
  EXPECT_TRUE(plain.torque_N_m.empty());
  EXPECT_EQ(plain.voltage_V, with.voltage_V);
  EXPECT_EQ(plain.current_A, with.current_A);
}

TEST(LockedRotorTorque, RejectsATorqueColumnWithoutKt) {
  // common practice: a load cell on a motor without Kt is a usage error, not a column of zeros
  MotorParameters motor = Motor();
  motor.torque_constant_N_m_per_A = 0.0;
  EXPECT_THROW(SimulateLockedRotorPlateaus(motor, TorquePlan(), BenchConditions{}), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model
