#include "src/cli/simulate_command.h"

#include <cmath>
#include <cstdlib>
#include <string>
#include <limits>
#include <sstream>
#include <stdexcept>
#include <tuple>
#include <utility>

#include "src/cli/exit_codes.h"
#include "src/cli/key_value.h"
#include "src/cli/number_checks.h"
#include "src/cli/output_path.h"
#include "src/ingest/input_error.h"
#include "src/model/free_shaft_plan_defaults.h"
#include "src/model/sample_plan.h"
#include "src/model/simulate_locked_rotor.h"
#include "src/model/simulate_no_load.h"
#include "src/model/simulate_spin_down.h"
#include "src/model/simulate_step.h"
#include "src/model/step_plan_defaults.h"

namespace coilspin::cli {
namespace {

// Defaults: a plateau logger at 1 kHz, a scope at 100 kHz, a free-shaft logger at 1 kHz (the
// free-shaft step's fast logger: src/model/step_plan_defaults.h).
constexpr double kPlateauSamplePeriod_s = 1e-3;
constexpr double kStepSamplePeriod_s = 10e-6;
constexpr double kFreeShaftSamplePeriod_s = 1e-3;
constexpr double kPlateauHold_s = 0.5;
// Logged before a step (locked-rotor capture and free shaft) and, locked, after it: a scope's
// pre-trigger span and about ten electrical time constants of a 1 mH, 1 ohm winding.
constexpr double kStepBefore_s = 1e-3;
constexpr double kLockedStepAfter_s = 10e-3;
constexpr const char* kCountsUnit = "counts";

enum class Kind { kLockedRotor, kNoLoad, kSpinDown, kStep };

[[noreturn]] void Bad(const std::string& message) {
  throw InputError(InputErrorKind::kBadOption, "", 0, 0, message);
}

char Delimiter(const std::string& text) {
  if (text == "," || text == "comma") return ',';
  if (text == ";" || text == "semicolon") return ';';
  if (text == "\t" || text == "tab") return '\t';
  Bad("--delimiter must be ',', ';' or tab, got '" + text + "'");
}

Kind KindOf(const std::string& text) {
  if (text == "locked-rotor") return Kind::kLockedRotor;
  if (text == "no-load") return Kind::kNoLoad;
  if (text == "spin-down") return Kind::kSpinDown;
  if (text == "step") return Kind::kStep;
  Bad("simulate writes locked-rotor, no-load, spin-down or step logs, not '" + text + "'");
}

std::string NameOf(Kind kind) {
  switch (kind) {
    case Kind::kLockedRotor: return "locked-rotor";
    case Kind::kNoLoad: return "no-load";
    case Kind::kSpinDown: return "spin-down";
    case Kind::kStep: return "step";
  }
  return {};  // unreachable: every enumerator is named
}

bool LogsPosition(const SimulateArguments& a) { return a.counts_per_rev.has_value() || a.log_speed_and_position; }
bool LogsSpeed(const SimulateArguments& a) { return !a.counts_per_rev.has_value() || a.log_speed_and_position; }

// An option that was given where it has no meaning is an error, not silently ignored.
void RejectInapplicable(const SimulateArguments& a, Kind kind) {
  const bool locked = kind == Kind::kLockedRotor, no_load = kind == Kind::kNoLoad;
  const bool spin_down = kind == Kind::kSpinDown, step = kind == Kind::kStep;
  const bool free_shaft = no_load || spin_down || step;
  const bool plateaus = locked && a.step_spec.empty(), locked_step = locked && !a.step_spec.empty();
  struct Rule {
    const char* option;
    bool given;
    bool applies;
    const char* otherwise;  // the rest of the message
  };
  const Rule rules[] = {
      {"--step", !a.step_spec.empty(), locked || step, "applies to locked-rotor and step only"},
      {"--before", a.before_s.has_value(), locked_step || step,
       "applies to step captures only (locked-rotor with --step, or step)"},
      {"--after", a.after_s.has_value(), locked_step || step,
       "applies to step captures only (locked-rotor with --step, or step)"},
      {"--settle", a.settle_s.has_value(), step, "applies to step only"},
      {"--levels", !a.levels_V.empty(), plateaus || no_load, "applies to locked-rotor plateaus and no-load only"},
      {"--hold", a.hold_s.has_value(), plateaus || no_load,
       "applies to locked-rotor plateaus and no-load only (a step's hold is --after)"},
      {"--log-temperature", a.log_temperature, plateaus || no_load || step,
       "applies to locked-rotor plateaus, no-load and step only"},
      {"--heating-per-plateau", a.bench.heating_per_plateau_K != 0.0, plateaus,
       "applies to locked-rotor plateaus only"},
      {"--log-torque", a.log_torque, plateaus, "applies to locked-rotor plateaus only"},
      {"--torque-noise", a.torque_noise_sigma_N_m.has_value(), a.log_torque, "needs a torque column (--log-torque)"},
      {"--supply", a.supply_V.has_value(), spin_down, "applies to spin-down only"},
      {"--run", a.run_s.has_value(), spin_down, "applies to spin-down only"},
      {"--coast", a.coast_s.has_value(), spin_down, "applies to spin-down only"},
      {"--brake-resistance", a.brake_resistance_ohm.has_value(), spin_down, "applies to spin-down only"},
      {"--no-coast-voltage", a.no_coast_voltage, spin_down, "applies to spin-down only"},
      {"--no-coast-current", a.no_coast_current, spin_down, "applies to spin-down only"},
      {"--cpr", a.counts_per_rev.has_value(), free_shaft, "applies to no-load, spin-down and step only"},
      {"--encoder-start-phase", a.encoder_start_phase.has_value(), free_shaft && a.counts_per_rev.has_value(),
       "needs an encoder (--cpr)"},
      {"--log-speed-and-position", a.log_speed_and_position, free_shaft,
       "applies to no-load, spin-down and step only"},
      {"--gear-ratio", a.gear_ratio.has_value(), free_shaft, "applies to no-load, spin-down and step only"},
      {"--speed-noise", a.speed_noise_sigma_rad_s.has_value(), free_shaft && LogsSpeed(a),
       "needs a speed column (no-load, spin-down or step, without --cpr or with --log-speed-and-position)"},
      {"--position-unit", a.position_unit.has_value(), free_shaft && LogsPosition(a),
       "needs a position column (no-load, spin-down or step, with --cpr or --log-speed-and-position)"},
  };
  for (const Rule& rule : rules) {
    if (rule.given && !rule.applies) Bad(std::string(rule.option) + " " + rule.otherwise);
  }
}

// The motor parameters the kind's bench needs, with Kt defaulting to Ke.
model::MotorParameters MotorFor(const SimulateArguments& a, Kind kind) {
  model::MotorParameters motor = a.motor;
  motor.torque_constant_N_m_per_A = a.torque_constant.value_or(motor.back_emf_constant_V_s_per_rad);
  const std::string name = NameOf(kind);
  if (kind != Kind::kLockedRotor) {
    if (!(motor.back_emf_constant_V_s_per_rad > 0.0)) Bad(name + " needs --back-emf-constant (Ke, V*s/rad)");
    if (!(motor.inertia_kg_m2 > 0.0)) Bad(name + " needs --inertia (J, kg*m^2)");
  }
  if (a.log_torque && !(motor.torque_constant_N_m_per_A > 0.0)) {
    Bad("--log-torque needs --torque-constant (Kt, N*m/A) or --back-emf-constant (Kt = Ke)");
  }
  return motor;
}

// What the log carries, for the artefact options' rules.
ArtefactScope ScopeOf(const SimulateArguments& a, Kind kind) {
  ArtefactScope scope;
  scope.free_shaft = kind != Kind::kLockedRotor;
  scope.voltage = !(kind == Kind::kSpinDown && a.no_coast_voltage);
  scope.current = !(kind == Kind::kSpinDown && a.no_coast_current);
  scope.speed = scope.free_shaft && LogsSpeed(a);
  scope.torque = a.log_torque;
  scope.voltage_noise = a.bench.voltage_noise_sigma_V > 0.0;
  scope.current_noise = a.bench.current_noise_sigma_A > 0.0;
  scope.speed_noise = a.speed_noise_sigma_rad_s.value_or(0.0) > 0.0;
  scope.torque_noise = a.torque_noise_sigma_N_m.value_or(0.0) > 0.0;
  return scope;
}

model::BenchConditions BenchFor(const SimulateArguments& a) {
  model::BenchConditions bench = a.bench;
  ApplyArtefacts(a.artefacts, &bench);
  bench.encoder_counts_per_rev = a.counts_per_rev.value_or(0);
  bench.encoder_start_phase = a.encoder_start_phase.value_or(0.0);
  bench.gear_ratio = a.gear_ratio.value_or(bench.gear_ratio);
  bench.speed_noise_sigma_rad_s = a.speed_noise_sigma_rad_s.value_or(0.0);
  bench.torque_noise_sigma_N_m = a.torque_noise_sigma_N_m.value_or(0.0);
  return bench;
}

model::ShaftChannels ShaftFor(const SimulateArguments& a) {
  if (a.log_speed_and_position) return model::ShaftChannels::kSpeedAndPosition;
  return a.counts_per_rev ? model::ShaftChannels::kPosition : model::ShaftChannels::kSpeed;
}

std::string Text(double value) {
  std::ostringstream text;
  text << value;
  return text.str();
}

// Refuses, before anything is simulated, a log of more than model::kMaxSimulatedSamples
// samples (`span_s` in all at `sample_period_s`), saying which options set its length.
void RequireWithinSampleCap(double span_s, double sample_period_s, const std::string& shorter) {
  const double samples = span_s / sample_period_s;
  if (samples <= static_cast<double>(model::kMaxSimulatedSamples)) return;
  Bad("the log would hold " + Text(samples) + " samples (" + Text(span_s) + " s at " + Text(sample_period_s) +
      " s per sample), more than simulate writes (" + std::to_string(model::kMaxSimulatedSamples) +
      "); ask for less: " + shorter);
}

// How a default span was chosen, for the message above.
std::string DefaultNote(bool given, const std::string& option, double default_s, const std::string& what) {
  return given ? "" : " (" + option + " defaults to " + what + ", " + Text(default_s) + " s)";
}

// --step FROM:TO, the supply [V] before and after the step.
std::pair<double, double> StepLevels(const std::string& spec) {
  const std::string usage = "--step expects FROM:TO volts, e.g. 0:12, got '" + spec + "'";
  const auto colon = spec.find(':');
  if (colon == std::string::npos) Bad(usage);
  const auto volts = [&usage](const std::string& text) {
    std::size_t used = 0;
    double value = 0.0;
    try {
      value = std::stod(text, &used);
    } catch (const std::logic_error&) {
      Bad(usage);
    }
    if (used != text.size() || !std::isfinite(value)) Bad(usage);
    return value;
  };
  return {volts(spec.substr(0, colon)), volts(spec.substr(colon + 1))};
}

model::SampledLog LockedRotorLog(const SimulateArguments& a, const model::MotorParameters& motor,
                                 const model::BenchConditions& bench, output::CsvStyle& style) {
  if (!a.step_spec.empty()) {
    model::StepPlan plan;
    std::tie(plan.supply_before_V, plan.supply_after_V) = StepLevels(a.step_spec);
    plan.before_s = a.before_s.value_or(kStepBefore_s);
    plan.after_s = a.after_s.value_or(kLockedStepAfter_s);
    plan.sample_period_s = a.sample_period_s.value_or(kStepSamplePeriod_s);
    RequireWithinSampleCap(plan.before_s + plan.after_s, plan.sample_period_s,
                           "a shorter --before or --after, or a longer --sample-period");
    style.comment_lines.push_back("simulated locked-rotor step capture (coilspin simulate)");
    return model::SimulateLockedRotorStep(motor, plan, bench);
  }
  if (a.levels_V.empty()) Bad("give --levels for plateaus or --step FROM:TO for a step capture");
  model::PlateauPlan plan;
  plan.supply_levels_V = a.levels_V;
  plan.hold_s = a.hold_s.value_or(kPlateauHold_s);
  plan.sample_period_s = a.sample_period_s.value_or(kPlateauSamplePeriod_s);
  RequireWithinSampleCap(static_cast<double>(plan.supply_levels_V.size()) * plan.hold_s, plan.sample_period_s,
                         "fewer --levels, a shorter --hold, or a longer --sample-period");
  plan.log_temperature = a.log_temperature;
  plan.log_torque = a.log_torque;
  style.comment_lines.push_back("simulated locked-rotor plateaus (coilspin simulate)");
  return model::SimulateLockedRotorPlateaus(motor, plan, bench);
}

model::SampledLog NoLoadLog(const SimulateArguments& a, const model::MotorParameters& motor,
                            const model::BenchConditions& bench, output::CsvStyle& style) {
  if (a.levels_V.empty()) Bad("no-load needs --levels, the supply voltages, e.g. --levels 3,6,9,12");
  model::NoLoadPlan plan;
  plan.supply_levels_V = a.levels_V;
  plan.hold_s = a.hold_s ? *a.hold_s : model::SettlingTime_s(motor, bench);
  plan.sample_period_s = a.sample_period_s.value_or(kFreeShaftSamplePeriod_s);
  RequireWithinSampleCap(static_cast<double>(plan.supply_levels_V.size()) * plan.hold_s, plan.sample_period_s,
                         "fewer --levels, a shorter --hold, or a longer --sample-period" +
                             DefaultNote(a.hold_s.has_value(), "--hold", plan.hold_s, "the settling time"));
  plan.shaft = ShaftFor(a);
  plan.log_temperature = a.log_temperature;
  style.comment_lines.push_back("simulated no-load levels held " + Text(plan.hold_s) + " s each (coilspin simulate)");
  return model::SimulateNoLoad(motor, plan, bench);
}

model::SampledLog SpinDownLog(const SimulateArguments& a, const model::MotorParameters& motor,
                              const model::BenchConditions& bench, output::CsvStyle& style) {
  if (!a.supply_V) Bad("spin-down needs --supply, the run voltage [V]");
  model::SpinDownPlan plan;
  plan.supply_V = *a.supply_V;
  plan.brake_resistance_ohm = a.brake_resistance_ohm;
  plan.run_s = a.run_s ? *a.run_s : model::SettlingTime_s(motor, bench);
  try {
    plan.coast_s = a.coast_s ? *a.coast_s : model::CoastTime_s(motor, plan);
  } catch (const std::invalid_argument& e) {
    Bad(std::string(e.what()) + " with --coast");
  }
  plan.sample_period_s = a.sample_period_s.value_or(kFreeShaftSamplePeriod_s);
  RequireWithinSampleCap(plan.run_s + plan.coast_s, plan.sample_period_s,
                         "a shorter --run or --coast, or a longer --sample-period" +
                             DefaultNote(a.run_s.has_value(), "--run", plan.run_s, "the settling time") +
                             DefaultNote(a.coast_s.has_value(), "--coast", plan.coast_s, "the time to rest"));
  plan.log_voltage = !a.no_coast_voltage;
  plan.log_current = !a.no_coast_current;
  plan.shaft = ShaftFor(a);
  const std::string coast = plan.brake_resistance_ohm
                                ? "through a " + Text(*plan.brake_resistance_ohm) + " ohm braking resistor"
                                : "open circuit";
  style.comment_lines.push_back("simulated spin-down, supply disconnected at t = " +
                                Text(model::SpinDownPowerOffTime_s(plan)) + " s, coast " + coast +
                                " (coilspin simulate)");
  return model::SimulateSpinDown(motor, plan, bench);
}

model::SampledLog StepLog(const SimulateArguments& a, const model::MotorParameters& motor,
                          const model::BenchConditions& bench, output::CsvStyle& style) {
  if (a.step_spec.empty()) Bad("step needs --step FROM:TO, the supply [V] before and after the step, e.g. 0:12");
  model::FreeShaftStepPlan plan;
  std::tie(plan.initial_supply_V, plan.final_supply_V) = StepLevels(a.step_spec);
  if (a.settle_s && plan.initial_supply_V == 0.0) {
    Bad("--settle applies to a step from a non-zero level (FROM != 0); a step from 0 V starts at rest");
  }
  const double settling_s = model::SettlingTime_s(motor, bench);
  if (plan.initial_supply_V != 0.0) plan.settle_s = a.settle_s.value_or(settling_s);
  plan.pre_step_s = a.before_s.value_or(kStepBefore_s);
  plan.hold_s = a.after_s.value_or(settling_s);
  plan.sample_period_s = a.sample_period_s ? *a.sample_period_s : model::StepSamplePeriod_s(motor, bench);
  RequireWithinSampleCap(plan.settle_s + plan.pre_step_s + plan.hold_s, plan.sample_period_s,
                         "a shorter --after, --before or --settle, or a longer --sample-period" +
                             DefaultNote(a.after_s.has_value(), "--after", plan.hold_s, "the settling time") +
                             (plan.settle_s > 0.0 ? DefaultNote(a.settle_s.has_value(), "--settle", plan.settle_s,
                                                                "the settling time")
                                                  : std::string()));
  plan.shaft = ShaftFor(a);
  plan.log_temperature = a.log_temperature;
  const std::string start =
      plan.initial_supply_V == 0.0
          ? "from rest"
          : "after " + Text(plan.settle_s) + " s unlogged at " + Text(plan.initial_supply_V) + " V";
  style.comment_lines.push_back("simulated free-shaft voltage step " + Text(plan.initial_supply_V) + " V -> " +
                                Text(plan.final_supply_V) + " V at t = " + Text(model::StepTime_s(plan)) + " s, " +
                                start + " (coilspin simulate)");
  return model::SimulateStep(motor, plan, bench);
}

output::CsvStyle StyleFor(const SimulateArguments& a, const model::BenchConditions& bench) {
  output::CsvStyle style = a.style;
  style.delimiter = Delimiter(a.delimiter);
  style.header_for = ParseQuantityMap(a.rename_specs, "--header");
  style.counts_per_rev = bench.encoder_counts_per_rev;
  if (a.position_unit) {
    if (*a.position_unit == kCountsUnit && bench.encoder_counts_per_rev == 0) {
      Bad("--position-unit counts needs the encoder's counts per revolution: give --cpr N");
    }
    style.position_unit = *a.position_unit;
  } else if (bench.encoder_counts_per_rev > 0) {
    style.position_unit = kCountsUnit;
  }
  std::string error;
  if (!style.IsValid(&error)) Bad(error);
  return style;
}

// "key: value" notes a reader needs to interpret the shaft columns.
void AddShaftNotes(const model::BenchConditions& bench, output::CsvStyle& style) {
  if (bench.encoder_counts_per_rev > 0) {
    style.comment_lines.push_back("encoder_cpr: " + std::to_string(bench.encoder_counts_per_rev));
  }
  if (bench.gear_ratio != 1.0) {
    style.comment_lines.push_back("gear_ratio: " + Text(bench.gear_ratio) +
                                  " (motor turns per output turn; speed and position at the output)");
  }
}

}  // namespace

void DeclareSimulateOptions(CLI::App* c, SimulateArguments* a) {
  c->add_option("kind", a->kind, "Test to simulate: locked-rotor, no-load, spin-down or step (free-shaft voltage step)")
      ->required();
  c->add_option("--out", a->out_path, "CSV file to write (atomically); - writes it to standard output")->required();
  // The motor (SI). Every kind needs R and L; no-load, spin-down and step also Ke and J.
  c->add_option("--resistance", a->motor.resistance_ohm, "R [ohm] at the winding's starting temperature")
      ->required()->check(PositiveNumber());
  c->add_option("--inductance", a->motor.inductance_H, "L [H]")->required()->check(PositiveNumber());
  c->add_option("--brush-drop", a->motor.brush_drop_V, "Vb [V]")->check(NonNegativeNumber());
  c->add_option("--back-emf-constant", a->motor.back_emf_constant_V_s_per_rad,
                "Ke [V*s/rad] (no-load, spin-down, step)")
      ->check(PositiveNumber());
  c->add_option("--torque-constant", a->torque_constant, "Kt [N*m/A]; default Ke (ideal machine, SI)")
      ->check(PositiveNumber());
  c->add_option("--inertia", a->motor.inertia_kg_m2, "J [kg*m^2] (no-load, spin-down, step)")
      ->check(PositiveNumber());
  c->add_option("--viscous-friction", a->motor.viscous_friction_N_m_s_per_rad, "B [N*m*s/rad]")
      ->check(NonNegativeNumber());
  c->add_option("--coulomb-friction", a->motor.coulomb_friction_N_m, "Tc [N*m]")->check(NonNegativeNumber());
  // The test plan.
  c->add_option("--levels", a->levels_V,
                "Supply levels [V]: locked-rotor plateaus or no-load levels, e.g. --levels 2,4,6,-3")
      ->delimiter(',')
      ->check(FiniteNumber());
  c->add_option("--hold", a->hold_s, "Time at each level [s] (0.5 locked-rotor; no-load: until settled)")
      ->check(PositiveNumber());
  c->add_option("--step", a->step_spec,
                "FROM:TO supply volts, e.g. 0:12: locked-rotor, a step capture instead of plateaus; step, its levels");
  c->add_option("--before", a->before_s, "Time logged before the step [s] (default 1e-3)")->check(PositiveNumber());
  c->add_option("--after", a->after_s, "Time logged after the step [s] (1e-2 locked-rotor; step: until settled)")
      ->check(PositiveNumber());
  c->add_option("--settle", a->settle_s,
                "Step from FROM != 0: unlogged run at FROM before the log starts [s] (default: until settled)")
      ->check(PositiveNumber());
  c->add_option("--supply", a->supply_V, "Spin-down: supply voltage [V] of the run")->check(FiniteNumber());
  c->add_option("--run", a->run_s,
                "Spin-down: time at the supply before it is disconnected [s] (default: until settled)")
      ->check(PositiveNumber());
  c->add_option("--coast", a->coast_s, "Spin-down: time logged after the disconnection [s] (default: to rest)")
      ->check(PositiveNumber());
  c->add_option("--brake-resistance", a->brake_resistance_ohm,
                "Spin-down: coast through this resistance [ohm] across the terminals instead of open circuit")
      ->check(NonNegativeNumber());
  c->add_flag("--no-coast-voltage", a->no_coast_voltage, "Spin-down: no voltage column");
  c->add_flag("--no-coast-current", a->no_coast_current, "Spin-down: no current column");
  c->add_option("--sample-period", a->sample_period_s,
                "Logger sample period [s] (1e-3 plateaus, no-load, spin-down; 1e-5 locked-rotor step; "
                "step: 2e-5, or L/(R+R_s)/10 if shorter)")
      ->check(PositiveNumber());
  // The bench.
  c->add_option("--supply-resistance", a->bench.supply_resistance_ohm, "Supply internal resistance [ohm]")
      ->check(NonNegativeNumber());
  c->add_option("--voltage-noise", a->bench.voltage_noise_sigma_V, "Voltage noise sigma [V]")
      ->check(NonNegativeNumber());
  c->add_option("--current-noise", a->bench.current_noise_sigma_A, "Current noise sigma [A]")
      ->check(NonNegativeNumber());
  c->add_option("--speed-noise", a->speed_noise_sigma_rad_s, "Speed noise sigma [rad/s] at the logged shaft")
      ->check(NonNegativeNumber());
  c->add_option("--torque-noise", a->torque_noise_sigma_N_m, "Torque noise sigma [N*m]")->check(NonNegativeNumber());
  c->add_option("--voltage-lsb", a->bench.voltage_lsb_V, "Voltage ADC step [V]")->check(NonNegativeNumber());
  c->add_option("--current-lsb", a->bench.current_lsb_A, "Current ADC step [A]")->check(NonNegativeNumber());
  c->add_option("--temperature", a->bench.winding_temperature_degC, "Winding temperature at the start [degC]")
      ->check(WindingTemperature());
  c->add_option("--resistance-temperature", a->bench.resistance_reference_temperature_degC,
                "Temperature [degC] at which --resistance is given")
      ->check(WindingTemperature());
  c->add_option("--heating-per-plateau", a->bench.heating_per_plateau_K, "Winding temperature rise per level [K]")
      ->check(FiniteNumber());
  c->add_flag("--log-temperature", a->log_temperature, "Add a temperature [degC] column");
  c->add_flag("--log-torque", a->log_torque, "Locked-rotor plateaus: add a load-cell torque column, tau = Kt*i");
  c->add_option("--cpr", a->counts_per_rev,
                "An encoder of this many counts per revolution: log position [counts] instead of speed")
      ->check(WholeNumberFromTo(1, std::numeric_limits<int>::max()));
  c->add_option("--encoder-start-phase", a->encoder_start_phase,
                "Where the shaft rests within a count when the log starts, as a fraction of a count "
                "(default 0: exactly on an edge; a real shaft rests anywhere)")
      ->check(CLI::Validator(
          [](std::string& text) {
            const double phase = std::strtod(text.c_str(), nullptr);
            return phase >= 0.0 && phase < 1.0 ? std::string() : "must lie in [0, 1) of a count, got " + text;
          },
          "[0, 1)"));
  c->add_flag("--log-speed-and-position", a->log_speed_and_position, "Log both speed and position");
  c->add_option("--gear-ratio", a->gear_ratio,
                "Motor turns per output turn: speed and position read at the gearbox output")
      ->check(PositiveNumber());
  c->add_option("--seed", a->bench.seed, "Noise seed (same seed, same file)");
  DeclareArtefactOptions(c, &a->artefacts);
  // The file.
  c->add_option("--time-unit", a->style.time_unit, "s | ms | us");
  c->add_option("--voltage-unit", a->style.voltage_unit, "V | mV");
  c->add_option("--current-unit", a->style.current_unit, "A | mA");
  c->add_option("--speed-unit", a->style.speed_unit, "rad/s | rpm | rev/s");
  c->add_option("--position-unit", a->position_unit, "rad | deg | rev | counts (default counts with --cpr, else rad)");
  c->add_option("--torque-unit", a->style.torque_unit, "N*m | mN*m | oz*in | kgf*cm");
  c->add_option("--delimiter", a->delimiter, "',' ';' or tab");
  c->add_flag("--decimal-comma", a->style.decimal_comma, "Write 1,25 (needs --delimiter ';')");
  c->add_option("--header", a->rename_specs, "Header to write for a quantity, e.g. --header current=\"I_meas\"");
}

int RunSimulate(const SimulateArguments& a) {
  RequireOutputPath("--out", a.out_path);
  const Kind kind = KindOf(a.kind);
  RejectInapplicable(a, kind);
  RejectInapplicableArtefacts(a.artefacts, ScopeOf(a, kind));
  const model::MotorParameters motor = MotorFor(a, kind);
  const model::BenchConditions bench = BenchFor(a);
  output::CsvStyle style = StyleFor(a, bench);
  model::SampledLog log;
  try {
    if (kind == Kind::kLockedRotor) log = LockedRotorLog(a, motor, bench, style);
    if (kind == Kind::kNoLoad) log = NoLoadLog(a, motor, bench, style);
    if (kind == Kind::kSpinDown) log = SpinDownLog(a, motor, bench, style);
    if (kind == Kind::kStep) log = StepLog(a, motor, bench, style);
  } catch (const std::invalid_argument& e) {
    Bad(e.what());
  }
  if (kind != Kind::kLockedRotor) AddShaftNotes(bench, style);
  output::WriteBenchLogCsv(log, a.out_path, style);
  return kSuccess;
}

}  // namespace coilspin::cli
