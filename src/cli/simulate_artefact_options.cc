#include "src/cli/simulate_artefact_options.h"

#include <cstdlib>
#include <limits>
#include <string>

#include "src/ingest/input_error.h"

namespace coilspin::cli {
namespace {

[[noreturn]] void Bad(const std::string& message) {
  throw InputError(InputErrorKind::kBadOption, "", 0, 0, message);
}

// A number x with low < x < high (or low ≤ x < high when `low_included`); `label` is how help shows it.
CLI::Validator Below(double low, bool low_included, double high, const std::string& label) {
  return CLI::Validator(
      [=](std::string& text) {
        char* end = nullptr;
        const double x = std::strtod(text.c_str(), &end);
        const bool above = low_included ? x >= low : x > low;
        const bool inside = end != text.c_str() && *end == '\0' && above && x < high;
        return inside ? std::string() : "must lie in " + label + ", got " + text;
      },
      label);
}

struct Channel {
  const char* name;  // "current"
  const char* unit;  // "A"
  SensorOptions ArtefactArguments::*options;
  bool ArtefactScope::*logged;
  bool ArtefactScope::*noisy;
  const char* column_hint;  // how to get the column
};

const Channel kChannels[] = {
    {"voltage", "V", &ArtefactArguments::voltage, &ArtefactScope::voltage, &ArtefactScope::voltage_noise,
     "not with --no-coast-voltage"},
    {"current", "A", &ArtefactArguments::current, &ArtefactScope::current, &ArtefactScope::current_noise,
     "not with --no-coast-current"},
    {"speed", "rad/s", &ArtefactArguments::speed, &ArtefactScope::speed, &ArtefactScope::speed_noise,
     "no-load, spin-down or step, without --cpr or with --log-speed-and-position"},
    {"torque", "N*m", &ArtefactArguments::torque, &ArtefactScope::torque, &ArtefactScope::torque_noise,
     "locked-rotor plateaus with --log-torque"},
};

std::string Flag(const Channel& channel, const char* what) { return "--" + std::string(channel.name) + "-" + what; }

void RejectChannel(const Channel& channel, const SensorOptions& o, const ArtefactScope& scope) {
  const bool logged = scope.*channel.logged;
  const std::string column = std::string(" needs a ") + channel.name + " column (" + channel.column_hint + ")";
  const struct {
    const char* what;
    bool given;
  } options[] = {{"noise-correlation", o.noise_correlation.has_value()},
                 {"offset", o.offset.has_value()},
                 {"dropout-rate", o.dropout_rate.has_value()},
                 {"spike-rate", o.spike_rate.has_value()}};
  for (const auto& option : options) {
    if (option.given && !logged) Bad(Flag(channel, option.what) + column);
  }
  if (o.noise_correlation && !(scope.*channel.noisy)) {
    Bad(Flag(channel, "noise-correlation") + " needs the channel's noise: give " + Flag(channel, "noise"));
  }
}

void RequirePair(bool first_given, const char* first, bool second_given, const char* second) {
  if (first_given && !second_given) Bad(std::string(first) + " needs " + second);
  if (second_given && !first_given) Bad(std::string(second) + " needs " + first);
}

model::SensorArtefacts SensorOf(const SensorOptions& o, std::optional<double> spike_size) {
  model::SensorArtefacts s;
  s.noise_lag1_correlation = o.noise_correlation.value_or(0.0);
  s.zero_offset = o.offset.value_or(0.0);
  s.dropout_rate = o.dropout_rate.value_or(0.0);
  s.spike_rate = o.spike_rate.value_or(0.0);
  if (o.spike_rate) s.spike_full_scales = spike_size.value_or(0.0);
  return s;
}

}  // namespace

void DeclareArtefactOptions(CLI::App* c, ArtefactArguments* a) {
  // A real rig's artefacts (docs/bench-artefacts.md); every one off unless given.
  for (const Channel& channel : kChannels) {
    SensorOptions& o = a->*channel.options;
    const std::string name = channel.name, unit = channel.unit;
    c->add_option(Flag(channel, "noise-correlation"), o.noise_correlation,
                  "Lag-1 correlation of the " + name + " noise, AR(1), in (-1, 1); sigma stays --" + name +
                      "-noise")
        ->check(Below(-1.0, false, 1.0, "(-1, 1)"));
    c->add_option(Flag(channel, "offset"), o.offset, "Zero offset of the " + name + " sensor [" + unit +
                                                          "], added to every reading");
    c->add_option(Flag(channel, "dropout-rate"), o.dropout_rate,
                  "Probability per sample that the " + name + " reading is 0 (a dropout)")
        ->check(CLI::Range(0.0, 1.0));
    c->add_option(Flag(channel, "spike-rate"), o.spike_rate,
                  "Probability per sample of a spike of +/- --spike-size full scales on the " + name)
        ->check(CLI::Range(0.0, 1.0));
  }
  c->add_option("--spike-size", a->spike_size,
                "Spike height in full scales of the channel (its largest |value| in the log)")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--speed-lsb", a->speed_lsb_rad_s, "Speed ADC step [rad/s] at the logged shaft")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--torque-lsb", a->torque_lsb_N_m, "Torque ADC step [N*m]")->check(CLI::NonNegativeNumber);
  c->add_option("--ripple-segments", a->ripple_segments,
                "Commutation ripple: commutator segments per motor turn (no-load, spin-down, step)")
      ->check(CLI::Range(1, std::numeric_limits<int>::max()));
  c->add_option("--ripple-amplitude", a->ripple_amplitude,
                "Commutation ripple: relative amplitude a of i*(1 + a*cos(N*theta + phase)), in [0, 1)")
      ->check(Below(0.0, true, 1.0, "[0, 1)"));
  c->add_option("--ripple-phase", a->ripple_phase_rad, "Commutation ripple: phase [rad] at shaft angle 0 (default 0)");
  c->add_option("--warm-up", a->warm_up_K,
                "Winding warm-up: temperature rise [K] approached as 1 - exp(-t/--warm-up-time)");
  c->add_option("--warm-up-time", a->warm_up_time_s, "Winding warm-up: thermal time constant [s]")
      ->check(CLI::PositiveNumber);
  c->add_option("--drag", a->drag_N_m_s2_per_rad2,
                "Free shaft: speed-squared drag c [N*m*s^2/rad^2], torque c*w*|w|, absent from the fitted model")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--friction-wander", a->friction_wander_N_m,
                "Free shaft: sigma [N*m] of a slowly wandering Coulomb friction (Ornstein-Uhlenbeck)")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--friction-wander-time", a->friction_wander_time_s,
                "Free shaft: correlation time [s] of the friction wander")
      ->check(CLI::PositiveNumber);
}

