#pragma once
// `coilspin consistency --kt "2.2 oz*in/A" --ke "1.6 V/krpm"` (or --kv "850 rpm/V"):
// checks a datasheet's torque and back-EMF (or speed) constants against
// Kt = Ke in SI, and names the brushless convention or unit slip that explains
// a mismatch (docs/methods.md, "Kt/Ke consistency").
//
// Exit status: 0 consistent, 1 inconsistent (the result file still written when
// asked), 2 bad input (InputError kBadOption; nothing written).

#include <CLI/CLI.hpp>
#include <iosfwd>
#include <optional>
#include <string>

namespace coilspin::cli {

struct ConsistencyArguments {
  std::string torque_constant;      // --kt, as written
  std::string back_emf_constant;    // --ke, as written
  std::string speed_constant;       // --kv, as written
  std::optional<double> tolerance;  // --tolerance
  std::optional<std::string> json_path;  // --json ("-": standard output, instead of the report)
};

// Declares the consistency options on `command` (a CLI11 subcommand).
void DeclareConsistencyOptions(CLI::App* command, ConsistencyArguments* arguments);

// Prints the constants in SI, the ratio, the verdict and the explanation on `out`;
// writes the result file (coilspin.consistency/1) when asked. Throws InputError
// for bad input before anything is written; returns 0 or 1.
int RunConsistency(const ConsistencyArguments& arguments, std::ostream& out);

}  // namespace coilspin::cli
