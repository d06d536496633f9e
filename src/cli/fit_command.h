#pragma once
// `coilspin fit [SESSION.toml] [--locked-rotor FILE]... ...` (docs/cli.md).

#include <CLI/CLI.hpp>
#include <iosfwd>
#include <optional>
#include <string>
#include <vector>

namespace coilspin::cli {

struct FitArguments {
  std::string session_path;
  std::vector<std::string> locked_rotor_files;
  std::vector<std::string> no_load_files;
  std::vector<std::string> spin_down_files;
  std::vector<std::string> step_files;
  std::optional<double> counts_per_rev;
  std::optional<double> gear_ratio;
  std::optional<double> winding_temperature_degC;
  std::optional<double> reference_temperature_degC;
  std::optional<double> known_inertia_kg_m2;
  std::optional<double> confidence;
  std::optional<double> at_voltage_V;
  std::optional<double> tolerance;
  std::string intervals = "wald";         // wald | profile | bootstrap
  std::optional<int> replicates;          // bootstrap
  std::optional<unsigned long long> seed; // bootstrap
  std::string robust;                     // "" | huber | cauchy
  std::vector<std::string> noise_specs;   // channel=sigma (SI)
  std::vector<std::string> column_specs;  // quantity=header
  std::vector<std::string> unit_specs;    // quantity=unit
  std::vector<std::string> required;      // parameter keys that must be determined
  std::optional<std::string> json_path;  // "-": the result file on stdout (and no table there)
  bool quiet = false;
};

// Declares the fit options on `command` (a CLI11 subcommand).
void DeclareFitOptions(CLI::App* command, FitArguments* arguments);

// Runs the fit: table on `out` unless quiet or the result file goes to `out`
// (--json -), result file when asked (its path checked before any log is read).
// Throws InputError for bad input (nothing written); returns 0 or 1.
int RunFit(const FitArguments& arguments, std::ostream& out);

}  // namespace coilspin::cli