void RejectInapplicableArtefacts(const ArtefactArguments& a, const ArtefactScope& scope) {
  bool any_spike_rate = false;
  for (const Channel& channel : kChannels) {
    RejectChannel(channel, a.*channel.options, scope);
    any_spike_rate = any_spike_rate || (a.*channel.options).spike_rate.has_value();
  }
  if (a.spike_size && !any_spike_rate) Bad("--spike-size needs a spike rate (--current-spike-rate, ...)");
  for (const Channel& channel : kChannels) {
    if ((a.*channel.options).spike_rate && !a.spike_size) {
      Bad(Flag(channel, "spike-rate") + " needs --spike-size (in full scales)");
    }
  }
  if (a.speed_lsb_rad_s && !scope.speed) {
    Bad("--speed-lsb needs a speed column (no-load, spin-down or step, without --cpr or with --log-speed-and-position)");
  }
  if (a.torque_lsb_N_m && !scope.torque) Bad("--torque-lsb needs a torque column (locked-rotor plateaus with --log-torque)");
  const struct {
    const char* option;
    bool given;
  } free_shaft_only[] = {{"--ripple-segments", a.ripple_segments.has_value()},
                         {"--ripple-amplitude", a.ripple_amplitude.has_value()},
                         {"--ripple-phase", a.ripple_phase_rad.has_value()},
                         {"--drag", a.drag_N_m_s2_per_rad2.has_value()},
                         {"--friction-wander", a.friction_wander_N_m.has_value()},
                         {"--friction-wander-time", a.friction_wander_time_s.has_value()}};
  for (const auto& option : free_shaft_only) {
    if (option.given && !scope.free_shaft) {
      Bad(std::string(option.option) + " applies to no-load, spin-down and step only (a locked rotor does not turn)");
    }
  }
  RequirePair(a.ripple_segments.has_value(), "--ripple-segments", a.ripple_amplitude.has_value(), "--ripple-amplitude");
  if (a.ripple_phase_rad && !a.ripple_segments) Bad("--ripple-phase needs --ripple-segments and --ripple-amplitude");
  RequirePair(a.warm_up_K.has_value(), "--warm-up", a.warm_up_time_s.has_value(), "--warm-up-time");
  RequirePair(a.friction_wander_N_m.has_value(), "--friction-wander", a.friction_wander_time_s.has_value(),
              "--friction-wander-time");
}

void ApplyArtefacts(const ArtefactArguments& a, model::BenchConditions* bench) {
  bench->voltage_sensor = SensorOf(a.voltage, a.spike_size);
  bench->current_sensor = SensorOf(a.current, a.spike_size);
  bench->speed_sensor = SensorOf(a.speed, a.spike_size);
  bench->torque_sensor = SensorOf(a.torque, a.spike_size);
  bench->speed_lsb_rad_s = a.speed_lsb_rad_s.value_or(0.0);
  bench->torque_lsb_N_m = a.torque_lsb_N_m.value_or(0.0);
  bench->ripple.segments_per_turn = a.ripple_segments.value_or(0);
  bench->ripple.relative_amplitude = a.ripple_amplitude.value_or(0.0);
  bench->ripple.phase_rad = a.ripple_phase_rad.value_or(0.0);
  bench->warm_up.rise_K = a.warm_up_K.value_or(0.0);
  bench->warm_up.time_constant_s = a.warm_up_time_s.value_or(0.0);
  bench->discrepancy.drag_N_m_s2_per_rad2 = a.drag_N_m_s2_per_rad2.value_or(0.0);
  bench->discrepancy.friction_wander_sigma_N_m = a.friction_wander_N_m.value_or(0.0);
  bench->discrepancy.friction_wander_time_s = a.friction_wander_time_s.value_or(0.0);
}

}  // namespace coilspin::cli
