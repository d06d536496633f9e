#include "src/ingest/segmentation.h"

#include "src/ingest/noise_level.h"
#include "src/ingest/small_text_and_statistics.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <utility>

namespace coilspin {
namespace {

// Φ⁻¹(0.75) = 0.6744897501960817: the median absolute deviation of a standard
// normal variable, so σ = MAD / 0.6745 (normal distribution quantile;
// statistics handbook).
constexpr double kNormalMadPerSigma = 0.6744897501960817;
// The difference of two independent samples of noise σ has standard deviation
// √2·σ (statistics, variance of a difference).
const double kDifferenceSigmaPerSigma = std::sqrt(2.0);

// A running mean of equal values can differ from them by rounding; departures
// below this many ulps of the signal's magnitude are not departures (common practice).
constexpr double kRoundingUlps = 1024.0;

// A level's last samples may already be on their way to the next level (a
// supply that slews); they are trimmed from its end while they lie more than
// 4 σ from the level's mean (a 6·10⁻⁵ chance for a Gaussian sample of the level).
constexpr double kLevelEdgeSigmas = 4.0;

// A level change on a quantised channel must span more than two reading steps:
// noise toggling a reading between two neighbouring steps is not a change of level.
constexpr double kLevelChangeSteps = 2.0;

// φ is capped here when the AR(1) inflation (1 + φ)/(1 − φ) is formed (200 at most):
// a channel that looks almost a random walk is not made untestable (common practice).
constexpr double kMaxLag1 = 0.99;

// Step onset: the initial level is the median of the first 1/20 of the record,
// but of no more than its first 8 samples, so that a short pre-trigger part
// (common practice: oscilloscopes keep a few percent) still sets it; a step
// must exceed 8 noise σ, the PlateauOptions default, to count; a sample within
// 4 σ of the initial level (a 6·10⁻⁵ chance to fall outside for Gaussian noise)
// is still at that level.
constexpr std::size_t kInitialLevelDivisor = 20;
constexpr std::size_t kInitialLevelMaxSamples = 8;
constexpr double kStepMinimumSigmas = 8.0;
constexpr double kInitialLevelSigmas = 4.0;

ChannelSummary Summarise(const std::vector<double>& channel, std::size_t begin, std::size_t end) {
  const auto count = static_cast<double>(end - begin);
  double sum = 0.0;
  for (std::size_t i = begin; i < end; ++i) sum += channel[i];
  ChannelSummary summary;
  summary.mean = sum / count;
  if (end - begin < 2) return summary;
  double squares = 0.0;
  for (std::size_t i = begin; i < end; ++i)
    squares += (channel[i] - summary.mean) * (channel[i] - summary.mean);
  summary.std_dev = std::sqrt(squares / (count - 1.0));
  return summary;
}

// [begin, end) of each level: a level ends at the first sample that departs from
// the level's running mean by more than `threshold` when the next sample departs
// too; its end is then moved back past samples farther than `edge_band` from
// that mean. A lone departing sample (a spike) stays in the level but not in its mean.
std::vector<std::pair<std::size_t, std::size_t>> SplitLevels(const std::vector<double>& level,
                                                             double threshold, double edge_band) {
  std::vector<std::pair<std::size_t, std::size_t>> levels;
  std::size_t start = 0;
  double sum = level[0];
  std::size_t count = 1;
  for (std::size_t i = 1; i < level.size(); ++i) {
    const double mean = sum / static_cast<double>(count);
    const bool departs = std::abs(level[i] - mean) > threshold;
    if (!departs) {
      sum += level[i];
      ++count;
      continue;
    }
    const bool next_departs = i + 1 == level.size() || std::abs(level[i + 1] - mean) > threshold;
    if (!next_departs) continue;
    std::size_t end = i;
    while (end > start + 1 && std::abs(level[end - 1] - mean) > edge_band) --end;
    levels.emplace_back(start, end);
    start = i;
    sum = level[i];
    count = 1;
  }
  levels.emplace_back(start, level.size());
  return levels;
}

// The smallest |x[k+1] − x[k]| above `rounding`: one reading step of a quantised
// channel, a negligible amount on a noisy one; 0 when no reading changes.
double FinestChange(const std::vector<double>& x, double rounding) {
  double finest = std::numeric_limits<double>::infinity();
  for (std::size_t k = 0; k + 1 < x.size(); ++k) {
    const double change = std::abs(x[k + 1] - x[k]);
    if (change > rounding) finest = std::min(finest, change);
  }
  return std::isfinite(finest) ? finest : 0.0;
}

}  // namespace

double NoiseFromDifferences(const std::vector<double>& signal) {
  if (signal.size() < 2) return 0.0;
  std::vector<double> differences(signal.size() - 1);
  for (std::size_t i = 0; i + 1 < signal.size(); ++i) differences[i] = signal[i + 1] - signal[i];
  const double center = Median(differences);
  for (double& difference : differences) difference = std::abs(difference - center);
  const double median_absolute_deviation = Median(differences);
  return median_absolute_deviation / (kNormalMadPerSigma * kDifferenceSigmaPerSigma);
}

std::vector<Plateau> FindPlateaus(const std::vector<double>& level,
                                  const std::vector<const std::vector<double>*>& channels,
                                  const PlateauOptions& options) {
  for (const std::vector<double>* channel : channels) {
    if (channel == nullptr || channel->size() != level.size()) {
      throw std::invalid_argument("FindPlateaus: every channel must have as many samples as the level");
    }
  }
  if (level.empty()) return {};
  const auto [lowest, highest] = std::minmax_element(level.begin(), level.end());
  const double range = *highest - *lowest;
  const double magnitude = std::max(std::abs(*lowest), std::abs(*highest));
  const ChannelNoise noise = EstimateChannelNoise(level);  // coloured and quantised noise (noise_level.h)
  const double sigma = noise.sigma;
  const double rounding = kRoundingUlps * std::numeric_limits<double>::epsilon() * magnitude;
  const double threshold = std::max({options.threshold_sigmas * sigma, options.min_relative_step * range, rounding,
                                     kLevelChangeSteps * noise.step});
  // A reading toggling between neighbouring codes stays on its level at the edge too.
  // Noise under a coarse ADC's step rarely changes a reading: the differences are
  // mostly 0, σ comes out near 0 and, with too few codes to show the step
  // (noise_level.h), 4 σ was smaller than every reading's distance from the level's
  // mean, so levels were trimmed back to their first sample (10 mV steps on 2 mV of
  // noise lost half the plateaus). The finest change between readings bounds it.
  const double edge_band = std::max({kLevelEdgeSigmas * sigma, rounding, kLevelChangeSteps * noise.step,
                                     kLevelChangeSteps * FinestChange(level, rounding)});

  std::vector<Plateau> plateaus;
  for (const auto& [begin, end] : SplitLevels(level, threshold, edge_band)) {
    const auto dropped =
        static_cast<std::size_t>(std::ceil(options.settle_fraction * static_cast<double>(end - begin)));
    const std::size_t settled_begin = std::min(end, begin + dropped);
    if (end - settled_begin < std::max<std::size_t>(options.min_samples, 1)) continue;
    Plateau plateau;
    plateau.begin = settled_begin;
    plateau.end = end;
    for (const std::vector<double>* channel : channels) {
      plateau.channels.push_back(Summarise(*channel, settled_begin, end));
    }
    plateaus.push_back(std::move(plateau));
  }
  return plateaus;
}

SettledPlateau SettlePlateau(const Plateau& plateau, const std::vector<const std::vector<double>*>& channels,
                             const std::vector<SettlingChannel>& settling, std::size_t min_samples) {
  std::vector<double> inflation;
  for (const SettlingChannel& c : settling) {
    const double phi = std::clamp(c.lag1, 0.0, kMaxLag1);
    inflation.push_back((1.0 + phi) / (1.0 - phi));
  }
  SettledPlateau out;
  std::size_t begin = plateau.begin;
  const std::size_t end = plateau.end;
  const std::size_t shortest = 2 * std::max<std::size_t>(min_samples, 1);
  for (;;) {
    const std::size_t n = end - begin;
    const std::size_t middle = begin + n / 2;
    double worst = 0.0;
    for (std::size_t i = 0; i < settling.size(); ++i) {
      const std::vector<double>& x = *channels.at(settling[i].index);
      const double first = Summarise(x, begin, middle).mean;
      const double second = Summarise(x, middle, end).mean;
      const double standard_error =
          2.0 * settling[i].sigma * std::sqrt(inflation[i] / static_cast<double>(n));
      const double ratio = standard_error > 0.0 ? std::abs(first - second) / standard_error : 0.0;
      worst = std::max(worst, ratio);
    }
    out.trend_standard_errors = worst;
    out.settled = worst <= kSettledHalvesStandardErrors;
    if (out.settled || n - n / 4 < shortest) break;
    begin += n / 4;
  }
  out.plateau.begin = begin;
  out.plateau.end = end;
  for (const std::vector<double>* channel : channels) out.plateau.channels.push_back(Summarise(*channel, begin, end));
  return out;
}

std::optional<std::size_t> FindStepOnset(const std::vector<double>& signal) {
  const std::size_t n = signal.size();
  if (n < 3) return std::nullopt;
  std::vector<double> initial(
      signal.begin(),
      signal.begin() + static_cast<std::ptrdiff_t>(std::clamp<std::size_t>(n / kInitialLevelDivisor, 1, kInitialLevelMaxSamples)));
  const double initial_level = Median(initial);
  const auto excursion = [&](std::size_t k) { return std::abs(signal[k] - initial_level); };

  double amplitude = 0.0;  // the largest excursion held for two samples, so a lone spike is no step
  for (std::size_t k = 0; k + 1 < n; ++k)
    amplitude = std::max(amplitude, std::min(excursion(k), excursion(k + 1)));
  const double sigma = EstimateChannelNoise(signal).sigma;
  if (amplitude == 0.0 || amplitude <= kStepMinimumSigmas * sigma) return std::nullopt;
  if (!std::isfinite(amplitude) || !std::isfinite(sigma)) return std::nullopt;  // beyond the range of a double

  std::size_t k = 0;
  while (k + 1 < n && !(excursion(k) > 0.5 * amplitude && excursion(k + 1) > 0.5 * amplitude)) ++k;
  if (k + 1 >= n) return std::nullopt;
  const double band = kInitialLevelSigmas * sigma;
  while (k > 0 && excursion(k) > band) --k;
  return k;
}

}  // namespace coilspin
