#include "fitters/locked_rotor/capture.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

namespace coilspin::locked_rotor {
namespace {

// The response is timed to 1 − e⁻¹ of the current's change: one time constant
// of a first-order rise (physics: i(τ) = (1 − e⁻¹)·i∞).
const double kOneTimeConstantFraction = 1.0 - std::exp(-1.0);
// A plateau's current must exceed this many noise σ to count as non-zero.
constexpr double kNonZeroCurrentSigmas = 5.0;
// The settled end of a step capture is its last 1/kFinalPartDivisor.
constexpr std::size_t kFinalPartDivisor = 10;
// A move of the voltage by this fraction of the step ends the level that follows it.
constexpr double kLevelEndFraction = 0.5;

double MeanOver(const std::vector<double>& x, std::size_t begin, std::size_t end) {
  double sum = 0.0;
  for (std::size_t k = begin; k < end; ++k) sum += x[k];
  return end > begin ? sum / static_cast<double>(end - begin) : 0.0;
}

}  // namespace

CaptureClassification ClassifyCapture(const BenchLog& log) {
  CaptureClassification result;
  const auto onset = FindStepOnset(log.voltage_V);
  if (!onset) return result;
  const std::size_t n = log.size();
  const std::size_t k0 = *onset;
  // Current before the step and at the end of the level that follows it.
  const std::size_t before_begin = k0 > 10 ? k0 - 10 : 0;
  const double current_before_A = MeanOver(log.current_A, before_begin, k0 + 1);
  // The level that follows the step ends where the voltage moves again by half
  // the step (a sagging supply moves it far less); its last tenth is settled.
  if (k0 + 2 >= n) return result;
  const double step_V = log.voltage_V[k0 + 1] - log.voltage_V[k0];
  std::size_t level_end = k0 + 1;
  while (level_end < n &&
         std::fabs(log.voltage_V[level_end] - log.voltage_V[k0 + 1]) < kLevelEndFraction * std::fabs(step_V))
    ++level_end;
  const std::size_t level_samples = level_end - (k0 + 1);
  const std::size_t after_begin = level_end - std::max<std::size_t>(1, level_samples / kFinalPartDivisor);
  const double current_after_A = MeanOver(log.current_A, after_begin, level_end);
  const double change_A = current_after_A - current_before_A;
  result.onset = k0;
  result.current_change_A = change_A;
  result.current_noise_A = NoiseFromDifferences(log.current_A);
  result.rule = PlateauRule::kNoCurrentChange;
  if (std::fabs(change_A) <= kNonZeroCurrentSigmas * result.current_noise_A) return result;
  std::size_t k = k0 + 1;
  while (k < level_end && std::fabs(log.current_A[k] - current_before_A) < kOneTimeConstantFraction * std::fabs(change_A)) ++k;
  result.rise_samples = static_cast<double>(k - k0);
  result.rule = PlateauRule::kRiseTooCoarse;
  if (result.rise_samples >= kMinSamplesPerTimeConstant) result.kind = CaptureKind::kStep;
  return result;
}

std::string PlateauRuleText(const CaptureClassification& c) {
  const auto number = [](const char* format, double value) {
    char text[64];
    std::snprintf(text, sizeof text, format, value);
    return std::string(text);
  };
  switch (c.rule) {
    case PlateauRule::kNoVoltageStep:
      return "read as plateaus: no voltage step stands out of the noise";
    case PlateauRule::kNoCurrentChange:
      return "read as plateaus: across the voltage step at sample " + std::to_string(c.onset + 1) +
             " the current changes by " + number("%.4g", c.current_change_A) + " A, within " +
             number("%.0f", kNonZeroCurrentSigmas) + " noise sigma (" + number("%.4g", c.current_noise_A) + " A)";
    case PlateauRule::kRiseTooCoarse:
      return "read as plateaus: the current's rise after the voltage step at sample " + std::to_string(c.onset + 1) +
             " takes " + number("%.0f", c.rise_samples) + " samples per time constant; a step capture needs " +
             number("%.0f", kMinSamplesPerTimeConstant);
  }
  return "read as plateaus";
}

std::vector<LockedPlateau> FindLockedPlateaus(const BenchLog& log, const PlateauOptions& options) {
  std::vector<const std::vector<double>*> channels = {&log.voltage_V, &log.current_A, &log.time_s};
  const bool has_temperature = !log.temperature_degC.empty();
  if (has_temperature) channels.push_back(&log.temperature_degC);
  const bool has_torque = !log.torque_N_m.empty();
  const std::size_t torque_channel = channels.size();
  if (has_torque) channels.push_back(&log.torque_N_m);
  const double current_noise_A = NoiseFromDifferences(log.current_A);
  std::vector<LockedPlateau> result;
  for (const auto& plateau : FindPlateaus(log.voltage_V, channels, options)) {
    LockedPlateau p;
    p.mean_voltage_V = plateau.channels[0].mean;
    p.voltage_std_V = plateau.channels[0].std_dev;
    p.mean_current_A = plateau.channels[1].mean;
    p.current_std_A = plateau.channels[1].std_dev;
    p.mid_time_s = plateau.channels[2].mean;
    p.has_temperature = has_temperature;
    if (has_temperature) p.temperature_degC = plateau.channels[3].mean;
    p.has_torque = has_torque;
    if (has_torque) {
      p.mean_torque_N_m = plateau.channels[torque_channel].mean;
      p.torque_std_N_m = plateau.channels[torque_channel].std_dev;
    }
    p.samples = plateau.size();
    const double noise_A = std::max(current_noise_A, p.current_std_A);
    if (std::fabs(p.mean_current_A) > kNonZeroCurrentSigmas * noise_A) result.push_back(p);
  }
  return result;
}

}  // namespace coilspin::locked_rotor
