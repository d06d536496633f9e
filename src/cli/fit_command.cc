#include "src/cli/fit_command.h"

#include <algorithm>
#include <charconv>
#include <cstdlib>
#include <iostream>
#include <ostream>
#include <stdexcept>

#include "fitters/joint/motor_fit.h"
#include "src/cli/batch_fit.h"
#include "src/cli/exit_codes.h"
#include "src/cli/key_value.h"
#include "src/cli/memory_check.h"
#include "src/cli/number_checks.h"
#include "src/cli/output_path.h"
#include "src/cli/progress_printer.h"
#include "src/cli/report_file.h"
#include "src/cli/session_file.h"
#include "src/ingest/input_error.h"
#include "src/ingest/outliers.h"
#include "src/ingest/read_bench_log.h"
#include "src/output/atomic_file.h"
#include "src/output/html_report.h"
#include "src/output/parameter_table.h"
#include "src/output/result_json.h"
#include "src/output/verification_json.h"
#include "src/output/verification_table.h"
#include "src/verify/datasheet_file.h"

namespace coilspin::cli {
namespace {

struct PlannedTest {
  TestKind kind;
  std::string path;
  ReadOptions read;
  std::string shown_path;  // how the result names the log: as the user wrote it
};

// The shortest text that reads back as the same double (so a setting keeps
// every digit the user gave).
std::string Text(double value) {
  char buffer[32];
  const auto written = std::to_chars(buffer, buffer + sizeof buffer, value);
  return std::string(buffer, written.ptr);
}

template <typename T>
std::optional<T> FirstOf(const std::optional<T>& flag, const std::optional<T>& session) {
  return flag ? flag : session;
}

}  // namespace

void DeclareFitOptions(CLI::App* c, FitArguments* a) {
  c->add_option("session", a->session_paths,
                "Session file (TOML) naming the motor, bench settings and test logs; several with --out-dir")
      ->check(CLI::ExistingFile);
  c->add_option("--locked-rotor", a->locked_rotor_files, "Locked-rotor log (plateaus or a step capture); repeatable");
  c->add_option("--no-load", a->no_load_files, "No-load log (free shaft, settled supply levels); repeatable");
  c->add_option("--spin-down", a->spin_down_files, "Spin-down log (run up, then an open-circuit coast); repeatable");
  c->add_option("--step", a->step_files, "Free-shaft voltage step log; repeatable");
  c->add_option("--cpr", a->counts_per_rev, "Encoder counts per revolution, for position [counts]")
      ->check(PositiveNumber());
  c->add_option("--gear-ratio", a->gear_ratio, "Motor turns per output turn when speed is read at a gearbox output")
      ->check(PositiveNumber());
  c->add_option("--winding-temperature", a->winding_temperature_degC,
                "Winding temperature during the locked-rotor test [degC], when not logged")
      ->check(WindingTemperature());
  c->add_option("--reference-temperature", a->reference_temperature_degC,
                "Temperature [degC] to which resistance is corrected")
      ->check(WindingTemperature());
  c->add_option("--known-inertia", a->known_inertia_kg_m2, "Inertia of the rotating assembly [kg*m^2], when known")
      ->check(PositiveNumber());
  c->add_option("--at-voltage", a->at_voltage_V,
                "Operating voltage [V] of the derived quantities (default: the highest settled level logged)")
      ->check(PositiveNumber());
  c->add_option("--tolerance", a->tolerance, "Kt/Ke consistency tolerance, e.g. 0.05 for 1 +/- 5 %")
      ->check(OpenInterval(0.0, 1.0));
  c->add_option("--confidence", a->confidence, "Two-sided interval level, e.g. 0.95")
      ->check(OpenInterval(0.0, 1.0));
  c->add_option("--intervals", a->intervals,
                "Interval method: wald (default; Student-t, widened for autocorrelated residuals), profile "
                "(profile likelihood), bootstrap (moving-block, percentile)")
      ->check(CLI::IsMember({"wald", "profile", "bootstrap"}));
  c->add_option("--replicates", a->replicates, "Bootstrap replicates (default 200)")
      ->check(WholeNumberFromTo(10, 100000));
  c->add_option("--seed", a->seed, "Bootstrap seed (fixed by default, so results are reproducible)");
  c->add_option("--robust", a->robust, "Robust loss for logs with spikes: huber or cauchy (reported in the result)")
      ->check(CLI::IsMember({"huber", "cauchy"}));
  c->add_option("--current-sensors", a->current_sensors,
                "one (default): every log's current comes through one sensor, whose zero reading seen in one log "
                "corrects all; per-log: the logs' current sensors differ")
      ->check(CLI::IsMember({"one", "per-log"}));
  c->add_option("--noise", a->noise_specs,
                "Noise sigma of a logged channel, in SI units, instead of the one estimated from the data, e.g. "
                "--noise current=0.004 (applies to channels fitted sample by sample); repeatable");
  c->add_option("--column", a->column_specs,
                "Header of a column that does not follow 'quantity [unit]', e.g. --column speed=\"Tach (RPM)\"");
  c->add_option("--unit", a->unit_specs, "Unit of a quantity whose header names none, e.g. --unit current=mA");
  c->add_option("--require", a->required,
                "Parameter that must be determined (else exit status 1), e.g. --require inductance");
  c->add_option("--json", a->json_path,
                "Write the result file (coilspin.result/2) here, atomically; - writes it to standard output "
                "instead of the table");
  c->add_option("--report", a->report_path,
                "Write the fit as one self-contained HTML page here (parameters, charts of every log with the "
                "fitted model and residuals, torque-speed line, correlations, warnings); it opens offline");
  c->add_option("--datasheet", a->datasheet_path,
                "Verify the fitted motor against this datasheet (TOML): the table gains a verification section, "
                "the result file a \"verification\" block; exit status 1 when a line does not pass");
  c->add_option("--out-dir", a->out_dir,
                "Fit every session given (a lot of motors) on all cores, one result file per session in this "
                "folder, named after the session file");
  c->add_flag("--quiet", a->quiet, "Print no table");
}

FitOutcome FitOneMotor(const FitArguments& a, const verify::Datasheet* sheet, const std::string& result_name) {
  std::optional<Session> session;
  if (!a.session_path.empty()) session = LoadSession(a.session_path);

  ReadOptions flag_read;
  flag_read.column_for = ParseQuantityMap(a.column_specs, "--column");
  flag_read.unit_for = ParseQuantityMap(a.unit_specs, "--unit");
  flag_read.counts_per_rev = FirstOf(a.counts_per_rev, session ? session->counts_per_rev : std::nullopt);
  flag_read.gear_ratio = FirstOf(a.gear_ratio, session ? session->gear_ratio : std::nullopt).value_or(1.0);

  std::vector<PlannedTest> planned;
  if (session) {
    for (const auto& t : session->tests) {
      ReadOptions read = flag_read;
      for (const auto& [q, name] : t.column_for) read.column_for[q] = name;
      for (const auto& [q, unit] : t.unit_for) read.unit_for[q] = unit;
      planned.push_back({t.kind, t.path, read, t.written_path});
    }
  }
  const std::pair<TestKind, const std::vector<std::string>*> flagged[] = {
      {TestKind::kLockedRotor, &a.locked_rotor_files},
      {TestKind::kNoLoad, &a.no_load_files},
      {TestKind::kSpinDown, &a.spin_down_files},
      {TestKind::kStep, &a.step_files}};
  for (const auto& [kind, files] : flagged)
    for (const auto& f : *files) planned.push_back({kind, f, flag_read, f});
  if (planned.empty())
    throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                     "no test logs given: name a session file or use --locked-rotor FILE");
  joint::MotorFitOptions options;
  options.motor_label = session ? session->motor_label : "";
  options.confidence = FirstOf(a.confidence, session ? session->confidence : std::nullopt).value_or(0.95);
  options.locked_rotor.winding_temperature_degC =
      FirstOf(a.winding_temperature_degC, session ? session->winding_temperature_degC : std::nullopt);
  options.locked_rotor.reference_temperature_degC =
      FirstOf(a.reference_temperature_degC, session ? session->reference_temperature_degC : std::nullopt);
  options.known_inertia_kg_m2 = FirstOf(a.known_inertia_kg_m2, session ? session->known_inertia_kg_m2 : std::nullopt);
  options.at_voltage_V = a.at_voltage_V;
  options.counts_per_rev = flag_read.counts_per_rev;
  options.gear_ratio = flag_read.gear_ratio;
  if (a.tolerance) options.consistency_tolerance = *a.tolerance;
  options.intervals.method = joint::IntervalMethodFromString(a.intervals).value_or(joint::IntervalMethod::kWald);
  if (a.replicates) options.intervals.replicates = *a.replicates;
  if (a.seed) options.intervals.seed = *a.seed;
  if ((a.replicates || a.seed) && options.intervals.method != joint::IntervalMethod::kBootstrap)
    throw InputError(InputErrorKind::kBadOption, "", 0, 0, "--replicates and --seed apply to --intervals bootstrap only");
  if (!a.robust.empty()) options.loss = *core::RobustLossFromString(a.robust);
  const std::string current_sensors =
      !a.current_sensors.empty() ? a.current_sensors : session && session->current_sensors ? *session->current_sensors : "one";
  options.one_current_sensor = current_sensors == "one";
  options.keep_model_traces = !a.report_path.empty();
  std::vector<std::pair<std::string, std::string>> estimate_settings_noise;
  for (const auto& [quantity, text] : ParseQuantityMap(a.noise_specs, "--noise")) {
    char* end = nullptr;
    const double sigma = std::strtod(text.c_str(), &end);
    if (text.empty() || end != text.c_str() + text.size())
      throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                       "--noise " + std::string(units::QuantityName(quantity)) + "=" + text +
                           ": expected a number in SI units (A, V, rad/s, rad)");
    options.noise.push_back({std::string(units::QuantityName(quantity)), sigma});
    estimate_settings_noise.push_back({"noise_" + std::string(units::QuantityName(quantity)), Text(sigma)});
  }
  std::string error;
  if (!options.IsValid(&error)) throw InputError(InputErrorKind::kBadOption, "", 0, 0, error);
  const std::vector<std::string> known = joint::RequirableKeys();
  for (const auto& key : a.required)
    if (std::find(known.begin(), known.end(), key) == known.end()) {
      std::string list;
      for (const auto& k : known) list += (list.empty() ? "" : ", ") + k;
      throw InputError(InputErrorKind::kBadOption, "", 0, 0, "--require " + key + ": no such key; a result holds " + list);
    }

  std::vector<PlannedLog> sizes;
  for (const auto& p : planned) sizes.push_back({p.path, p.kind});
  RequireMemoryForLogs(sizes, AvailableMemoryBytes());  // before a log is read (memory_check.h)

  std::optional<ProgressPrinter> progress;  // stderr, silent with --quiet
  if (!a.quiet) {
    progress.emplace(std::cerr, ProgressPrinter::StderrIsTerminal());
    options.progress = progress->Callback();
  }
  std::vector<joint::TestLog> logs;
  const int num_logs = static_cast<int>(planned.size());
  for (const auto& p : planned) {
    if (progress) progress->Report("reading " + p.shown_path, static_cast<int>(logs.size()), num_logs);
    BenchLog log = ReadBenchLog(p.path, p.read);
    SetAsideOutliers(&log);
    RequireForTest(log, p.kind);
    log.path = p.shown_path;
    logs.push_back({p.kind, std::move(log)});
  }

  MotorEstimate estimate = joint::FitMotor(logs, options);
  if (progress) progress->Finish();
  estimate.settings.insert(estimate.settings.end(), estimate_settings_noise.begin(), estimate_settings_noise.end());
  estimate.settings.push_back({"confidence", Text(options.confidence)});
  estimate.settings.push_back({"intervals", a.intervals});
  if (options.intervals.method == joint::IntervalMethod::kBootstrap) {
    estimate.settings.push_back({"bootstrap_replicates", std::to_string(options.intervals.replicates)});
    estimate.settings.push_back({"bootstrap_seed", std::to_string(options.intervals.seed)});
  }
  estimate.settings.push_back({"robust_loss", a.robust.empty() ? "none" : a.robust});
  estimate.settings.push_back({"current_sensors", current_sensors});
  if (options.locked_rotor.winding_temperature_degC)
    estimate.settings.push_back({"winding_temperature_degC", Text(*options.locked_rotor.winding_temperature_degC)});
  if (options.locked_rotor.reference_temperature_degC)
    estimate.settings.push_back({"reference_temperature_degC", Text(*options.locked_rotor.reference_temperature_degC)});
  if (flag_read.counts_per_rev) estimate.settings.push_back({"encoder_cpr", Text(*flag_read.counts_per_rev)});
  estimate.settings.push_back({"gear_ratio", Text(flag_read.gear_ratio)});
  if (options.known_inertia_kg_m2) estimate.settings.push_back({"known_inertia_kg_m2", Text(*options.known_inertia_kg_m2)});
  if (options.at_voltage_V) estimate.settings.push_back({"at_voltage_V", Text(*options.at_voltage_V)});
  estimate.settings.push_back({"consistency_tolerance", Text(options.consistency_tolerance)});

  std::vector<std::string> required = a.required;
  for (const auto& p : planned) {  // what each test is for
    if (p.kind == TestKind::kLockedRotor) required.push_back("resistance");
    if (p.kind == TestKind::kNoLoad) required.push_back("back_emf_constant");
    if (p.kind == TestKind::kSpinDown) required.push_back("viscous_over_inertia");
  }
  FitOutcome outcome;
  const auto present = [&](const std::string& key) {
    for (const auto* section : {&estimate.parameters, &estimate.ratios, &estimate.derived})
      for (const auto& q : *section)
        if (q.key == key) return true;
    return false;
  };
  for (const auto& key : required) {
    if (present(key) || std::find_if(outcome.undetermined.begin(), outcome.undetermined.end(),
                                     [&](const auto& u) { return u.first == key; }) != outcome.undetermined.end())
      continue;
    std::string reason = "the given tests do not determine it";
    for (const auto& [missing, why] : estimate.not_identified)
      if (missing == key) reason = why;
    outcome.undetermined.push_back({key, key + " not determined: " + reason});
  }
  for (const auto& t : estimate.tests)  // a test given that added nothing to the fit
    if (!t.contributed)
      outcome.undetermined.push_back(
          {t.file, t.file + ": the " + t.kind + " log contributed nothing to the fit (" + t.method + ")"});
  if (sheet) outcome.verification = verify::Verify(*sheet, {{result_name, estimate}});
  outcome.estimate = std::move(estimate);
  if (!a.report_path.empty())
    for (auto& t : logs) outcome.logs.push_back(std::move(t.log));
  return outcome;
}

