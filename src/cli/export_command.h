#pragma once
// `coilspin export RESULT.json --format spice|state-space|c-header|csv --out FILE [--name NAME]`:
// hands a fitted motor to other tools (docs/exports.md). Reads a result file of
// format 1 or 2; writes FILE atomically.
//
// Exit status: 0 written; 1 the result does not determine what the format needs
// (e.g. the inertia for a SPICE model; the reason goes to stderr, nothing is
// written); 2 bad input (an unreadable or malformed result file, a bad option).

#include <CLI/CLI.hpp>
#include <iosfwd>
#include <string>

namespace coilspin::cli {

struct ExportArguments {
  std::string result_path;
  std::string format;    // spice | state-space | c-header | csv
  std::string out_path;
  std::string name;      // subcircuit / namespace name; default from the motor label
};

void DeclareExportOptions(CLI::App* command, ExportArguments* arguments);

// Throws InputError for bad input; returns 0 or 1.
int RunExport(const ExportArguments& arguments, std::ostream& out, std::ostream& err);

}  // namespace coilspin::cli
