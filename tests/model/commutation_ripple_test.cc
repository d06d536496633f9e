// Commutation ripple (src/model/commutation_ripple.h): its amplitude, phase and
// frequency read back from simulated logs by a least-squares sine fit and a DFT,
// and where it applies (current; voltage only while the back-EMF drives it).

#include "src/model/commutation_ripple.h"

#include <gtest/gtest.h>

#include <Eigen/Dense>
#include <cmath>
#include <complex>
#include <cstddef>
#include <vector>

#include "src/model/simulate_locked_rotor.h"
#include "src/model/simulate_no_load.h"
#include "src/model/simulate_spin_down.h"
#include "src/units/constants.h"
#include "model/small_motor.h"

namespace coilspin::model {
namespace {

constexpr int kSegments = 7;
constexpr double kAmplitude = 0.015, kPhase_rad = 0.7;

MotorParameters Motor() { return SmallMotor(); }  // 6 V: about 190 rad/s, a ripple near 210 Hz

BenchConditions Rippled() {
  BenchConditions bench;
  bench.ripple = {kSegments, kAmplitude, kPhase_rad};
  return bench;
}

NoLoadPlan SettledLevel() {
  NoLoadPlan plan;
  plan.supply_levels_V = {6.0};
  plan.hold_s = 2.0;                  // about 45 τm: the tail below is settled to e^(−35)
  plan.sample_period_s = 1e-4;        // 10 kHz, far above twice the ripple frequency
  plan.shaft = ShaftChannels::kSpeedAndPosition;  // no encoder: the exact shaft angle
  return plan;
}

TEST(CommutationRipple, CurrentCarriesTheRippleOfItsOwnValueAtTheShaftAngle) {
  const SampledLog clean = SimulateNoLoad(Motor(), SettledLevel(), BenchConditions{});
  const SampledLog log = SimulateNoLoad(Motor(), SettledLevel(), Rippled());
  ASSERT_EQ(clean.current_A.size(), log.current_A.size());
  // definition: i_logged = i·(1 + a·cos(N·θ + φ0)); the supply-driven voltage is untouched
  for (std::size_t k = 0; k < log.current_A.size(); ++k) {
    const double factor = 1.0 + kAmplitude * std::cos(kSegments * log.position_rad[k] + kPhase_rad);
    ASSERT_NEAR(log.current_A[k], clean.current_A[k] * factor, 1e-15) << k;
  }
  EXPECT_EQ(log.voltage_V, clean.voltage_V);
  EXPECT_EQ(log.speed_rad_s, clean.speed_rad_s);  // measurement-level: the motor is not changed
}

TEST(CommutationRipple, SineFitAndDftRecoverAmplitudePhaseAndFrequency) {
  const SampledLog log = SimulateNoLoad(Motor(), SettledLevel(), Rippled());
  constexpr std::size_t kTail = 4096;  // the settled second half
  const std::size_t first = log.time_s.size() - kTail;
  // Least squares of i_k on [1, cos(N·θ_k), sin(N·θ_k)] (Eigen's QR): i0·(1 + a·cos(Nθ + φ0))
  // = i0 + i0·a·cos φ0·cos Nθ − i0·a·sin φ0·sin Nθ.
  Eigen::MatrixXd basis(kTail, 3);
  Eigen::VectorXd current(kTail);
  double mean_speed = 0.0;
  for (std::size_t j = 0; j < kTail; ++j) {
    const double angle = kSegments * log.position_rad[first + j];
    basis.row(static_cast<Eigen::Index>(j)) << 1.0, std::cos(angle), std::sin(angle);
    current(static_cast<Eigen::Index>(j)) = log.current_A[first + j];
    mean_speed += log.speed_rad_s[first + j] / kTail;
  }
  const Eigen::Vector3d c = basis.colPivHouseholderQr().solve(current);
  EXPECT_NEAR(std::hypot(c(1), c(2)) / c(0), kAmplitude, 1e-9);
  EXPECT_NEAR(std::atan2(-c(2), c(1)), kPhase_rad, 1e-7);
  // DFT (periodogram at the Fourier frequencies j/(n·Δ)): the peak lies within one bin of
  // N·ω/(2π), the segment rate (physics: N segments pass the brushes per turn).
  const double span_s = kTail * 1e-4;
  double best_power = 0.0, best_frequency_Hz = 0.0;
  for (std::size_t bin = 1; bin < kTail / 2; ++bin) {
    std::complex<double> sum = 0.0;
    for (std::size_t j = 0; j < kTail; ++j) {
      const double phase = -units::kRadiansPerRevolution * static_cast<double>(bin * j) / kTail;
      sum += (log.current_A[first + j] - c(0)) * std::polar(1.0, phase);
    }
    if (std::norm(sum) > best_power) {
      best_power = std::norm(sum);
      best_frequency_Hz = static_cast<double>(bin) / span_s;
    }
  }
  const double ripple_Hz = kSegments * mean_speed / units::kRadiansPerRevolution;
  EXPECT_GT(ripple_Hz, 100.0);  // a real ripple, not a bin near 0
  EXPECT_NEAR(best_frequency_Hz, ripple_Hz, 1.0 / span_s);
}

TEST(CommutationRipple, CoastVoltageRipplesAndTheRunVoltageDoesNot) {
  SpinDownPlan plan;
  plan.supply_V = 6.0;
  plan.run_s = 0.5;
  plan.coast_s = 0.5;
  plan.sample_period_s = 1e-4;
  plan.shaft = ShaftChannels::kSpeedAndPosition;
  const SampledLog clean = SimulateSpinDown(Motor(), plan, BenchConditions{});
  const SampledLog log = SimulateSpinDown(Motor(), plan, Rippled());
  const std::size_t off = static_cast<std::size_t>(std::llround(SpinDownPowerOffTime_s(plan) / plan.sample_period_s));
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    const double factor = 1.0 + kAmplitude * std::cos(kSegments * log.position_rad[k] + kPhase_rad);
    if (k < off) {
      ASSERT_EQ(log.voltage_V[k], clean.voltage_V[k]) << k;  // the supply drives the terminals
    } else {
      ASSERT_NEAR(log.voltage_V[k], clean.voltage_V[k] * factor, 1e-14) << k;  // v = Ke·ω·(1 + a·cos(Nθ + φ0))
    }
  }
  EXPECT_GT(clean.voltage_V[off], 1.0);  // the coast's back-EMF is there to ripple
}

TEST(CommutationRipple, LockedRotorLogsNoRipple) {
  // θ is constant with the rotor held: documented as no ripple (src/model/simulate_locked_rotor.h)
  PlateauPlan plan;
  plan.supply_levels_V = {1.0, 2.0};
  plan.hold_s = 0.1;
  MotorParameters motor = Motor();
  BenchConditions bench = Rippled();
  bench.current_noise_sigma_A = 1e-3;
  BenchConditions plain;
  plain.current_noise_sigma_A = 1e-3;
  EXPECT_EQ(SimulateLockedRotorPlateaus(motor, plan, bench).current_A,
            SimulateLockedRotorPlateaus(motor, plan, plain).current_A);
}

TEST(CommutationRipple, RejectsAnAmplitudeOfOneOrMore) {
  BenchConditions bench;
  bench.ripple = {kSegments, 1.0, 0.0};
  EXPECT_THROW(SimulateNoLoad(Motor(), SettledLevel(), bench), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model