std::string ResultText(const FitOutcome& o) {
  if (!o.verification) return output::ResultJson(o.estimate);
  return output::ResultJson(o.estimate, output::ResultVerificationBlock(*o.verification));
}

std::vector<std::string> StatusReasons(const FitOutcome& o, bool verification_sets_status) {
  std::vector<std::string> reasons;
  for (const auto& [what, sentence] : o.undetermined) reasons.push_back(sentence);
  if (o.verification && verification_sets_status)
    for (const verify::MotorCheck& m : o.verification->motors)
      for (const verify::LineCheck& c : m.lines)
        if (c.decision.verdict != verify::Verdict::kPass)
          reasons.push_back("datasheet line " + c.key + ": " + std::string(verify::VerdictName(c.decision.verdict)));
  return reasons;
}

std::string ReportText(const FitOutcome& o) {
  std::vector<const BenchLog*> logs;  // the log of each test, by the path the test names
  std::vector<bool> taken(o.logs.size(), false);
  for (const TestSummary& t : o.estimate.tests) {
    const BenchLog* found = nullptr;
    for (std::size_t k = 0; k < o.logs.size() && !found; ++k)
      if (!taken[k] && o.logs[k].path == t.file) {
        taken[k] = true;
        found = &o.logs[k];
      }
    logs.push_back(found);
  }
  return output::HtmlReport(o.estimate, logs, o.verification ? &*o.verification : nullptr);
}

