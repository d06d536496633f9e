#include "src/cli/batch_fit.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <filesystem>
#include <iostream>
#include <map>
#include <mutex>
#include <ostream>
#include <thread>

#include "src/cli/exit_codes.h"
#include "src/cli/output_path.h"
#include "src/ingest/input_error.h"
#include "src/output/aligned_columns.h"
#include "src/output/atomic_file.h"
#include "src/output/number_format.h"
#include "src/output/verification_table.h"
#include "src/verify/datasheet_file.h"

namespace coilspin::cli {
namespace {

namespace fs = std::filesystem;

[[noreturn]] void Usage(const std::string& message) { throw InputError(InputErrorKind::kBadOption, "", 0, 0, message); }

struct Motor {
  std::string session;
  std::string result;  // DIR/<stem>.json
  enum class State { kFitted, kBadInput, kFailed } state = State::kFailed;
  std::string error;                 // kBadInput, kFailed
  std::vector<std::string> reasons;  // kFitted: why its status is 1
  std::optional<verify::NamedResult> named;  // kFitted: for the lot's verification
  double seconds = 0.0;
};

std::vector<Motor> Plan(const FitArguments& a) {
  if (a.session_paths.empty()) Usage("--out-dir needs session files, one per motor");
  if (a.json_path) Usage("--json names one result file; with --out-dir each session's goes into the folder");
  if (!a.report_path.empty()) Usage("--report draws one motor's fit; it does not go with --out-dir");
  std::map<std::string, std::string> by_stem;
  std::vector<Motor> motors;
  for (const std::string& session : a.session_paths) {
    const std::string stem = fs::path(session).stem().string();
    const auto [it, added] = by_stem.insert({stem, session});
    if (!added) Usage("two session files would write the same result " + stem + ".json: " + it->second + " and " + session);
    Motor m;
    m.session = session;
    m.result = (fs::path(*a.out_dir) / (stem + ".json")).string();
    motors.push_back(std::move(m));
  }
  return motors;
}

void FitOne(const FitArguments& a, const verify::Datasheet* sheet, Motor* m) {
  const auto start = std::chrono::steady_clock::now();
  FitArguments one = a;
  one.session_paths.clear();
  one.session_path = m->session;
  one.json_path = m->result;
  one.quiet = true;  // no table and no bootstrap progress per motor
  try {
    FitOutcome outcome = FitOneMotor(one, sheet, m->result);
    output::WriteFileAtomically(m->result, ResultText(outcome));
    m->state = Motor::State::kFitted;
    m->reasons = StatusReasons(outcome, a.verification_sets_status);
    m->named = verify::NamedResult{m->result, std::move(outcome.estimate)};
  } catch (const InputError& e) {
    m->state = Motor::State::kBadInput;
    m->error = e.what();
  } catch (const std::exception& e) {  // a fit that broke, a file that could not be written
    m->state = Motor::State::kFailed;
    m->error = e.what();
  }
  m->seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

std::string Progress(const Motor& m, std::size_t done, std::size_t total) {
  const std::string head = "coilspin fit: [" + std::to_string(done) + "/" + std::to_string(total) + "] " + m.session;
  if (m.state != Motor::State::kFitted) return head + ": FAILED: " + m.error;
  std::string text = head + " -> " + m.result + " (" + output::ShortNumber(m.seconds, 2) + " s)";
  for (const std::string& r : m.reasons) text += "\n    " + r;
  return text;
}

std::string StateName(const Motor& m) {
  if (m.state == Motor::State::kBadInput) return "bad input";
  if (m.state == Motor::State::kFailed) return "failed";
  return m.reasons.empty() ? "fitted" : "fitted, status 1";
}

}  // namespace

int RunBatchFit(const FitArguments& a, std::ostream& out) {
  std::vector<Motor> motors = Plan(a);
  std::optional<verify::Datasheet> sheet;
  if (!a.datasheet_path.empty()) sheet = verify::LoadDatasheet(a.datasheet_path);
  const std::string& folder = *a.out_dir;
  if (folder.empty() || output::IsStandardOutput(folder))
    throw InputError(InputErrorKind::kBadOutputPath, folder, 0, 0,
                     "--out-dir: give a folder for the result files (an empty path or - names none)");
  std::error_code error;
  fs::create_directories(folder, error);
  if (error || !fs::is_directory(folder))
    throw InputError(InputErrorKind::kBadOutputPath, folder, 0, 0,
                     "--out-dir: cannot create the folder" + (error ? " (" + error.message() + ")" : std::string()));
  // Every result file's path, before any fit (an existing FIFO or folder of that name, an unwritable folder).
  for (const Motor& m : motors) RequireOutputPath("--out-dir", m.result);

  const std::size_t workers =
      std::max<std::size_t>(1, std::min<std::size_t>(motors.size(), std::thread::hardware_concurrency()));
  std::cerr << "coilspin fit: " << motors.size() << " motors on " << workers << " threads\n";
  std::atomic<std::size_t> next{0};
  std::size_t done = 0;
  std::mutex report;
  std::vector<std::thread> pool;
  for (std::size_t w = 0; w < workers; ++w) {
    pool.emplace_back([&] {
      for (std::size_t k = next++; k < motors.size(); k = next++) {
        FitOne(a, sheet ? &*sheet : nullptr, &motors[k]);
        const std::lock_guard<std::mutex> lock(report);
        std::cerr << Progress(motors[k], ++done, motors.size()) << "\n";
      }
    });
  }
  for (std::thread& t : pool) t.join();

  std::vector<std::vector<std::string>> rows = {{"session", "result", "state"}};
  std::vector<verify::NamedResult> fitted;
  bool any_fitted = false, all_clean = true;
  for (Motor& m : motors) {
    rows.push_back({m.session, m.state == Motor::State::kFitted ? m.result : "-", StateName(m)});
    any_fitted = any_fitted || m.state == Motor::State::kFitted;
    all_clean = all_clean && m.state == Motor::State::kFitted && m.reasons.empty();
    if (m.named) fitted.push_back(std::move(*m.named));
  }
  if (!a.quiet) out << output::AlignedColumns(rows, "");
  if (sheet && !fitted.empty() && !a.quiet) out << "\n" << output::VerificationText(verify::Verify(*sheet, fitted));
  const bool all_bad_input = std::all_of(motors.begin(), motors.end(),
                                         [](const Motor& m) { return m.state == Motor::State::kBadInput; });
  if (!any_fitted && all_bad_input) return kBadInput;
  return all_clean ? kSuccess : kUndetermined;
}

}  // namespace coilspin::cli
