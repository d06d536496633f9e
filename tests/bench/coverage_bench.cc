// Coverage benchmark: simulates many benches of motors with known parameters,
// fits each, and prints per parameter the empirical coverage of the nominal
// 95 % interval, the bias and spread of the estimate and the interval's mean
// half-width (all relative to the truth), per motor and overall, with the time
// taken. Figures only: not part of ctest (docs/coverage.md records the runs).
//
// Usage:
//   coverage_bench joint [benches per motor, default 25]
//       Four motors; each bench: locked-rotor plateaus and step capture,
//       no-load plateaus, spin-down and a free-shaft step, in one joint fit
//       with Wald intervals; every third bench three times noisier.
//       Scores R, L, Vb (motors with brushes only), Ke, J, B, Tc and Kt.
//   coverage_bench step wald|profile|bootstrap [benches per motor, default 40]
//       Three motors; each bench one free-shaft step from rest, fitted alone
//       (Kt = Ke basis, Vb held at 0) with the named interval method
//       (bootstrap: kBootstrapReplicates replicates). Scores R, L, Ke, J, Kt,
//       and B and Tc as well.
//   coverage_bench real [benches per motor, default 25]
//       The motors and logs of `joint`, each bench with a real rig's artefacts
//       at levels drawn per bench (coverage_real_rig.h): coloured noise, a
//       current offset, commutation ripple, tachometer dropouts, spikes, a
//       coarse current ADC and winding warm-up on some benches. Same scoring;
//       the footer adds every bench's levels, every exception and a tally of
//       every warning, note and not-identified reason.
//   coverage_bench dump real|real-nostep MOTOR BENCH FOLDER
//       Writes the logs of one real-rig bench (motor index, bench index) as CSV
//       files into FOLDER, as the fitters see them (outliers set aside), for
//       looking at a fit that went wrong with `coilspin fit`.
//   coverage_bench real-nostep [benches per motor, default 25]
//       The same without steps: locked-rotor plateaus, no-load and spin-down
//       only (no capture, no free-shaft step); L is not scored.
//   coverage_bench joint|real|real-nostep N wald|profile|bootstrap
//       The same with the named interval method (default wald; bootstrap:
//       kBootstrapReplicates replicates).
//   coverage_bench N          the same as `coverage_bench joint N` (older form).
// Motors and benches: coverage_motors.h, coverage_real_rig.h; tallies and tables: coverage_tally.h.

#include <algorithm>
#include <cctype>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <exception>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "bench/coverage_motors.h"
#include "bench/coverage_real_rig.h"
#include "bench/coverage_tally.h"

