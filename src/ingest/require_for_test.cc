#include <algorithm>
#include <string>

#include "src/ingest/error_text.h"
#include "src/ingest/input_error.h"
#include "src/ingest/read_bench_log.h"
#include "src/ingest/segmentation.h"

namespace coilspin {
namespace {

using units::Quantity;

// Plateau tests (locked-rotor, no-load) fit a line through the settled levels,
// which needs at least two levels; each keeps PlateauOptions::min_samples after
// its settle_fraction is dropped, so one level needs ⌈8 / (1 − 0.25)⌉ = 11
// samples and two levels 22 (follows from the PlateauOptions defaults).
constexpr std::size_t kMinimumPlateauLevels = 2;
constexpr std::size_t SamplesPerLevel() {
  constexpr PlateauOptions kDefaults{};
  const double needed = static_cast<double>(kDefaults.min_samples) / (1.0 - kDefaults.settle_fraction);
  const auto whole = static_cast<std::size_t>(needed);
  return static_cast<double>(whole) < needed ? whole + 1 : whole;
}
constexpr std::size_t kMinimumPlateauTestSamples = kMinimumPlateauLevels * SamplesPerLevel();
// A spin-down coast fits ω₀, B/J and Tc/J and locates the power-off instant;
// 20 samples leave 16 degrees of freedom (common practice: several residuals per parameter).
constexpr std::size_t kMinimumSpinDownSamples = 20;
// A step response needs samples before the onset and through the electrical and
// mechanical rises; 20 is the least that resolves both (common practice).
constexpr std::size_t kMinimumStepSamples = 20;

struct Requirement {
  std::vector<Quantity> required;
  bool needs_motion = false;        // speed or position
  std::vector<Quantity> must_vary;  // constant-signal check
  std::size_t minimum_samples = 0;
  std::string why_vary;  // what the bench should have done
};

Requirement RequirementFor(TestKind kind) {
  switch (kind) {
    case TestKind::kLockedRotor:
      return {{Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent},
              false,
              {Quantity::kVoltage, Quantity::kCurrent},
              kMinimumPlateauTestSamples,
              "a locked-rotor test steps the supply through several levels"};
    case TestKind::kNoLoad:
      return {{Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent},
              true,
              {Quantity::kVoltage, Quantity::kCurrent},
              kMinimumPlateauTestSamples,
              "a no-load test steps the supply through several levels"};
    case TestKind::kSpinDown:
      return {{Quantity::kTime},
              true,
              {},
              kMinimumSpinDownSamples,
              "a spin-down test logs the rotor coasting from speed to rest"};
    case TestKind::kStep:
      return {{Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent},
              true,
              {Quantity::kVoltage, Quantity::kCurrent},
              kMinimumStepSamples,
              "a step test applies a voltage step"};
  }
  return {};
}

std::string Needs(TestKind kind, const Requirement& requirement) {
  std::string list;
  for (Quantity quantity : requirement.required) {
    if (!list.empty()) list += ", ";
    list += units::QuantityName(quantity);
  }
  if (requirement.needs_motion) list += ", speed or position";
  return std::string(TestKindToString(kind)) + " needs " + list;
}

long ColumnOf(const BenchLog& log, Quantity quantity) {
  for (const ColumnSource& source : log.columns) {
    if (source.quantity == quantity) return source.column;
  }
  return 0;
}

std::string HeaderOf(const BenchLog& log, Quantity quantity) {
  for (const ColumnSource& source : log.columns) {
    if (source.quantity == quantity) return source.header;
  }
  return std::string(units::QuantityName(quantity));
}

[[noreturn]] void ThrowMissing(const BenchLog& log, TestKind kind, const Requirement& requirement,
                               const std::string& missing) {
  throw InputError(InputErrorKind::kMissingColumn, log.path, log.header_line, 0,
                   "no " + missing + " column: " + Needs(kind, requirement) + "; the file has " +
                       ingest::QuoteList(log.header_cells) +
                       " (name another column with --column QUANTITY=\"header\")");
}

void CheckVaries(const BenchLog& log, Quantity quantity, const std::string& why) {
  const std::vector<double>& channel = log.Channel(quantity);
  const auto [lowest, highest] = std::minmax_element(channel.begin(), channel.end());
  if (*lowest != *highest) return;
  const std::string name(units::QuantityName(quantity));
  throw InputError(InputErrorKind::kConstantSignal, log.path, log.header_line, ColumnOf(log, quantity),
                   name + " never changes (all " + std::to_string(channel.size()) + " samples of " +
                       ingest::Quote(HeaderOf(log, quantity)) + " are " + ingest::FormatNumber(*lowest) +
                       " " + std::string(units::InternalUnit(quantity)) + "); " + why);
}

}  // namespace

void RequireForTest(const BenchLog& log, TestKind kind) {
  const Requirement requirement = RequirementFor(kind);
  for (Quantity quantity : requirement.required) {
    if (!log.Has(quantity)) ThrowMissing(log, kind, requirement, std::string(units::QuantityName(quantity)));
  }
  const bool has_speed = log.Has(Quantity::kSpeed);
  if (requirement.needs_motion && !has_speed && !log.Has(Quantity::kPosition)) {
    ThrowMissing(log, kind, requirement, "speed or position");
  }
  if (log.size() < requirement.minimum_samples) {
    throw InputError(InputErrorKind::kTooFewSamples, log.path, 0, 0,
                     std::string(TestKindToString(kind)) + " needs at least " +
                         std::to_string(requirement.minimum_samples) + " samples; the log has " +
                         std::to_string(log.size()));
  }
  for (Quantity quantity : requirement.must_vary) CheckVaries(log, quantity, requirement.why_vary);
  if (kind == TestKind::kSpinDown) {
    CheckVaries(log, has_speed ? Quantity::kSpeed : Quantity::kPosition, requirement.why_vary);
  }
}

}  // namespace coilspin
