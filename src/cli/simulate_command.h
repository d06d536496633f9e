#pragma once
// `coilspin simulate locked-rotor ...`: writes a synthetic bench log from a
// parameter set, for demos, tests and for trying the tool without a bench.

#include <CLI/CLI.hpp>
#include <optional>
#include <string>
#include <vector>

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/output/bench_log_csv.h"

namespace coilspin::cli {

struct SimulateArguments {
  std::string kind = "locked-rotor";
  std::string out_path;
  model::MotorParameters motor;
  model::BenchConditions bench;
  std::vector<double> levels_V;       // plateaus
  double hold_s = 0.5;
  std::string step_spec;              // "FROM:TO" volts: a step capture instead of plateaus
  double before_s = 1e-3;
  double after_s = 10e-3;
  std::optional<double> sample_period_s;
  bool log_temperature = false;
  output::CsvStyle style;
  std::string delimiter = ",";
  std::vector<std::string> rename_specs;  // quantity=header
};

void DeclareSimulateOptions(CLI::App* command, SimulateArguments* arguments);

// Throws InputError for bad options; nothing is written then.
int RunSimulate(const SimulateArguments& arguments);

}  // namespace coilspin::cli
