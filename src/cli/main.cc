// coilspin: identifies the parameters of a permanent-magnet DC motor from
// bench logs. This file is the only place that maps failures to exit codes.

#include <CLI/CLI.hpp>
#include <csignal>
#include <cstdlib>
#include <iostream>
#include <new>

#include "src/cli/consistency_command.h"
#include "src/cli/demo_session.h"
#include "src/cli/exit_codes.h"
#include "src/cli/export_command.h"
#include "src/cli/fit_command.h"
#include "src/cli/simulate_command.h"
#include "src/cli/unknown_option.h"
#include "src/cli/tune_command.h"
#include "src/cli/verify_command.h"
#include "src/ingest/input_error.h"

int main(int argc, char** argv) {
  using namespace coilspin;
  CLI::App app{"coilspin: permanent-magnet DC motor parameters from bench logs, with confidence intervals"};
  app.require_subcommand(1);
  app.set_version_flag("--version", "coilspin 0.1.0");
  app.set_help_all_flag("--help-all", "Print the help of every command and exit (the manual page is made from it)");

  cli::FitArguments fit;
  CLI::App* fit_command = app.add_subcommand("fit", "Fit motor parameters to bench logs");
  cli::DeclareFitOptions(fit_command, &fit);

  cli::FitArguments demo;
  CLI::App* demo_command = app.add_subcommand(
      "demo", "Fit the bundled demo motor, print its parameter table and verify it against the demo datasheet");
  demo_command->add_option("--json", demo.json_path,
                           "Also write the result file here; - writes it to standard output instead of the table");
  demo_command->add_option("--report", demo.report_path,
                           "Also write the fit as one self-contained HTML page here (opens offline)");

  cli::SimulateArguments simulate;
  CLI::App* simulate_command = app.add_subcommand("simulate", "Write a synthetic bench log from a parameter set");
  cli::DeclareSimulateOptions(simulate_command, &simulate);

  cli::ConsistencyArguments consistency;
  CLI::App* consistency_command =
      app.add_subcommand("consistency", "Check a datasheet's torque and back-EMF constants against Kt = Ke (SI)");
  cli::DeclareConsistencyOptions(consistency_command, &consistency);

  cli::ExportArguments export_arguments;
  CLI::App* export_command =
      app.add_subcommand("export", "Write a fitted motor for other tools: SPICE, state-space, C++ header, CSV");
  cli::DeclareExportOptions(export_command, &export_arguments);

  cli::VerifyArguments verify;
  CLI::App* verify_command = app.add_subcommand(
      "verify", "Verify result files (one motor or a lot) against a supplier's datasheet, line by line");
  cli::DeclareVerifyOptions(verify_command, &verify);

  cli::TuneArguments tune;
  CLI::App* tune_command =
      app.add_subcommand("tune", "PI gains of a drive's current and speed loops for a fitted motor");
  cli::DeclareTuneOptions(tune_command, &tune);

  // A reader that closes the pipe early (`coilspin fit ... --json - | head`) makes a write fail, not a signal.
  std::signal(SIGPIPE, SIG_IGN);
  if (const auto unknown = cli::UnknownOptionMessage(app, argc, argv)) {
    std::cerr << "coilspin: error: " << *unknown << "\n";
    return cli::kBadInput;
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? cli::kSuccess : cli::kBadInput;
  }
  try {
    if (*fit_command) return cli::RunFitCommand(fit, std::cout);
    if (*demo_command) {
      demo.session_path = cli::DemoSessionPath();
      demo.datasheet_path = cli::DemoDatasheetPath();
      demo.verification_sets_status = false;  // the demo's sheet fails a line on purpose
      std::cerr << "coilspin demo: fitting " << demo.session_path << "\n";
      return cli::RunFit(demo, std::cout);
    }
    if (*verify_command) return cli::RunVerify(verify, std::cout, std::cerr);
    if (*simulate_command) return cli::RunSimulate(simulate);
    if (*consistency_command) return cli::RunConsistency(consistency, std::cout);
    if (*export_command) return cli::RunExport(export_arguments, std::cout, std::cerr);
    if (*tune_command) return cli::RunTune(tune, std::cout, std::cerr);
  } catch (const InputError& e) {
    std::cerr << "coilspin: error: " << e.what() << "\n";
    return cli::kBadInput;
  } catch (const std::runtime_error& e) {  // a file that could not be written
    std::cerr << "coilspin: error: " << e.what() << "\n";
    return cli::kBadInput;
  } catch (const std::bad_alloc&) {  // the memory check before a fit (fit_command.cc) keeps this rare
    std::cerr << "coilspin: error: out of memory; give smaller logs or free memory\n";
    return cli::kBadInput;
  } catch (const std::exception& e) {  // a bug: every input problem is an InputError; still no abort
    std::cerr << "coilspin: internal error: " << e.what() << " (please report it with the command and its input)\n";
    return cli::kBadInput;
  }
  return cli::kBadInput;
}