namespace {

using namespace coilspin;

constexpr int kDefaultJointBenches = 25;
constexpr int kDefaultStepBenches = 40;
// 100 replicates: enough for percentile 95 % intervals to sit between order
// statistics 2.5 and 97.5 (B ≥ 200 is the usual advice, Efron & Tibshirani 1993,
// from memory), halved to keep the benchmark within minutes; the Monte-Carlo
// error of the bounds widens the spread of the coverage a little.
constexpr int kBootstrapReplicates = 100;
// Every kNoisyEvery-th joint bench has its noise σ multiplied by kNoisyScale.
constexpr int kNoisyEvery = 3;
constexpr double kNoisyScale = 3.0;
// Seeds: distinct ranges for the modes, kSeedStride apart per bench (each
// bench uses seed … seed + 4 for its logs).
constexpr std::uint64_t kJointSeedBase = 7000;
constexpr std::uint64_t kStepSeedBase = 9000;
constexpr std::uint64_t kRealSeedBase = 11000;
// Real-rig benches draw their artefact levels from their seed, so each motor gets its own
// range of seeds (kMotorSeedStride apart: room for 100 benches per motor).
constexpr std::uint64_t kMotorSeedStride = 1000;
constexpr std::uint64_t kSeedStride = 10;
// A fit is listed as an outlier when an estimate lies more than this many of its
// standard errors from the truth: by chance once in about 16 000 per parameter
// for a normal estimate (two-sided 4 σ, common practice).
constexpr double kOutlierStandardErrors = 4.0;

struct Run {
  bench::CoverageTallies tallies;
  int missing = 0;               // a scored parameter the fit did not report
  int fits_with_warnings = 0;
  int fits_with_notes = 0;       // interval notes: sides not found, widened channels, failed replicates
  std::string first_warning, first_note;
  std::vector<std::pair<std::string, double>> motor_wall_s;
  std::vector<std::string> outliers;  // "motor #bench: key z, …; solver iterations, max residual lag-1"
  // Real-rig modes: every message the fits gave, by shape (numbers as #), with the fits that
  // gave it and one exact example; every exception.
  bool tally_messages = false;
  struct Message {
    int fits = 0;
    std::string example;
    std::vector<std::string> benches;  // "motor #k"
  };
  std::map<std::string, Message> messages;
  std::vector<std::string> exceptions;  // "motor #bench: what()"
};

// The message with every number (digits, a sign before them, a decimal point, an exponent) as "#";
// digits that end a word ("lag-1") are kept.
std::string ShapeOf(const std::string& text) {
  std::string shape;
  for (std::size_t i = 0; i < text.size();) {
    const bool sign = (text[i] == '-' || text[i] == '+') && i + 1 < text.size() &&
                      std::isdigit(static_cast<unsigned char>(text[i + 1])) &&
                      (i == 0 || !std::isalnum(static_cast<unsigned char>(text[i - 1])));  // not "lag-1"
    const bool digit_in_word = std::isdigit(static_cast<unsigned char>(text[i])) && i > 0 &&
                               (std::isalpha(static_cast<unsigned char>(text[i - 1])) || text[i - 1] == '-');
    if (digit_in_word) {  // "lag-1", "x2": part of a word, kept
      shape += text[i++];
      continue;
    }
    if (!sign && !std::isdigit(static_cast<unsigned char>(text[i]))) {
      shape += text[i++];
      continue;
    }
    ++i;
    while (i < text.size() && (std::isdigit(static_cast<unsigned char>(text[i])) || text[i] == '.' ||
                               ((text[i] == 'e' || text[i] == 'E') && i + 1 < text.size() &&
                                (std::isdigit(static_cast<unsigned char>(text[i + 1])) || text[i + 1] == '-'))))
      i += (text[i] == 'e' || text[i] == 'E') && text[i + 1] == '-' ? 2 : 1;
    shape += '#';
  }
  return shape;
}

std::string Fixed(const char* format, double x);

// Counts each warning (of the fit and of each test), how each test was used, each interval
// note and not-identified reason, by shape.
void TallyMessages(const std::string& bench, const MotorEstimate& e, Run* run) {
  std::vector<std::string> lines;
  for (const std::string& w : e.warnings) lines.push_back("fit warning: " + w);
  for (const TestSummary& t : e.tests) {
    lines.push_back(t.kind + " (" + t.file + ") used as: " + t.method);
    for (const std::string& w : t.warnings) lines.push_back(t.kind + " (" + t.file + ") warning: " + w);
  }
  for (const std::string& note : e.intervals.notes) lines.push_back("interval note: " + note);
  for (const auto& [key, reason] : e.not_identified) lines.push_back("not identified: " + key + ": " + reason);
  std::map<std::string, bool> seen;  // a fit counts once per shape
  for (const std::string& line : lines) {
    const std::string shape = ShapeOf(line);
    if (seen[shape]) continue;
    seen[shape] = true;
    Run::Message& m = run->messages[shape];
    if (m.fits++ == 0) m.example = line;
    m.benches.push_back(bench);
  }
}

std::string Fixed(const char* format, double x) {
  char text[32];
  std::snprintf(text, sizeof text, format, x);
  return text;
}

std::map<std::string, double> Truths(const model::MotorParameters& p) {
  return {{"resistance", p.resistance_ohm},
          {"inductance", p.inductance_H},
          {"brush_drop", p.brush_drop_V},
          {"back_emf_constant", p.back_emf_constant_V_s_per_rad},
          {"torque_constant", p.torque_constant_N_m_per_A},
          {"inertia", p.inertia_kg_m2},
          {"viscous_friction", p.viscous_friction_N_m_s_per_rad},
          {"coulomb_friction", p.coulomb_friction_N_m}};
}

void Score(const bench::Motor& m, int bench_index, const MotorEstimate& e, const std::vector<std::string>& keys,
           Run* run) {
  const std::map<std::string, double> truth = Truths(m.p);
  std::string far;
  for (const std::string& key : keys) {
    if (truth.at(key) == 0.0) continue;  // Vb = 0 sits on its bound: coverage is not defined there
    const QuantityEstimate* q = e.Find(key);
    if (!q) {
      ++run->missing;
      continue;
    }
    run->tallies.Add(m.name, key, *q, truth.at(key));
    const double z = (q->value - truth.at(key)) / q->std_error;
    if (std::fabs(z) > kOutlierStandardErrors) far += " " + key + " " + Fixed("%+.1f", z) + ";";
  }
  if (!far.empty()) {
    double max_lag1 = 0.0;
    for (const auto& t : e.tests)
      for (const auto& r : t.residuals) max_lag1 = std::max(max_lag1, r.lag1_autocorrelation);
    const int iterations = e.solver.empty() ? 0 : e.solver.front().iterations;
    run->outliers.push_back(std::string(m.name) + " #" + std::to_string(bench_index) + ":" + far +
                            " solver iterations " + std::to_string(iterations) + ", max residual lag-1 " +
                            Fixed("%.2f", max_lag1));
  }
  if (run->tally_messages) TallyMessages(std::string(m.name) + " #" + std::to_string(bench_index), e, run);
  if (!e.warnings.empty() && run->fits_with_warnings++ == 0) run->first_warning = e.warnings.front();
  if (!e.intervals.notes.empty() && run->fits_with_notes++ == 0) run->first_note = e.intervals.notes.front();
}

void PrintFooter(const Run& run, int motors, int benches, double wall_s, double cpu_s) {
  std::printf("\n%d motors x %d benches, %d parameters not determined, %.1f s wall, %.1f s CPU\n", motors, benches,
              run.missing, wall_s, cpu_s);
  std::printf("fits with warnings: %d%s%s\n", run.fits_with_warnings, run.first_warning.empty() ? "" : "; first: ",
              run.first_warning.c_str());
  std::printf("fits with interval notes: %d%s%s\n", run.fits_with_notes, run.first_note.empty() ? "" : "; first: ",
              run.first_note.c_str());
  std::printf("fits with an estimate more than %.0f standard errors from the truth: %zu\n", kOutlierStandardErrors,
              run.outliers.size());
  for (const std::string& line : run.outliers) std::printf("  %s\n", line.c_str());
  std::printf("wall time per motor:");
  for (const auto& [name, seconds] : run.motor_wall_s) std::printf(" %s %.1f s;", name.c_str(), seconds);
  std::printf("\n");
  if (!run.tally_messages) return;
  std::printf("fits that threw: %zu\n", run.exceptions.size());
  for (const std::string& line : run.exceptions) std::printf("  %s\n", line.c_str());
  std::printf("messages by shape (# a number): fits giving it, the fits when few, one exact example:\n");
  constexpr int kListBenchesUpTo = 15;
  for (const auto& [shape, m] : run.messages) {
    std::printf("  %3d  %s\n", m.fits, shape.c_str());
    if (m.fits <= kListBenchesUpTo) {
      std::printf("       in:");
      for (const std::string& b : m.benches) std::printf(" %s;", b.c_str());
      std::printf("\n");
    }
    if (m.example != shape) std::printf("       e.g. %s\n", m.example.c_str());
  }
}

int Usage() {
  std::fprintf(stderr,
               "usage: coverage_bench joint [benches per motor, default %d] [wald|profile|bootstrap]\n"
               "       coverage_bench real|real-nostep [benches per motor, default %d] [wald|profile|bootstrap]\n"
               "       coverage_bench step wald|profile|bootstrap [benches per motor, default %d]\n"
               "       coverage_bench dump real|real-nostep MOTOR BENCH FOLDER\n"
               "       coverage_bench N   (= joint N)\n",
               kDefaultJointBenches, kDefaultJointBenches, kDefaultStepBenches);
  return 2;
}

std::optional<int> Count(const char* text) {
  char* end = nullptr;
  const long n = std::strtol(text, &end, 10);
  if (end == text || *end != '\0' || n <= 0) return std::nullopt;
  return static_cast<int>(n);
}

template <typename Fit>
void RunAll(const std::vector<bench::Motor>& motors, int benches, const std::vector<std::string>& keys, Fit fit,
            bool tally_messages = false) {
  Run run;
  run.tally_messages = tally_messages;
  const auto wall_start = std::chrono::steady_clock::now();
  const std::clock_t cpu_start = std::clock();  // process CPU time, all threads (glibc)
  const auto since = [](std::chrono::steady_clock::time_point t) {
    return std::chrono::duration<double>(std::chrono::steady_clock::now() - t).count();
  };
  for (const bench::Motor& m : motors) {
    const auto motor_start = std::chrono::steady_clock::now();
    for (int k = 0; k < benches; ++k) {
      if (!tally_messages) {
        Score(m, k, fit(m, k), keys, &run);
        continue;
      }
      try {
        Score(m, k, fit(m, k), keys, &run);
      } catch (const std::exception& e) {
        run.exceptions.push_back(std::string(m.name) + " #" + std::to_string(k) + ": " + e.what());
      }
    }
    run.motor_wall_s.emplace_back(m.name, since(motor_start));
  }
  const double wall_s = since(wall_start);
  const double cpu_s = static_cast<double>(std::clock() - cpu_start) / CLOCKS_PER_SEC;
  bench::PrintTables(run.tallies, keys);
  PrintFooter(run, static_cast<int>(motors.size()), benches, wall_s, cpu_s);
}

joint::MotorFitOptions OptionsFor(const bench::Motor& m, int counts_per_rev,
                                  joint::IntervalMethod method = joint::IntervalMethod::kWald) {
  joint::MotorFitOptions options;
  if (m.encoder) options.counts_per_rev = counts_per_rev;  // as a user passes --counts-per-rev
  options.intervals.method = method;
  options.intervals.replicates = kBootstrapReplicates;
  return options;
}

// The optional interval method after the bench count (wald when absent); nullopt when misspelled.
std::optional<joint::IntervalMethod> MethodArgument(int argc, char** argv, int at) {
  return argc > at ? joint::IntervalMethodFromString(argv[at]) : joint::IntervalMethod::kWald;
}

}  // namespace

