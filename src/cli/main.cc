// coilspin: identifies the parameters of a permanent-magnet DC motor from
// bench logs. This file is the only place that maps failures to exit codes.

#include <CLI/CLI.hpp>
#include <csignal>
#include <cstdlib>
#include <iostream>
#include <new>

#include "src/cli/consistency_command.h"
#include "src/cli/exit_codes.h"
#include "src/cli/fit_command.h"
#include "src/cli/simulate_command.h"
#include "src/cli/unknown_option.h"
#include "src/ingest/input_error.h"

namespace {

// The demo session shipped in datasets-demo/ (COILSPIN_DEMO_DIR overrides the built-in path).
std::string DemoSession() {
  const char* folder = std::getenv("COILSPIN_DEMO_DIR");
  return std::string(folder ? folder : COILSPIN_DEMO_DIR) + "/session.toml";
}

}  // namespace

int main(int argc, char** argv) {
  using namespace coilspin;
  CLI::App app{"coilspin: permanent-magnet DC motor parameters from bench logs, with confidence intervals"};
  app.require_subcommand(1);
  app.set_version_flag("--version", "coilspin 0.1.0");

  cli::FitArguments fit;
  CLI::App* fit_command = app.add_subcommand("fit", "Fit motor parameters to bench logs");
  cli::DeclareFitOptions(fit_command, &fit);

  cli::FitArguments demo;
  CLI::App* demo_command = app.add_subcommand("demo", "Fit the bundled demo motor and print its parameter table");
  demo_command->add_option("--json", demo.json_path,
                           "Also write the result file here; - writes it to standard output instead of the table");

  cli::SimulateArguments simulate;
  CLI::App* simulate_command = app.add_subcommand("simulate", "Write a synthetic bench log from a parameter set");
  cli::DeclareSimulateOptions(simulate_command, &simulate);

  cli::ConsistencyArguments consistency;
  CLI::App* consistency_command =
      app.add_subcommand("consistency", "Check a datasheet's torque and back-EMF constants against Kt = Ke (SI)");
  cli::DeclareConsistencyOptions(consistency_command, &consistency);

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
    if (*fit_command) return cli::RunFit(fit, std::cout);
    if (*demo_command) {
      demo.session_path = DemoSession();
      return cli::RunFit(demo, std::cout);
    }
    if (*simulate_command) return cli::RunSimulate(simulate);
    if (*consistency_command) return cli::RunConsistency(consistency, std::cout);
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
