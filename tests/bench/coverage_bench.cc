// Coverage benchmark: simulates many benches of motors with known parameters
// (locked-rotor plateaus and step capture, no-load levels, spin-down; speed or
// encoder; with and without brush drop), fits each with the joint fit, and
// prints per parameter the empirical coverage of the nominal interval, the
// bias and the spread of the estimate (relative to the truth).
// Usage: coverage_bench [benches per motor, default 25]

#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <map>
#include <string>
#include <vector>

#include "fitters/joint/motor_fit.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"
#include "src/model/simulate_no_load.h"
#include "src/model/simulate_spin_down.h"

namespace {

using namespace coilspin;

struct Motor {
  const char* name;
  model::MotorParameters p;
  double top_V;
  bool encoder;
};

model::MotorParameters Make(double r, double l, double k, double j, double b, double tc, double vb) {
  model::MotorParameters m;
  m.resistance_ohm = r;
  m.inductance_H = l;
  m.back_emf_constant_V_s_per_rad = m.torque_constant_N_m_per_A = k;
  m.inertia_kg_m2 = j;
  m.viscous_friction_N_m_s_per_rad = b;
  m.coulomb_friction_N_m = tc;
  m.brush_drop_V = vb;
  return m;
}

model::BenchConditions Noise(std::uint64_t seed, bool encoder, double scale) {
  model::BenchConditions b;
  b.voltage_noise_sigma_V = 5e-3 * scale;
  b.current_noise_sigma_A = 2e-3 * scale;
  b.speed_noise_sigma_rad_s = encoder ? 0.0 : 0.2 * scale;
  b.encoder_counts_per_rev = encoder ? 1024 : 0;
  b.seed = seed;
  return b;
}

std::vector<joint::TestLog> Bench(const Motor& m, std::uint64_t seed, double noise_scale) {
  std::vector<joint::TestLog> logs;
  const auto shaft = m.encoder ? model::ShaftChannels::kPosition : model::ShaftChannels::kSpeed;
  model::PlateauPlan lr;
  for (double f : {0.1, 0.2, 0.3, 0.4, -0.15, -0.3}) lr.supply_levels_V.push_back(f * m.top_V);
  lr.hold_s = 0.3;
  logs.push_back({TestKind::kLockedRotor, testing::ToBenchLog(model::SimulateLockedRotorPlateaus(m.p, lr, Noise(seed, false, noise_scale)), "lr")});
  model::StepPlan st;
  st.supply_after_V = 0.2 * m.top_V;
  const double tau_s = m.p.inductance_H / m.p.resistance_ohm;
  st.sample_period_s = tau_s / 100.0;
  st.before_s = 10 * tau_s;
  st.after_s = 10 * tau_s;
  logs.push_back({TestKind::kLockedRotor, testing::ToBenchLog(model::SimulateLockedRotorStep(m.p, st, Noise(seed + 1, false, noise_scale)), "step")});
  model::NoLoadPlan nl;
  for (double f : {0.25, 0.4, 0.55, 0.7, 0.85, 1.0}) nl.supply_levels_V.push_back(f * m.top_V);
  nl.hold_s = 1.0;
  nl.shaft = shaft;
  logs.push_back({TestKind::kNoLoad, testing::ToBenchLog(model::SimulateNoLoad(m.p, nl, Noise(seed + 2, m.encoder, noise_scale)), "nl")});
  model::SpinDownPlan sd;
  sd.supply_V = m.top_V;
  sd.run_s = 1.0;
  sd.coast_s = 4.0;
  sd.shaft = shaft;
  logs.push_back({TestKind::kSpinDown, testing::ToBenchLog(model::SimulateSpinDown(m.p, sd, Noise(seed + 3, m.encoder, noise_scale)), "sd")});
  return logs;
}

struct Tally {
  int fits = 0, covered = 0;
  double sum = 0.0, sum_sq = 0.0;  // of (estimate − truth)/truth
};

}  // namespace

int main(int argc, char** argv) {
  const int per_motor = argc > 1 ? std::atoi(argv[1]) : 25;
  const Motor motors[] = {
      {"small 12 V, speed", Make(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0), 12.0, false},
      {"small 12 V, encoder, brushes", Make(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.7), 12.0, true},
      {"6 V, speed, brushes", Make(0.8, 0.3e-3, 0.012, 6e-6, 3e-6, 8e-4, 0.5), 6.0, false},
      {"24 V, encoder", Make(0.6, 2e-3, 0.08, 4e-4, 8e-5, 1.5e-2, 0.0), 24.0, true},
  };
  const char* keys[] = {"resistance", "inductance", "brush_drop", "back_emf_constant",
                        "inertia", "viscous_friction", "coulomb_friction"};
  std::map<std::string, Tally> tally;
  std::map<std::string, Tally> per_motor_tally;  // "motor / parameter"
  const auto start = std::chrono::steady_clock::now();
  int failures = 0;
  for (const Motor& m : motors) {
    const std::map<std::string, double> truth = {
        {"resistance", m.p.resistance_ohm}, {"inductance", m.p.inductance_H}, {"brush_drop", m.p.brush_drop_V},
        {"back_emf_constant", m.p.back_emf_constant_V_s_per_rad}, {"inertia", m.p.inertia_kg_m2},
        {"viscous_friction", m.p.viscous_friction_N_m_s_per_rad}, {"coulomb_friction", m.p.coulomb_friction_N_m}};
    for (int k = 0; k < per_motor; ++k) {
      const double noise_scale = (k % 3 == 0) ? 3.0 : 1.0;  // every third bench three times noisier
      const MotorEstimate e = joint::FitMotor(Bench(m, 7000 + 10 * k, noise_scale), {});
      for (const char* key : keys) {
        if (truth.at(key) == 0.0) continue;  // Vb = 0 sits on its bound: coverage is not defined there
        const QuantityEstimate* q = e.Find(key);
        if (!q) {
          ++failures;
          continue;
        }
        const double rel = (q->value - truth.at(key)) / truth.at(key);
        const bool covered = q->ci_low <= truth.at(key) && truth.at(key) <= q->ci_high;
        for (Tally* t : {&tally[key], &per_motor_tally[std::string(m.name) + " / " + key]}) {
          ++t->fits;
          t->sum += rel;
          t->sum_sq += rel * rel;
          if (covered) ++t->covered;
        }
      }
    }
  }
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  std::printf("| parameter | fits | coverage of the 95 %% interval | bias (relative) | spread (relative RMS) |\n");
  std::printf("| --- | --- | --- | --- | --- |\n");
  for (const char* key : keys) {
    const Tally& t = tally[key];
    if (t.fits == 0) continue;
    const double mean = t.sum / t.fits;
    std::printf("| %s | %d | %.1f %% | %+.2e | %.2e |\n", key, t.fits, 100.0 * t.covered / t.fits, mean,
                std::sqrt(std::max(0.0, t.sum_sq / t.fits - mean * mean)));
  }
  std::printf("\n| motor / parameter | fits | coverage | bias | spread |\n| --- | --- | --- | --- | --- |\n");
  for (const auto& [name, t] : per_motor_tally) {
    const double mean = t.sum / t.fits;
    std::printf("| %s | %d | %.0f %% | %+.2e | %.2e |\n", name.c_str(), t.fits, 100.0 * t.covered / t.fits, mean,
                std::sqrt(std::max(0.0, t.sum_sq / t.fits - mean * mean)));
  }
  std::printf("\n%d motors x %d benches, %d parameters not determined, %.1f s\n", 4, per_motor, failures, seconds);
  return 0;
}
