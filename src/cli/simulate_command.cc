#include "src/cli/simulate_command.h"

#include <stdexcept>

#include "src/cli/exit_codes.h"
#include "src/cli/key_value.h"
#include "src/ingest/input_error.h"
#include "src/model/simulate_locked_rotor.h"

namespace coilspin::cli {
namespace {

// Defaults: a plateau logger at 1 kHz, a scope at 100 kHz.
constexpr double kPlateauSamplePeriod_s = 1e-3;
constexpr double kStepSamplePeriod_s = 10e-6;

[[noreturn]] void Bad(const std::string& message) {
  throw InputError(InputErrorKind::kBadOption, "", 0, 0, message);
}

char Delimiter(const std::string& text) {
  if (text == "," || text == "comma") return ',';
  if (text == ";" || text == "semicolon") return ';';
  if (text == "\t" || text == "tab") return '\t';
  Bad("--delimiter must be ',', ';' or tab, got '" + text + "'");
}

}  // namespace

void DeclareSimulateOptions(CLI::App* c, SimulateArguments* a) {
  c->add_option("kind", a->kind, "Test to simulate: locked-rotor")->required();
  c->add_option("--out", a->out_path, "CSV file to write (atomically)")->required();
  c->add_option("--resistance", a->motor.resistance_ohm, "R [ohm] at the winding's starting temperature")
      ->required()->check(CLI::PositiveNumber);
  c->add_option("--inductance", a->motor.inductance_H, "L [H]")->required()->check(CLI::PositiveNumber);
  c->add_option("--brush-drop", a->motor.brush_drop_V, "Vb [V]")->check(CLI::NonNegativeNumber);
  c->add_option("--levels", a->levels_V, "Supply levels [V] of the plateaus, e.g. --levels 2,4,6,-3")->delimiter(',');
  c->add_option("--hold", a->hold_s, "Time at each level [s]")->check(CLI::PositiveNumber);
  c->add_option("--step", a->step_spec, "A step capture instead of plateaus: FROM:TO supply volts, e.g. 0:12");
  c->add_option("--before", a->before_s, "Time logged before the step [s]")->check(CLI::PositiveNumber);
  c->add_option("--after", a->after_s, "Time logged after the step [s]")->check(CLI::PositiveNumber);
  c->add_option("--sample-period", a->sample_period_s, "Logger sample period [s] (1e-3 plateaus, 1e-5 step)")
      ->check(CLI::PositiveNumber);
  c->add_option("--supply-resistance", a->bench.supply_resistance_ohm, "Supply internal resistance [ohm]")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--voltage-noise", a->bench.voltage_noise_sigma_V, "Voltage noise sigma [V]")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--current-noise", a->bench.current_noise_sigma_A, "Current noise sigma [A]")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--voltage-lsb", a->bench.voltage_lsb_V, "Voltage ADC step [V]")->check(CLI::NonNegativeNumber);
  c->add_option("--current-lsb", a->bench.current_lsb_A, "Current ADC step [A]")->check(CLI::NonNegativeNumber);
  c->add_option("--temperature", a->bench.winding_temperature_degC, "Winding temperature at the start [degC]");
  c->add_option("--resistance-temperature", a->bench.resistance_reference_temperature_degC,
                "Temperature [degC] at which --resistance is given");
  c->add_option("--heating-per-plateau", a->bench.heating_per_plateau_K, "Winding temperature rise per level [K]");
  c->add_flag("--log-temperature", a->log_temperature, "Add a temperature [degC] column");
  c->add_option("--seed", a->bench.seed, "Noise seed (same seed, same file)");
  c->add_option("--time-unit", a->style.time_unit, "s | ms | us");
  c->add_option("--voltage-unit", a->style.voltage_unit, "V | mV");
  c->add_option("--current-unit", a->style.current_unit, "A | mA");
  c->add_option("--delimiter", a->delimiter, "',' ';' or tab");
  c->add_flag("--decimal-comma", a->style.decimal_comma, "Write 1,25 (needs --delimiter ';')");
  c->add_option("--header", a->rename_specs, "Header to write for a quantity, e.g. --header current=\"I_meas\"");
}

int RunSimulate(const SimulateArguments& a) {
  if (a.kind != "locked-rotor")
    Bad("simulate supports locked-rotor logs in this version of coilspin, got '" + a.kind + "'");
  output::CsvStyle style = a.style;
  style.delimiter = Delimiter(a.delimiter);
  style.header_for = ParseQuantityMap(a.rename_specs, "--header");
  std::string error;
  if (!style.IsValid(&error)) Bad(error);
  model::SampledLog log;
  try {
    if (!a.step_spec.empty()) {
      const auto colon = a.step_spec.find(':');
      if (colon == std::string::npos) Bad("--step expects FROM:TO volts, e.g. 0:12, got '" + a.step_spec + "'");
      model::StepPlan plan;
      plan.supply_before_V = std::stod(a.step_spec.substr(0, colon));
      plan.supply_after_V = std::stod(a.step_spec.substr(colon + 1));
      plan.before_s = a.before_s;
      plan.after_s = a.after_s;
      plan.sample_period_s = a.sample_period_s.value_or(kStepSamplePeriod_s);
      style.comment_lines.push_back("simulated locked-rotor step capture (coilspin simulate)");
      log = model::SimulateLockedRotorStep(a.motor, plan, a.bench);
    } else {
      if (a.levels_V.empty()) Bad("give --levels for plateaus or --step FROM:TO for a step capture");
      model::PlateauPlan plan;
      plan.supply_levels_V = a.levels_V;
      plan.hold_s = a.hold_s;
      plan.sample_period_s = a.sample_period_s.value_or(kPlateauSamplePeriod_s);
      plan.log_temperature = a.log_temperature;
      style.comment_lines.push_back("simulated locked-rotor plateaus (coilspin simulate)");
      log = model::SimulateLockedRotorPlateaus(a.motor, plan, a.bench);
    }
  } catch (const std::invalid_argument& e) {
    Bad(e.what());
  }
  output::WriteBenchLogCsv(log, a.out_path, style);
  return kSuccess;
}

}  // namespace coilspin::cli
