#pragma once
// `coilspin tune RESULT.json [--current-bandwidth HZ] [--speed-bandwidth HZ] [--loop-delay S] [--json OUT.json]`:
// PI gains of a drive's current and speed loops for the fitted motor, with
// their intervals and phase margins (src/tune, docs/exports.md).
//
// Exit status: 0 done; 1 the result does not determine R, L, Ke, Kt and J (the
// reason goes to stderr, nothing is written); 2 bad input.

#include <CLI/CLI.hpp>
#include <iosfwd>
#include <optional>
#include <string>

namespace coilspin::cli {

struct TuneArguments {
  std::string result_path;
  std::optional<double> current_bandwidth_hz;
  std::optional<double> speed_bandwidth_hz;
  double loop_delay_s = 0.0;
  std::optional<std::string> json_path;  // --json; "-": standard output, instead of the text
  bool quiet = false;
};

void DeclareTuneOptions(CLI::App* command, TuneArguments* arguments);

int RunTune(const TuneArguments& arguments, std::ostream& out, std::ostream& err);

}  // namespace coilspin::cli