int RunFit(const FitArguments& a, std::ostream& out) {
  if (a.json_path) RequireOutputPath("--json", *a.json_path);  // before any work (output_path.h)
  std::optional<verify::Datasheet> sheet;  // read first: a bad sheet stops before any fit
  if (!a.datasheet_path.empty()) sheet = verify::LoadDatasheet(a.datasheet_path);
  if (!a.report_path.empty()) CheckReportTarget(a.report_path);  // before the fit, too
  const bool json_on_stdout = a.json_path && output::IsStandardOutput(*a.json_path);
  const std::string name = a.json_path && !json_on_stdout ? *a.json_path
                           : !a.session_path.empty()      ? a.session_path
                                                          : "this fit";
  const FitOutcome outcome = FitOneMotor(a, sheet ? &*sheet : nullptr, name);
  if (json_on_stdout) {
    out << ResultText(outcome);
    if (!out.flush()) throw std::runtime_error("cannot write the result to standard output");
  } else if (a.json_path) {
    output::WriteFileAtomically(*a.json_path, ResultText(outcome));
  }
  if (!a.report_path.empty()) WriteReport(a.report_path, ReportText(outcome));
  if (!a.quiet && !json_on_stdout) {
    out << output::ParameterTable(outcome.estimate);
    if (outcome.verification) out << "\n" << output::VerificationText(*outcome.verification);
  }
  // Why the exit status is 1, on stderr whether or not the table was printed.
  const std::vector<std::string> reasons = StatusReasons(outcome, a.verification_sets_status);
  for (const std::string& reason : reasons) std::cerr << "coilspin: " << reason << "\n";
  return reasons.empty() ? kSuccess : kUndetermined;
}

int RunFitCommand(FitArguments a, std::ostream& out) {
  if (a.out_dir) return RunBatchFit(a, out);
  if (a.session_paths.size() > 1)
    throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                     "several session files are a lot of motors: add --out-dir DIR for one result file each");
  if (!a.session_paths.empty()) a.session_path = a.session_paths.front();
  return RunFit(a, out);
}

}  // namespace coilspin::cli
