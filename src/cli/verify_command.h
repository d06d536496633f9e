#pragma once
// `coilspin verify --datasheet SHEET.toml RESULT.json [RESULT.json ...]
//                  [--json OUT.json] [--csv OUT.csv] [--quiet]`:
// result files already written (one motor, or a lot: one per motor) checked
// against a supplier's datasheet (src/verify): the sheet against itself, each
// line of each motor with a decision that accounts for the interval, and the
// lot's statistics. Table on stdout; JSON (coilspin.verification/1) and CSV
// written atomically when asked.
//
// Exit status: 0 every line of every motor passes; 1 some line fails, is
// inconclusive or is not tested (stderr says which); 2 bad input (a bad
// datasheet or result file: the message names the file, line and key; nothing
// is written).

#include <CLI/CLI.hpp>
#include <iosfwd>
#include <optional>
#include <string>
#include <vector>

namespace coilspin::cli {

struct VerifyArguments {
  std::string datasheet_path;
  std::vector<std::string> result_paths;
  std::optional<std::string> json_path;  // --json; "-": standard output, instead of the table
  std::optional<std::string> csv_path;   // --csv; "-" likewise
  bool quiet = false;
};

void DeclareVerifyOptions(CLI::App* command, VerifyArguments* arguments);

int RunVerify(const VerifyArguments& arguments, std::ostream& out, std::ostream& err);

}  // namespace coilspin::cli
