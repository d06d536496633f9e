#pragma once
// `coilspin simulate locked-rotor|no-load|spin-down|step ...`: writes a
// synthetic bench log from a parameter set, for demos, tests and for trying
// the tool without a bench. `step` is the free-shaft voltage step
// (src/model/simulate_step.h).
//
// Motor parameters may be given for any kind (one parameter set serves every
// test); each kind requires those its bench needs (locked-rotor: R, L;
// no-load, spin-down and step also Ke and J; a torque column Kt or Ke) and Kt
// defaults to Ke. Test-plan and readout options that do not apply to the kind
// are rejected rather than ignored.

#include <CLI/CLI.hpp>
#include <optional>
#include <string>
#include <vector>

#include "src/cli/simulate_artefact_options.h"
#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/output/bench_log_csv.h"

namespace coilspin::cli {

struct SimulateArguments {
  std::string kind = "locked-rotor";
  std::string out_path;
  model::MotorParameters motor;              // Kt comes from torque_constant, or Ke
  std::optional<double> torque_constant;     // Kt [N·m/A]
  model::BenchConditions bench;
  std::vector<double> levels_V;              // locked-rotor plateaus, no-load levels
  std::optional<double> hold_s;              // 0.5 s locked-rotor; no-load: the settling time
  std::string step_spec;                     // "FROM:TO" volts: locked-rotor step capture; step: V_0:V_1
  std::optional<double> before_s;            // logged before the step: 1 ms
  std::optional<double> after_s;             // logged after it: 10 ms locked-rotor; step: the settling time
  std::optional<double> settle_s;            // step from V_0 != 0: unlogged run at V_0, default the settling time
  std::optional<double> sample_period_s;
  bool log_temperature = false;
  bool log_torque = false;                   // locked-rotor plateaus: a load-cell torque column
  std::optional<double> supply_V;            // spin-down run voltage
  std::optional<double> run_s;               // spin-down: default the settling time
  std::optional<double> coast_s;             // spin-down: default from the stop time
  std::optional<double> brake_resistance_ohm;  // spin-down: coast through R_brake, not open
  bool no_coast_voltage = false;             // spin-down: leave out the voltage column
  bool no_coast_current = false;             // spin-down: leave out the current column
  std::optional<int> counts_per_rev;         // an encoder: log position in counts instead of speed
  std::optional<double> encoder_start_phase;  // where the shaft rests within a count at the start, [0, 1)
  bool log_speed_and_position = false;
  std::optional<double> gear_ratio;
  std::optional<double> speed_noise_sigma_rad_s;
  std::optional<double> torque_noise_sigma_N_m;
  std::optional<std::string> position_unit;
  output::CsvStyle style;
  std::string delimiter = ",";
  std::vector<std::string> rename_specs;  // quantity=header
  ArtefactArguments artefacts;            // a real rig's artefacts (src/cli/simulate_artefact_options.h)
};

void DeclareSimulateOptions(CLI::App* command, SimulateArguments* arguments);

// Throws InputError (kBadOption) for bad or inapplicable options; nothing is written then.
int RunSimulate(const SimulateArguments& arguments);

}  // namespace coilspin::cli