int main(int argc, char** argv) {
  const std::string mode = argc > 1 ? argv[1] : "joint";
  if (mode == "joint" || Count(mode.c_str())) {
    const char* count_text = Count(mode.c_str()) ? argv[1] : (argc > 2 ? argv[2] : nullptr);
    const std::optional<int> benches = count_text ? Count(count_text) : kDefaultJointBenches;
    const std::optional<joint::IntervalMethod> method = MethodArgument(argc, argv, 3);
    if (!benches || !method) return Usage();
    std::printf("joint fit, %s intervals\n\n", joint::IntervalMethodName(*method));
    RunAll(bench::JointMotors(), *benches,
           {"resistance", "inductance", "brush_drop", "back_emf_constant", "torque_constant", "inertia",
            "viscous_friction", "coulomb_friction"},
           [&](const bench::Motor& m, int k) {
             const double scale = (k % kNoisyEvery == 0) ? kNoisyScale : 1.0;
             return joint::FitMotor(bench::JointBench(m, kJointSeedBase + kSeedStride * k, scale),
                                    OptionsFor(m, bench::kJointEncoderCountsPerRev, *method));
           });
    return 0;
  }
  if (mode == "dump" && argc == 6) {  // dump real|real-nostep MOTOR BENCH FOLDER: one bench's logs as CSV
    const bool with_steps = std::string(argv[2]) == "real";
    const std::vector<bench::Motor> motors = bench::JointMotors();
    const auto index = [](const char* text) {  // 0-based, as the footer's "#k"
      const std::optional<int> n = Count((std::string("1") + text).c_str());
      return n && text[0] >= '0' && text[0] <= '9' ? std::optional<int>(std::stoi(text)) : std::nullopt;
    };
    const std::optional<int> motor = index(argv[3]), k = index(argv[4]);
    if (!motor || !k || *motor >= static_cast<int>(motors.size())) return Usage();
    const std::uint64_t seed = kRealSeedBase + kMotorSeedStride * static_cast<std::uint64_t>(*motor) +
                               kSeedStride * static_cast<std::uint64_t>(*k);
    for (const joint::TestLog& t : bench::RealRigSession(motors[*motor], seed, with_steps))
      bench::WriteCsv(t.log, std::string(argv[5]) + "/" + t.log.path + ".csv");
    std::printf("%s #%d: %s\n", motors[*motor].name, *k,
                bench::Describe(bench::DrawRig(motors[*motor], seed)).c_str());
    return 0;
  }
  if (mode == "real" || mode == "real-nostep") {
    const bool with_steps = mode == "real";
    const std::optional<int> benches = argc > 2 ? Count(argv[2]) : kDefaultJointBenches;
    const std::optional<joint::IntervalMethod> method = MethodArgument(argc, argv, 3);
    if (!benches || !method) return Usage();
    const std::vector<bench::Motor> motors = bench::JointMotors();
    std::printf("real-rig sessions%s, joint fit, %s intervals\n\n",
                with_steps ? "" : " without steps (locked-rotor plateaus, no-load, spin-down)",
                joint::IntervalMethodName(*method));
    std::vector<std::string> keys = {"resistance", "inductance", "brush_drop", "back_emf_constant",
                                     "torque_constant", "inertia", "viscous_friction", "coulomb_friction"};
    if (!with_steps) keys.erase(keys.begin() + 1);  // L needs a step of either kind
    const auto seed_of = [&motors](const bench::Motor& m, int k) {
      std::uint64_t motor_index = 0;
      while (motors[motor_index].name != std::string(m.name)) ++motor_index;
      return kRealSeedBase + kMotorSeedStride * motor_index + kSeedStride * static_cast<std::uint64_t>(k);
    };
    RunAll(
        motors, *benches, keys,
        [with_steps, &seed_of, &method](const bench::Motor& m, int k) {
          return joint::FitMotor(bench::RealRigSession(m, seed_of(m, k), with_steps),
                                 OptionsFor(m, bench::kJointEncoderCountsPerRev, *method));
        },
        true);
    std::printf("bench levels (the same for real and real-nostep):\n");
    for (const bench::Motor& m : motors)
      for (int k = 0; k < *benches; ++k)
        std::printf("  %s #%d: %s\n", m.name, k, bench::Describe(bench::DrawRig(m, seed_of(m, k))).c_str());
    return 0;
  }
  if (mode != "step" || argc < 3) return Usage();
  const std::optional<joint::IntervalMethod> method = joint::IntervalMethodFromString(argv[2]);
  const std::optional<int> benches = argc > 3 ? Count(argv[3]) : kDefaultStepBenches;
  if (!method || !benches) return Usage();
  std::printf("step-only fit, %s intervals", argv[2]);
  if (*method == joint::IntervalMethod::kBootstrap) std::printf(", %d replicates", kBootstrapReplicates);
  std::printf("\n\n");
  RunAll(bench::StepMotors(), *benches,
         {"resistance", "inductance", "back_emf_constant", "torque_constant", "inertia", "viscous_friction",
          "coulomb_friction"},
         [&](const bench::Motor& m, int k) {
           const joint::MotorFitOptions options = OptionsFor(m, bench::kStepEncoderCountsPerRev, *method);
           return joint::FitMotor(bench::StepBench(m, kStepSeedBase + kSeedStride * k), options);
         });
  return 0;
}
