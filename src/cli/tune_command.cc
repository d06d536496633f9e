#include "src/cli/tune_command.h"

#include <ostream>

#include "src/cli/exit_codes.h"
#include "src/cli/number_checks.h"
#include "src/cli/output_path.h"
#include "src/ingest/input_error.h"
#include "src/output/atomic_file.h"
#include "src/output/tuning_report.h"
#include "src/result/model_parameters.h"
#include "src/result/result_reader.h"
#include "src/tune/tuning.h"
#include "src/units/constants.h"

namespace coilspin::cli {

void DeclareTuneOptions(CLI::App* c, TuneArguments* a) {
  c->add_option("result", a->result_path, "Result file of a fit (coilspin.result/2 or /1)")->required();
  c->add_option("--current-bandwidth", a->current_bandwidth_hz,
                "Current-loop bandwidth [Hz] (default 5/(2*pi*tau_e), tau_e = L/R)")
      ->check(PositiveNumber());
  c->add_option("--speed-bandwidth", a->speed_bandwidth_hz, "Speed-loop bandwidth [Hz] (default: current-loop / 10)")
      ->check(PositiveNumber());
  c->add_option("--loop-delay", a->loop_delay_s,
                "Delay [s] from measuring to the applied voltage in the drive (sampling, computation, PWM), "
                "e.g. 75e-6; it enters both phase margins as e^(-s*T) (default 0)")
      ->check(CLI::NonNegativeNumber);
  c->add_option("--json", a->json_path,
                "Write the tuning (coilspin.tuning/1) here, atomically; - writes it to standard output instead of "
                "the text");
  c->add_flag("--quiet", a->quiet, "Print nothing on success");
}

int RunTune(const TuneArguments& a, std::ostream& out, std::ostream& err) {
  if (a.json_path) RequireOutputPath("--json", *a.json_path);  // before any work (output_path.h)
  const result::ResultFile file = result::ReadResultFile(a.result_path);
  const MotorEstimate& e = file.estimate;
  const result::ModelParameters p = result::ModelParametersOf(e);
  if (!p.complete()) {
    err << "coilspin: tune needs R, L, Ke, Kt and J; the result does not determine:\n";
    for (const auto& [key, reason] : p.missing) err << "  " << key << ": " << reason << "\n";
    return kUndetermined;
  }
  tune::TuningRequest request;
  if (a.current_bandwidth_hz) request.current_bandwidth_rad_s = *a.current_bandwidth_hz * units::kRadiansPerRevolution;
  if (a.speed_bandwidth_hz) request.speed_bandwidth_rad_s = *a.speed_bandwidth_hz * units::kRadiansPerRevolution;
  request.loop_delay_s = a.loop_delay_s;
  const tune::Tuning t = tune::TuneCascade(e, p, request);
  if (t.speed.bandwidth_rad_s >= t.current.bandwidth_rad_s)
    throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                     "the speed-loop bandwidth must be below the current loop's (the speed loop commands the "
                     "current loop; a factor of 5-10 is usual)");
  const output::ExportSource source{a.result_path,
                                    file.format_version == 1 ? result::kResultFormat1 : result::kResultFormat2,
                                    e.motor_label, e.confidence};
  const bool json_on_stdout = a.json_path && output::IsStandardOutput(*a.json_path);
  if (a.json_path) output::WriteFileAtomically(*a.json_path, output::TuningJson(t, p.taken_as_zero, source));
  if (!a.quiet && !json_on_stdout) out << output::TuningText(t, p.taken_as_zero, source);
  return kSuccess;
}

}  // namespace coilspin::cli
