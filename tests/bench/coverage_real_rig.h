#pragma once
// Coverage benchmark helper: the "real rig" sessions of issue 9. The logs of
// `joint` (or, without steps, locked-rotor plateaus, no-load and spin-down),
// each made with a real rig's artefacts (src/model/bench_artefacts.h,
// docs/bench-artefacts.md) at levels drawn once per bench, so every log of one
// bench shares its sensors:
//   sensor noise      AR(1), lag-1 correlation 0.8–0.95 per channel (voltage,
//                     current, speed), σ of `joint` times 0.5–2;
//   current offset    ±(0.1–0.4 %) of the current sensor's full scale, taken as
//                     the stall current at the top voltage, top_V/R; the same
//                     on every log (one current sensor);
//   ripple            7 segments per turn, 0.5–2 % of the current and of the
//                     coast voltage, at a phase drawn per log (free shaft only);
//   tachometer        a dropout to 0 every 2000–5000 samples (speed benches);
//   spikes            every 10 000–30 000 samples on voltage, current and
//                     speed, 0.2–1 full scale either way;
//   current ADC       on half the benches, a step of 1.5–3 current-noise σ;
//   winding warm-up   on half the benches, 3–15 K with τ_th 30–300 s, from
//                     the start of each log.
// The levels are invented, typical of a small-motor rig (from memory), and
// drawn uniformly within the ranges issue 9 names where it names them.

#include <cstdint>
#include <cstdio>
#include <string>

#include "bench/coverage_motors.h"
#include "src/model/measurement_noise.h"
#include "src/units/constants.h"

namespace coilspin::bench {

// Streams of the bench and log seeds that no simulator uses (src/model/noise_streams.h stops at 12).
inline constexpr std::uint32_t kRigDrawStream = 1000;
inline constexpr std::uint32_t kRipplePhaseStream = 1001;
inline constexpr int kRippleSegmentsPerTurn = 7;

struct RigLevels {
  double noise_scale = 1.0;
  double voltage_phi = 0.0, current_phi = 0.0, speed_phi = 0.0;
  double current_offset_A = 0.0;
  double current_full_scale_A = 0.0;
  double ripple_amplitude = 0.0;
  double speed_dropout_rate = 0.0;
  double spike_rate = 0.0;
  double spike_full_scales = 0.0;
  double current_lsb_A = 0.0;  // 0 = fine ADC
  model::WindingWarmUp warm_up;
};

class Draws {
 public:
  Draws(std::uint64_t seed, std::uint32_t stream) : uniform_(seed, stream) {}
  double Between(double low, double high) { return low + (high - low) * uniform_.UniformOpenZero(); }
  bool Coin() { return uniform_.UniformOpenZero() <= 0.5; }

