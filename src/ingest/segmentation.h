#pragma once
// Segmentation of a log into the parts the fitters use.
//
// Plateaus: a staircase signal (the supply voltage stepped through levels) is
// cut where it leaves its running level by more than a noise-scaled threshold;
// the first part of each level (the transient) is dropped and what remains is a
// settled plateau, summarised by the mean and spread of each channel.
// Details (segmentation.cc): a level ends only when two consecutive samples
// leave it, so a lone spike stays inside the level; samples at a level's end
// more than 4 σ from its mean (a supply slewing to the next level) are trimmed.
// Step onset: the first sample where a signal has left its initial level; the
// initial level is the median of the first 1/20 of the samples, and a step must
// exceed 8 noise σ.

#include <cstddef>
#include <optional>
#include <vector>

namespace coilspin {

struct PlateauOptions {
  std::size_t min_samples = 8;       // a settled part shorter than this is not a plateau
  double settle_fraction = 0.25;     // fraction of each level dropped as transient
  double threshold_sigmas = 8.0;     // a level ends when the signal leaves it by this many noise σ
  double min_relative_step = 0.02;   // ... and by at least this fraction of the signal's range
};

struct ChannelSummary {
  double mean = 0.0;
  double std_dev = 0.0;  // sample standard deviation over the plateau
};

struct Plateau {
  std::size_t begin = 0;  // first settled sample
  std::size_t end = 0;    // one past the last settled sample
  std::vector<ChannelSummary> channels;  // one per channel passed in, same order
  std::size_t size() const { return end - begin; }
};

// Settled plateaus of `level` (e.g. voltage); `channels` (e.g. voltage and
// current) are summarised over each plateau.
std::vector<Plateau> FindPlateaus(const std::vector<double>& level,
                                  const std::vector<const std::vector<double>*>& channels,
                                  const PlateauOptions& options = {});

// The part of a plateau after its channels have settled. A level's first part is
// dropped as transient (PlateauOptions::settle_fraction), but a free shaft settles
// with its mechanical time constant from a current peak of about ΔV/R, far above a
// no-load current: a level held 10 time constants keeps e^(−5)·ΔV/R in its second
// half, about 1 % of a small motor's no-load current (Tc 2 % high, 4 standard errors,
// measured on a simulated bench). Test: over the kept part [b, e), the means of the
// first and second halves of each channel in `settling` agree within
// kSettledHalvesStandardErrors standard errors of their difference,
// 2·σ·√(f/n) (σ the channel's marginal noise, f = (1 + φ)/(1 − φ) its AR(1)
// inflation, noise_level.h); while not, the first quarter of the kept part is dropped,
// down to 2·min_samples. The test is weak against a decay it only just passes: what
// is left biases the mean by about half the halves' difference, a standard error of
// the mean or so (measured: tests/ingest/segmentation_test.cc), where the plain
// half-dropped mean was 3 off.
inline constexpr double kSettledHalvesStandardErrors = 1.0;
// A level is reported as still settling only when its halves still differ by more
// than this at the shortest length: a Gaussian difference exceeds 4 standard errors
// with probability 6·10⁻⁵ (normal tail), while coloured noise, ripple and a slow
// warm-up drift pass 1–3 (measured: the warning on 22 of 40 real-rig benches with
// 1-s holds of 20 time constants at the threshold of 1).
inline constexpr double kStillSettlingStandardErrors = 4.0;

struct SettledPlateau {
  Plateau plateau;         // re-summarised over its settled part
  bool settled = true;     // false: still trending at the shortest part allowed
  double trend_standard_errors = 0.0;  // the largest halves' difference at the end, in standard errors
};

// A channel whose settling is tested: its index in `channels` and its noise
// (EstimateChannelNoise of the whole channel, computed once per log).
struct SettlingChannel {
  std::size_t index = 0;
  double sigma = 0.0;
  double lag1 = 0.0;
};

SettledPlateau SettlePlateau(const Plateau& plateau, const std::vector<const std::vector<double>*>& channels,
                             const std::vector<SettlingChannel>& settling, std::size_t min_samples);

// Noise σ of a signal from its first differences: MAD(Δx)/(0.6745·√2), robust to steps.
double NoiseFromDifferences(const std::vector<double>& signal);

// Index of the first sample of a step: the first k where |x[k] − x_initial| exceeds
// half the step amplitude, moved back to the last sample still at the initial level.
// Empty when the signal has no step larger than its noise.
std::optional<std::size_t> FindStepOnset(const std::vector<double>& signal);

}  // namespace coilspin
