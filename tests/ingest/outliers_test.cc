// Isolated outliers set aside at ingest (src/ingest/outliers.h): dropouts and
// spikes in noisy signals are found and repaired; the shapes a bench log
// really has — step edges, ramps, fast exponential rises, ripple, ADC steps,
// clean Gaussian noise — are left alone.

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "src/ingest/outliers.h"

namespace coilspin {
namespace {

std::vector<double> Noisy(std::size_t n, double sigma, unsigned seed, double (*shape)(std::size_t)) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> normal(0.0, sigma);
  std::vector<double> x(n);
  for (std::size_t k = 0; k < n; ++k) x[k] = shape(k) + normal(generator);
  return x;
}

double Level(std::size_t) { return 300.0; }
double Step(std::size_t k) { return k < 500 ? 0.0 : 12.0; }
double Ramp(std::size_t k) { return 0.5 * static_cast<double>(k); }
double Rise(std::size_t k) { return 10.0 * (1.0 - std::exp(-static_cast<double>(k) / 4.0)); }  // 4 samples per τ
double Ripple(std::size_t k) { return 5.0 + 0.2 * std::cos(2.0 * M_PI * static_cast<double>(k) / 6.0); }

TEST(Outliers, DropoutsAndSpikesAreFound) {
  std::vector<double> x = Noisy(5000, 0.2, 1, Level);
  const std::vector<std::size_t> planted = {100, 1234, 1235, 4000};  // a run of two included
  x[100] = 0.0;      // a tachometer dropout
  x[1234] = 0.0;
  x[1235] = 0.0;
  x[4000] = 320.0;   // a spike of 100 σ
  EXPECT_EQ(FindIsolatedOutliers(x), planted);
}

TEST(Outliers, TheShapesOfABenchLogAreLeftAlone) {
  // Gaussian noise: a chance of about 10⁻¹⁵ per sample beyond 8 scales (the header); 10⁵ samples.
  for (auto shape : {Level, Step, Ramp, Rise, Ripple})
    EXPECT_TRUE(FindIsolatedOutliers(Noisy(100000, 0.01, 2, shape)).empty());
  // Noise-free shapes too: a step edge, a ramp, a fast rise sampled 4 times per time constant.
  for (auto shape : {Step, Ramp, Rise}) EXPECT_TRUE(FindIsolatedOutliers(Noisy(2000, 0.0, 3, shape)).empty());
  // A coarse ADC: 10 mV steps over 5 mV of noise, where most first differences are 0.
  std::vector<double> adc = Noisy(20000, 0.005, 4, Level);
  for (double& v : adc) v = 0.01 * std::round(v / 0.01);
  EXPECT_TRUE(FindIsolatedOutliers(adc).empty());
}

TEST(Outliers, RepairedByTheLineBetweenNeighboursAndRecorded) {
  BenchLog log;
  log.path = "coast.csv";
  std::mt19937_64 generator(6);
  std::normal_distribution<double> noise(0.0, 0.05);
  for (int k = 0; k < 40; ++k) {
    log.time_s.push_back(0.02 * k);
    log.speed_rad_s.push_back(100.0 - 0.5 * k + noise(generator));  // a coast's straight stretch, noisy
    log.line_of_row.push_back(k + 2);                                // one header line
  }
  const double before = log.speed_rad_s[19], after = log.speed_rad_s[21];
  log.speed_rad_s[20] = 0.0;
  SetAsideOutliers(&log);
  EXPECT_NEAR(log.speed_rad_s[20], 0.5 * (before + after), 1e-12);  // on the line through its neighbours
  ASSERT_EQ(log.set_aside.size(), 1u);
  EXPECT_EQ(log.set_aside[0].quantity, units::Quantity::kSpeed);
  EXPECT_EQ(log.set_aside[0].lines, std::vector<long>{22});
}

}  // namespace
}  // namespace coilspin

namespace coilspin {
namespace {

TEST(Outliers, AnInrushPeakAtAVoltageStepIsTheMotorsAnswer) {
  // A free-shaft step logged coarsely: the current jumps to near stall at the first sample after
  // the supply steps and has fallen a long way by the next (the winding's τe shorter than a
  // sample, physics), and the terminal voltage peaks before the supply's resistance pulls it
  // down. Both are one-sample peaks next to a level change of the voltage: kept.
  BenchLog log;
  std::mt19937_64 generator(8);
  std::normal_distribution<double> noise(0.0, 0.002);
  for (int k = 0; k < 200; ++k) {
    log.time_s.push_back(1e-3 * k);
    const bool on = k >= 100;
    log.voltage_V.push_back((on ? (k == 100 ? 12.0 : 11.2) : 0.0) + noise(generator));
    log.current_A.push_back((on ? (k == 100 ? 8.0 : 0.5 + 2.0 * std::exp(-(k - 101) / 1.5)) : 0.0) + noise(generator));
  }
  const std::vector<double> voltage = log.voltage_V, current = log.current_A;
  SetAsideOutliers(&log);
  EXPECT_TRUE(log.set_aside.empty());
  EXPECT_EQ(log.voltage_V, voltage);
  EXPECT_EQ(log.current_A, current);
}

}  // namespace
}  // namespace coilspin

namespace coilspin {
namespace {

TEST(Outliers, RippleInOnePartOfALogIsNotFlagged) {
  // A spin-down's terminal voltage: the supply holds it steady, then the coast's back-EMF
  // carries commutation ripple (2 % at 7 segments per turn, about 6 samples a period here),
  // then the rotor rests at 0 V. One scale for the whole channel, set by the quiet parts,
  // flagged the ripple's peaks by the hundred; the local scale leaves them.
  std::mt19937_64 generator(10);
  std::normal_distribution<double> noise(0.0, 0.002);
  std::vector<double> v;
  for (int k = 0; k < 1000; ++k) v.push_back(12.0 + noise(generator));
  for (int k = 0; k < 2000; ++k) {
    const double back_emf = 11.0 * std::exp(-k / 800.0);
    v.push_back(back_emf * (1.0 + 0.02 * std::cos(2.0 * M_PI * k / 6.4)) + noise(generator));
  }
  for (int k = 0; k < 1000; ++k) v.push_back(noise(generator));
  EXPECT_TRUE(FindIsolatedOutliers(v).empty());
  v[1500] += 3.0;  // a real spike in the rippling part is still found
  EXPECT_EQ(FindIsolatedOutliers(v), std::vector<std::size_t>{1500});
}

}  // namespace
}  // namespace coilspin
