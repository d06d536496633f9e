#include "src/ingest/noise_level.h"

#include <algorithm>
#include <cmath>
#include <optional>

#include "src/ingest/small_text_and_statistics.h"
#include "src/ingest/whole_count_step.h"

namespace coilspin {
namespace {

// Φ⁻¹(0.75): σ = MAD/0.6745 for normal data (normal quantile; statistics handbook).
constexpr double kNormalMadPerSigma = 0.6744897501960817;
// x_{k+m} − 2x_k + x_{k−m} of white noise has σ·√(1 + 4 + 1); a first difference σ·√2.
const double kSecondDifferenceSigmas = std::sqrt(6.0);
const double kFirstDifferenceSigmas = std::sqrt(2.0);
// A uniform rounding error over one step q has σ = q/√12 (statistics handbook).
const double kUniformSigmaPerStep = 1.0 / std::sqrt(12.0);
// Lags stop where fewer than this many second differences remain per lag: the
// MAD of fewer is too rough to compare one lag with the next (common practice).
constexpr std::size_t kMinDifferencesPerLag = 64;
// A change between neighbours beyond this many robust scales of the first differences
// is a jump of the signal (a Gaussian difference exceeds 10 σ with a chance of 10⁻²³;
// statistics: normal tail), whatever the noise's colour.
constexpr double kJumpScales = 10.0;

double MadSigma(std::vector<double> values, double sigmas_per_sigma) {
  if (values.empty()) return 0.0;
  const double centre = Median(values);
  for (double& v : values) v = std::abs(v - centre);
  return Median(std::move(values)) / (kNormalMadPerSigma * sigmas_per_sigma);
}

// q when the channel reads whole steps (whole_count_step.h) over at least
// kMinDistinctReadings distinct values, or toggles by one step often; 0 otherwise.
double ReadingStepOf(const std::vector<double>& x) {
  const std::optional<double> step = WholeCountStep(x);
  if (!step) return 0.0;
  std::vector<double> sorted = x;
  std::sort(sorted.begin(), sorted.end());
  const auto distinct = std::unique(sorted.begin(), sorted.end()) - sorted.begin();
  if (distinct >= static_cast<std::ptrdiff_t>(kMinDistinctReadings)) return *step;
  std::size_t one_step = 0;  // changes of exactly one step between neighbours: noise toggling a code
  for (std::size_t k = 1; k < x.size(); ++k)
    if (std::abs(std::abs(x[k] - x[k - 1]) / *step - 1.0) < kWholeCountTolerance) ++one_step;
  return static_cast<double>(one_step) >= kMinToggleFraction * static_cast<double>(x.size() - 1) ? *step : 0.0;
}

// σ_m from the second differences at lag m whose span [k − m, k + m] holds no jump
// (jumps[j] counts the jumps among the first j changes, so a span's count is a difference).
double SecondDifferenceSigma(const std::vector<double>& x, std::size_t lag, const std::vector<std::size_t>& jumps) {
  std::vector<double> second;
  second.reserve(x.size() - 2 * lag);
  for (std::size_t k = lag; k + lag < x.size(); ++k)
    if (jumps[k + lag] == jumps[k - lag]) second.push_back(x[k + lag] - 2.0 * x[k] + x[k - lag]);
  if (second.size() < kMinDifferencesPerLag) return -1.0;  // too few quiet spans: no estimate at this lag
  return MadSigma(std::move(second), kSecondDifferenceSigmas);
}

}  // namespace

ChannelNoise EstimateChannelNoise(const std::vector<double>& x) {
  ChannelNoise out;
  if (x.size() < 3) return out;
  std::vector<double> first(x.size() - 1);
  for (std::size_t k = 0; k + 1 < x.size(); ++k) first[k] = x[k + 1] - x[k];
  // Jumps: changes far beyond the first differences' robust spread (a supply step, a
  // current's fast rise). Second differences spanning one are left out at every lag.
  const double first_scale = MadSigma(first, 1.0), first_centre = Median(first);
  std::vector<std::size_t> jumps(x.size(), 0);  // jumps among the changes before sample k
  for (std::size_t k = 0; k + 1 < x.size(); ++k)
    jumps[k + 1] = jumps[k] + (first_scale > 0.0 && std::abs(first[k] - first_centre) > kJumpScales * first_scale ? 1 : 0);
  out.white_sigma = MadSigma(std::move(first), kFirstDifferenceSigmas);
  out.step = ReadingStepOf(x);
  // σ_m for m = 1, 2, 4, …: the last before a doubling grows it by more than coloured noise can.
  const double sigma_1 = std::max(SecondDifferenceSigma(x, 1, jumps), 0.0);
  double sigma = sigma_1;
  for (std::size_t lag = 2; x.size() >= 2 * lag + kMinDifferencesPerLag; lag *= 2) {
    const double next = SecondDifferenceSigma(x, lag, jumps);
    if (next < 0.0) break;
    if (next > kSignalGrowthPerDoubling * sigma) break;  // the signal's curvature, or its edges
    const bool levelled = next < kLevelledGrowthPerDoubling * sigma;
    sigma = std::max(sigma, next);
    if (levelled) break;  // beyond the noise's correlation: longer lags only add edges
  }
  // φ = 2 − √(1 + 3·σ_1²/σ²) (AR(1), from the variance formula in the header).
  if (sigma > 0.0) out.lag1 = std::clamp(2.0 - std::sqrt(1.0 + 3.0 * (sigma_1 / sigma) * (sigma_1 / sigma)), 0.0, 1.0);
  out.sigma = std::max({sigma, out.white_sigma, kUniformSigmaPerStep * out.step});
  return out;
}

}  // namespace coilspin
