#pragma once
// `coilspin fit [SESSION.toml] [--locked-rotor FILE]... ...` (docs/cli.md).

#include <CLI/CLI.hpp>
#include <iosfwd>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/ingest/bench_log.h"
#include "src/verify/verification.h"

namespace coilspin::cli {

struct FitArguments {
  std::vector<std::string> session_paths;  // the positional session files (several only with --out-dir)
  std::string session_path;                // the one session of a single fit
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
  std::string current_sensors;            // "" | one | per-log (session [bench] current_sensors)
  std::vector<std::string> noise_specs;   // channel=sigma (SI)
  std::vector<std::string> column_specs;  // quantity=header
  std::vector<std::string> unit_specs;    // quantity=unit
  std::vector<std::string> required;      // parameter keys that must be determined
  std::optional<std::string> json_path;  // --json; "-": the result file on stdout (and no table there)
  std::string report_path;               // --report: the fit as a self-contained HTML page (src/output/html_report.h)
  std::string datasheet_path;            // --datasheet: verify the fitted motor against it
  std::optional<std::string> out_dir;    // --out-dir: a lot, one result file per session (batch_fit.h)
  bool quiet = false;
  bool verification_sets_status = true;  // false for the demo: its sheet fails a line on purpose
};

// Declares the fit options on `command` (a CLI11 subcommand).
void DeclareFitOptions(CLI::App* command, FitArguments* arguments);

// Runs the fit: table on `out` unless quiet or the result file goes to `out`
// (--json -), result file when asked (its path checked before any log is read).
// Throws InputError for bad input (nothing written); returns 0 or 1.
int RunFit(const FitArguments& arguments, std::ostream& out);

// `coilspin fit` as parsed: one session (or flags) → RunFit; several sessions,
// or --out-dir → the batch (batch_fit.h).
int RunFitCommand(FitArguments arguments, std::ostream& out);

// One motor's fit and, with a datasheet, its verification; what RunFit and
// the batch share. `result_name` names the motor in the verification.
struct FitOutcome {
  MotorEstimate estimate;
  // A --require key or log, and the sentence that says why the exit status is 1.
  std::vector<std::pair<std::string, std::string>> undetermined;
  std::optional<verify::Verification> verification;
  // With --report: the logs as fitted (estimate.tests name them by path), and the
  // estimate holds its model traces.
  std::vector<BenchLog> logs;
};
FitOutcome FitOneMotor(const FitArguments& arguments, const verify::Datasheet* sheet, const std::string& result_name);

// The result file's text (with the verification block when there is one).
std::string ResultText(const FitOutcome& outcome);

// The report page (--report) of a fit made with report_path set.
std::string ReportText(const FitOutcome& outcome);

// Why the exit status is 1, one line each ("inductance not determined: ...",
// "datasheet line no_load_speed: fail"); empty when it is 0.
std::vector<std::string> StatusReasons(const FitOutcome& outcome, bool verification_sets_status);

}  // namespace coilspin::cli