 private:
  model::MeasurementNoise uniform_;
};

inline RigLevels DrawRig(const Motor& m, std::uint64_t bench_seed) {
  Draws d(bench_seed, kRigDrawStream);
  RigLevels r;
  r.noise_scale = d.Between(0.5, 2.0);
  r.voltage_phi = d.Between(0.8, 0.95);
  r.current_phi = d.Between(0.8, 0.95);
  r.speed_phi = d.Between(0.8, 0.95);
  r.current_full_scale_A = m.top_V / m.p.resistance_ohm;
  r.current_offset_A = (d.Coin() ? 1.0 : -1.0) * d.Between(0.001, 0.004) * r.current_full_scale_A;
  r.ripple_amplitude = d.Between(0.005, 0.02);
  r.speed_dropout_rate = 1.0 / d.Between(2000.0, 5000.0);
  r.spike_rate = 1.0 / d.Between(10000.0, 30000.0);
  r.spike_full_scales = d.Between(0.2, 1.0);
  const double current_sigma_A = 2e-3 * r.noise_scale;  // JointNoise's σ_I, scaled
  const bool coarse = d.Coin();
  const double lsb_sigmas = d.Between(1.5, 3.0);
  if (coarse) r.current_lsb_A = lsb_sigmas * current_sigma_A;
  const bool warms = d.Coin();
  const double rise_K = d.Between(3.0, 15.0), time_constant_s = d.Between(30.0, 300.0);
  if (warms) r.warm_up = {rise_K, time_constant_s};
  return r;
}

// The bench of one log: JointNoise's σ scaled and every artefact of `rig`.
inline model::BenchConditions RealRigBench(const RigLevels& rig, std::uint64_t log_seed, bool encoder) {
  model::BenchConditions b = JointNoise(log_seed, encoder, rig.noise_scale);
  b.voltage_sensor.noise_lag1_correlation = rig.voltage_phi;
  b.current_sensor.noise_lag1_correlation = rig.current_phi;
  b.speed_sensor.noise_lag1_correlation = rig.speed_phi;
  b.current_sensor.zero_offset = rig.current_offset_A;
  b.current_lsb_A = rig.current_lsb_A;
  for (model::SensorArtefacts* s : {&b.voltage_sensor, &b.current_sensor, &b.speed_sensor}) {
    s->spike_rate = rig.spike_rate;
    s->spike_full_scales = rig.spike_full_scales;
  }
  if (!encoder) b.speed_sensor.dropout_rate = rig.speed_dropout_rate;
  Draws phase(log_seed, kRipplePhaseStream);
  b.ripple = {kRippleSegmentsPerTurn, rig.ripple_amplitude, phase.Between(0.0, units::kRadiansPerRevolution)};
  b.warm_up = rig.warm_up;
  return b;
}

// A real-rig session of motor m: log i seeded bench_seed + i.
inline std::vector<joint::TestLog> RealRigSession(const Motor& m, std::uint64_t bench_seed, bool with_steps) {
  const RigLevels rig = DrawRig(m, bench_seed);
  return SessionBench(
      m,
      [&](int log, bool encoder) {
        return RealRigBench(rig, bench_seed + static_cast<std::uint64_t>(log), encoder);
      },
      with_steps);
}

// A log as CSV (SI units), for `coverage_bench dump`.
inline void WriteCsv(const BenchLog& log, const std::string& path) {
  std::FILE* file = std::fopen(path.c_str(), "w");
  if (file == nullptr) return;
  std::fprintf(file, "time [s]");
  const std::pair<const std::vector<double>*, const char*> channels[] = {
      {&log.voltage_V, "voltage [V]"}, {&log.current_A, "current [A]"}, {&log.speed_rad_s, "speed [rad/s]"},
      {&log.position_rad, "position [rad]"}, {&log.temperature_degC, "temperature [degC]"}};
  for (const auto& [x, header] : channels)
    if (!x->empty()) std::fprintf(file, ",%s", header);
  std::fprintf(file, "\n");
  for (std::size_t k = 0; k < log.size(); ++k) {
    std::fprintf(file, "%.9g", log.time_s[k]);
    for (const auto& [x, header] : channels)
      if (!x->empty()) std::fprintf(file, ",%.12g", (*x)[k]);
    std::fprintf(file, "\n");
  }
  std::fclose(file);
}

// One line of the levels, for the benchmark's footer.
inline std::string Describe(const RigLevels& r) {
  char text[320];
  std::snprintf(text, sizeof text,
                "noise x%.2f, phi V/I/w %.2f/%.2f/%.2f, I offset %+.4f A (%.2f %% FS), ripple %.2f %%, "
                "tach dropout 1/%.0f, spikes 1/%.0f x%.2f FS, I lsb %s, warm-up %s",
                r.noise_scale, r.voltage_phi, r.current_phi, r.speed_phi, r.current_offset_A,
                100.0 * r.current_offset_A / r.current_full_scale_A, 100.0 * r.ripple_amplitude,
                1.0 / r.speed_dropout_rate, 1.0 / r.spike_rate, r.spike_full_scales,
                r.current_lsb_A > 0.0 ? (std::to_string(r.current_lsb_A * 1e3).substr(0, 4) + " mA").c_str() : "none",
                r.warm_up.rise_K != 0.0 ? (std::to_string(r.warm_up.rise_K).substr(0, 4) + " K/" +
                                           std::to_string(r.warm_up.time_constant_s).substr(0, 5) + " s")
                                              .c_str()
                                        : "none");
  return text;
}

}  // namespace coilspin::bench
