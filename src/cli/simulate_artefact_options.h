#pragma once
// The options of `coilspin simulate` that add a real rig's artefacts to a log
// (src/model/bench_artefacts.h, docs/bench-artefacts.md): coloured sensor
// noise, zero offsets, dropouts and spikes per channel, ADC steps on speed and
// torque, commutation ripple, winding warm-up, and a drag and wandering
// friction on a free shaft. All off unless given; each is an error (exit 2)
// where it has no meaning: a channel the log does not carry, ripple, drag or
// friction wander on a locked rotor, a correlation without the channel's
// noise, half of a pair (--warm-up without --warm-up-time, …).

#include <CLI/CLI.hpp>
#include <optional>

#include "src/model/bench_conditions.h"

namespace coilspin::cli {

// One logged channel's sensor options, in the channel's SI unit.
struct SensorOptions {
  std::optional<double> noise_correlation;  // φ, lag-1 correlation of the noise
  std::optional<double> offset;             // zero offset
  std::optional<double> dropout_rate;       // per sample
  std::optional<double> spike_rate;         // per sample
};

struct ArtefactArguments {
  SensorOptions voltage, current, speed, torque;
  std::optional<double> spike_size;          // k full scales, every channel's spikes
  std::optional<double> speed_lsb_rad_s;
  std::optional<double> torque_lsb_N_m;
  std::optional<int> ripple_segments;        // N per turn
  std::optional<double> ripple_amplitude;    // a, relative
  std::optional<double> ripple_phase_rad;    // φ0
  std::optional<double> warm_up_K;           // ΔT
  std::optional<double> warm_up_time_s;      // τ_th
  std::optional<double> drag_N_m_s2_per_rad2;
  std::optional<double> friction_wander_N_m;
  std::optional<double> friction_wander_time_s;
};

// What the log being simulated carries: decides which options apply.
struct ArtefactScope {
  bool free_shaft = false;  // no-load, spin-down, step (ripple, drag, friction wander)
  bool voltage = false;     // the log has these columns
  bool current = false;
  bool speed = false;
  bool torque = false;
  // The channel's noise σ is given (> 0): its correlation applies.
  bool voltage_noise = false, current_noise = false, speed_noise = false, torque_noise = false;
};

void DeclareArtefactOptions(CLI::App* command, ArtefactArguments* arguments);

// Throws InputError (kBadOption) for an option that does not apply to `scope` or lacks its pair.
void RejectInapplicableArtefacts(const ArtefactArguments& arguments, const ArtefactScope& scope);

// Sets the artefacts given into `bench`.
void ApplyArtefacts(const ArtefactArguments& arguments, model::BenchConditions* bench);

}  // namespace coilspin::cli
