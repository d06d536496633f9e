#include "src/ingest/small_text_and_statistics.h"
#include "src/ingest/coast_segmentation.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <limits>
#include <stdexcept>
#include <utility>

#include "src/ingest/encoder_speed.h"
#include "src/ingest/noise_level.h"
#include "src/ingest/segmentation.h"

namespace coilspin {
namespace {

// ---- Noise --------------------------------------------------------------------

// Φ⁻¹(0.75): σ = MAD/0.6745 for normal data (normal quantile; statistics handbook).
constexpr double kNormalMadPerSigma = 0.6744897501960817;
// A first difference of white noise σ has σ·√2, a second difference
// x[k+1] − 2x[k] + x[k−1] has σ·√(1+4+1) (statistics: variance of a linear combination).
const double kDifferenceSigmaPerSigma = std::sqrt(2.0);
const double kSecondDifferenceSigmaPerSigma = std::sqrt(6.0);
// Values that differ by rounding only are not departures: a floor of this many
// ulps of the signal's magnitude under every noise σ (as in segmentation.cc; common practice).
constexpr double kRoundingUlps = 1024.0;

// ---- Power off from the current -----------------------------------------------

// |i| ≤ 6 σ_i is "no current": a Gaussian sample exceeds 6 σ with probability
// 2·10⁻⁹, so a coast of 10⁶ samples stays below (statistics: normal tail).
constexpr double kOffCurrentSigmas = 6.0;
// The running current must be "well above" that: its median over the level
// window at least twice the threshold, 12 σ_i (common practice).
constexpr double kRunCurrentFactor = 2.0;
// ... and the band never narrower than two reading steps of a quantised sensor
// (a reading toggling between two codes is no current).
constexpr double kOffCurrentSteps = 2.0;
// The zero reading is the median of the log's last quarter; the coast's early
// current, judged for braking, the median of its first quarter (common practice).
constexpr std::size_t kZeroReadingDivisor = 4;
constexpr std::size_t kEarlyCoastDivisor = 4;

// ---- Power off from the voltage -----------------------------------------------

// A supply disconnection drops v by R·i + Vb; it must exceed 8 noise σ of a
// one-sample difference, the step minimum of segmentation.h (common practice).
constexpr double kVoltageJumpSigmas = 8.0;
// Medians of 5 samples either side confirm a lasting drop: a spike of up to 2
// samples (an inductive kick at switch-off) cannot move them (order statistics).
constexpr std::size_t kPersistSamples = 5;
// v = Ke·ω must explain at least 81 % (0.9²) of the coast voltage's variance
// (common practice for "follows").
constexpr double kBackEmfMinCorrelation = 0.9;

// ---- Speed levels and the fall ------------------------------------------------

// A Gaussian sample leaves ±4 σ with probability 6·10⁻⁵ (statistics: normal tail),
// so a sample beyond the band has left the level (or rest).
constexpr double kSpeedBandSigmas = 4.0;
// A run held at a constant supply may drift by up to 2 % (winding heating moves
// R·i; common practice); the coarse search for the fall allows that much.
constexpr double kRunDriftFraction = 0.02;
// The run level is the median of 32 samples: its standard error is
// 1.2533·σ/√32 ≈ 0.22 σ (statistics: asymptotic efficiency of the median, √(π/2)).
constexpr std::size_t kLevelSamples = 32;
// Fewer run samples than this before the fall: no run level to speak of (common practice).
constexpr std::size_t kMinRunSamples = 8;
// Straight lines through the start of the fall and the approach to rest use the
// samples within 16 σ beyond the band (slope to ~1/16 of the band per sample's
// noise), but at most 5 % of the run speed deep: dω/dt = −(B/J)·(ω + Tc/B) then
// changes by at most 5 % along the line (physics), and 4 to 64 samples.
constexpr double kLineDepthSigmas = 16.0;
constexpr double kLineMaxDepthFraction = 0.05;
constexpr std::size_t kLineMinSamples = 4;
constexpr std::size_t kLineMaxSamples = 64;
// The level window ends twice the estimated fall time before the coarse
// threshold, so a slope read up to 2× too steep from noisy samples still
// leaves the window on the run (common practice: a safety factor of 2).
constexpr double kFallTimeMargin = 2.0;
// At rest: 16 consecutive samples within the band (each leaves it with
// probability 6·10⁻⁵ when the rotor is still, two in a row with 4·10⁻⁹;
// statistics: normal tail).
constexpr std::size_t kRestHoldSamples = 16;

// ---- Warnings -------------------------------------------------------------------
// The speed at the end of the log: the median of its last 5 samples (a spike of
// up to 2 samples cannot move it; order statistics).
constexpr std::size_t kEndSamples = 5;

double MedianOf(const std::vector<double>& x, std::size_t begin, std::size_t end) {
  return Median(std::vector<double>(x.begin() + static_cast<std::ptrdiff_t>(begin),
                                    x.begin() + static_cast<std::ptrdiff_t>(end)));
}

double RoundingFloor(const std::vector<double>& x) {
  double magnitude = 0.0;
  for (double value : x) magnitude = std::max(magnitude, std::abs(value));
  return kRoundingUlps * std::numeric_limits<double>::epsilon() * magnitude;
}

// The smallest k in [lo, hi) with t_k ≥ time; hi when there is none.
std::size_t FirstSampleAtOrAfter(const std::vector<double>& time_s, double time, std::size_t lo, std::size_t hi) {
  const auto first = time_s.begin() + static_cast<std::ptrdiff_t>(lo);
  const auto last = time_s.begin() + static_cast<std::ptrdiff_t>(hi);
  return lo + static_cast<std::size_t>(std::lower_bound(first, last, time) - first);
}

struct Line {
  double time_mean_s = 0.0;
  double value_mean = 0.0;
  double slope_per_s = 0.0;
  double Crossing(double level) const { return time_mean_s + (level - value_mean) / slope_per_s; }
};

// Least-squares straight line through (t_k, u_k), k in [begin, end).
std::optional<Line> FitLine(const std::vector<double>& time_s, const std::vector<double>& u, std::size_t begin,
                            std::size_t end) {
  if (end < begin + 2) return std::nullopt;
  Line line;
  const auto count = static_cast<double>(end - begin);
  for (std::size_t k = begin; k < end; ++k) {
    line.time_mean_s += time_s[k] / count;
    line.value_mean += u[k] / count;
  }
  double sxx = 0.0;
  double sxy = 0.0;
  for (std::size_t k = begin; k < end; ++k) {
    sxx += (time_s[k] - line.time_mean_s) * (time_s[k] - line.time_mean_s);
    sxy += (time_s[k] - line.time_mean_s) * (u[k] - line.value_mean);
  }
  if (!(sxx > 0.0)) return std::nullopt;
  line.slope_per_s = sxy / sxx;
  return line;
}

double Correlation(const std::vector<double>& a, const std::vector<double>& b, std::size_t begin, std::size_t end) {
  const auto count = static_cast<double>(end - begin);
  double mean_a = 0.0;
  double mean_b = 0.0;
  for (std::size_t k = begin; k < end; ++k) {
    mean_a += a[k] / count;
    mean_b += b[k] / count;
  }
  double saa = 0.0;
  double sbb = 0.0;
  double sab = 0.0;
  for (std::size_t k = begin; k < end; ++k) {
    saa += (a[k] - mean_a) * (a[k] - mean_a);
    sbb += (b[k] - mean_b) * (b[k] - mean_b);
    sab += (a[k] - mean_a) * (b[k] - mean_b);
  }
  return saa > 0.0 && sbb > 0.0 ? sab / std::sqrt(saa * sbb) : 0.0;
}

// The speed turned to run forward (u = sgn·ω), its noise, its run level and
// where the final fall from that level begins.
struct SpeedView {
  double direction = 1.0;
  std::vector<double> forward;
  double sigma = 0.0;
  double band = 0.0;            // kSpeedBandSigmas·σ
  double depth = 0.0;           // how far beyond a level the straight-line fits reach
  double run_level = 0.0;       // P: median of the level window
  std::size_t level_begin = 0;  // the level window [level_begin, level_end)
  std::size_t level_end = 0;
  std::size_t departure = 0;    // first sample of the fall below P − band
  bool starts_in_coast = false; // no run level: the log starts while the shaft already slows
};

// [begin, end) from `begin` on while u ≥ floor_level, kLineMinSamples to kLineMaxSamples long.
std::size_t ForwardWhileAbove(const std::vector<double>& u, std::size_t begin, double floor_level) {
  std::size_t end = begin;
  while (end < u.size() && end - begin < kLineMaxSamples && (end - begin < kLineMinSamples || u[end] >= floor_level))
    ++end;
  return end;
}

std::optional<SpeedView> AnalyseSpeed(const std::vector<double>& time_s, const std::vector<double>& speed_rad_s,
                                      std::optional<double> speed_sigma_rad_s, NoCoast* why) {
  const std::size_t n = speed_rad_s.size();
  const auto refuse = [why](NoCoast reason) {
    *why = reason;
    return std::nullopt;
  };
  if (n < kMinRunSamples + kMinCoastSamples)
    return refuse({NoCoastRule::kTooFewSamples, n, kMinRunSamples + kMinCoastSamples, 0.0, 0.0});
  SpeedView view;
  // Direction: the sign at the largest |ω| held for two samples (a lone spike is no run).
  double held = 0.0;
  std::size_t at = 0;
  for (std::size_t k = 0; k + 1 < n; ++k) {
    const double both = std::min(std::abs(speed_rad_s[k]), std::abs(speed_rad_s[k + 1]));
    if (both > held) {
      held = both;
      at = k;
    }
  }
  if (!(held > 0.0)) return refuse({NoCoastRule::kNeverTurns, n, 0, 0.0, 0.0});
  view.direction = speed_rad_s[at] < 0.0 ? -1.0 : 1.0;
  view.forward.resize(n);
  for (std::size_t k = 0; k < n; ++k) view.forward[k] = view.direction * speed_rad_s[k];
  const std::vector<double>& u = view.forward;
  const double sigma = speed_sigma_rad_s ? *speed_sigma_rad_s : EstimateChannelNoise(u).sigma;
  view.sigma = std::max(sigma, RoundingFloor(u));
  view.band = kSpeedBandSigmas * view.sigma;

  // Coarse: the run level is the median of the samples within the drift allowance
  // of the (held) peak; the fall begins after the last sample at that level.
  double peak = -std::numeric_limits<double>::infinity();
  for (std::size_t k = 0; k + 1 < n; ++k) peak = std::max(peak, std::min(u[k], u[k + 1]));
  const double allowance = std::max(2.0 * view.band, kRunDriftFraction * peak);
  std::vector<double> top;
  for (double value : u)
    if (value >= peak - allowance) top.push_back(value);
  if (top.empty() || !std::isfinite(allowance)) return refuse({NoCoastRule::kNotFinite, n, 0, allowance, 0.0});
  const double coarse_level = Median(std::move(top));
  std::size_t coarse = n;
  while (coarse > 0 && u[coarse - 1] < coarse_level - allowance) --coarse;
  if (coarse == 0 || coarse + kMinCoastSamples > n)
    return refuse({NoCoastRule::kNoFall, n - coarse, kMinCoastSamples, coarse_level, allowance});
  view.depth = std::min(kLineDepthSigmas * view.sigma, kLineMaxDepthFraction * coarse_level);

  // Fine: the level is re-read from the samples before the fall reached the
  // coarse threshold; the slope after `coarse` is the smallest of the early
  // fall (|dω/dt| = (B/J)·(ω + Tc/B) falls with ω), so allowance/|slope|
  // over-estimates the time that took.
  const std::size_t fall_end = ForwardWhileAbove(u, coarse, coarse_level - allowance - view.depth);
  const std::optional<Line> fall = FitLine(time_s, u, coarse, fall_end);
  if (!fall || !(fall->slope_per_s < 0.0))
    return refuse({NoCoastRule::kFallNotDown, fall_end - coarse, 0, fall ? fall->slope_per_s : 0.0, 0.0});
  const double fall_time_s = allowance / -fall->slope_per_s;
  view.level_end = FirstSampleAtOrAfter(time_s, time_s[coarse] - kFallTimeMargin * fall_time_s, 0, coarse);
  // A slow coast after a short run: the margin reaches back past the run's start, while the
  // fall time itself (already an over-estimate, above) still leaves a run window.
  if (view.level_end < kMinRunSamples) view.level_end = FirstSampleAtOrAfter(time_s, time_s[coarse] - fall_time_s, 0, coarse);
  if (view.level_end < kMinRunSamples) {
    // No run before the fall: the logger was started after the supply was cut. The
    // shaft must already be slowing over the first samples (a straight line through
    // them falls by more than the noise band), else this is no coast.
    const std::size_t first = std::min(n, kLineMaxSamples);
    const std::optional<Line> start = FitLine(time_s, u, 0, first);
    const double drop = start ? -start->slope_per_s * (time_s[first - 1] - time_s[0]) : 0.0;
    if (!(drop > view.band)) return refuse({NoCoastRule::kNoRunNoSlowing, first, 0, drop, view.band});
    view.starts_in_coast = true;
    view.run_level = u[0];
    return view;
  }
  view.level_begin = view.level_end - std::min(kLevelSamples, view.level_end);
  view.run_level = MedianOf(u, view.level_begin, view.level_end);
  std::size_t departure = coarse;
  while (departure > view.level_end && u[departure - 1] < view.run_level - view.band) --departure;
  view.departure = departure;
  return view;
}

// Route 3: a straight line through the first samples of the fall meets the run level.
std::size_t OnsetFromSpeed(const std::vector<double>& time_s, const SpeedView& view) {
  const std::size_t end =
      ForwardWhileAbove(view.forward, view.departure, view.run_level - view.band - view.depth);
  const std::optional<Line> line = FitLine(time_s, view.forward, view.departure, end);
  if (!line || !(line->slope_per_s < 0.0)) return view.departure;
  const std::size_t onset =
      FirstSampleAtOrAfter(time_s, line->Crossing(view.run_level), view.level_begin, view.departure);
  return std::min(onset, view.departure);
}

struct Rest {
  std::size_t rest = 0;
  bool reached = false;
};

Rest FindRest(const std::vector<double>& time_s, const SpeedView& view, std::size_t from) {
  const std::vector<double>& u = view.forward;
  const std::size_t n = u.size();
  const auto inside = [&](std::size_t k) { return std::abs(u[k]) <= view.band; };
  // The hold starts in the band and is broken only by two samples in a row
  // outside it: a lone spike at rest does not restart it.
  std::size_t count = 0;
  std::size_t entry = n;
  for (std::size_t k = from; k < n; ++k) {
    const bool holds = inside(k) || (count > 0 && k + 1 < n && inside(k + 1));
    count = holds ? count + 1 : 0;
    if (count == kRestHoldSamples) {
      entry = k + 1 - count;
      break;
    }
  }
  if (entry == n) return {n, false};
  const std::size_t hold_end = entry + kRestHoldSamples;
  std::size_t begin = entry;
  while (begin > from && entry - begin < kLineMaxSamples &&
         (entry - begin < kLineMinSamples || u[begin - 1] <= view.band + view.depth))
    --begin;
  std::optional<Line> line = FitLine(time_s, u, begin, entry);
  if (!line || !(line->slope_per_s < 0.0)) return {entry, true};
  // The samples before `entry` were picked for lying above the band, which
  // biases the line up; one refit through every sample before its crossing
  // (in-band ones included, the rotor still turning) removes that.
  const std::size_t crossing = FirstSampleAtOrAfter(time_s, line->Crossing(0.0), entry, hold_end);
  if (const std::optional<Line> refit = FitLine(time_s, u, begin, crossing); refit && refit->slope_per_s < 0.0)
    line = refit;
  return {FirstSampleAtOrAfter(time_s, line->Crossing(0.0), entry, hold_end), true};
}

// A power-off candidate must lie where the speed is still at its run level.
bool AtRunLevel(const SpeedView& view, std::size_t k) {
  if (k > view.departure || k < kMinRunSamples) return false;
  return MedianOf(view.forward, k - std::min(kLevelSamples, k), k) >= view.run_level - view.band;
}

// The noise band of the current around its zero reading: 6 σ (marginal, coloured
// noise included, noise_level.h), and never less than two reading steps.
double CurrentBand(const std::vector<double>& current_A) {
  const ChannelNoise noise = EstimateChannelNoise(current_A);
  return std::max({kOffCurrentSigmas * noise.sigma, kOffCurrentSteps * noise.step, RoundingFloor(current_A)});
}

// What the current sensor reads at zero current: the median of the log's last
// quarter (one coast per log, so the log ends coasting or at rest). A sensor's
// zero offset is not a current: judged against this, an offset of a few tenths of
// a per cent of full scale no longer hides the power-off or reads as braking.
double ZeroReading(const std::vector<double>& current_A) {
  return MedianOf(current_A, current_A.size() - current_A.size() / kZeroReadingDivisor, current_A.size());
}

// Route 1: the first stretch of kMinCoastSamples or more within the band of the
// zero reading (ended only by two samples outside it), after a running current
// well outside it.
std::optional<std::size_t> OffFromCurrent(const std::vector<double>& current_A, const SpeedView& view) {
  const std::size_t n = current_A.size();
  const double threshold = CurrentBand(current_A);
  const double zero = ZeroReading(current_A);
  const auto above = [&](std::size_t k) { return std::abs(current_A[k] - zero) > threshold; };
  std::size_t k = 0;
  while (k < n) {
    if (above(k)) {
      ++k;
      continue;
    }
    const std::size_t begin = k;
    while (k < n && !(above(k) && (k + 1 == n || above(k + 1)))) ++k;
    if (k - begin < kMinCoastSamples || begin < kMinRunSamples) continue;
    std::vector<double> running;
    for (std::size_t j = begin - std::min(kLevelSamples, begin); j < begin; ++j)
      running.push_back(std::abs(current_A[j] - zero));
    if (Median(std::move(running)) > kRunCurrentFactor * threshold && AtRunLevel(view, begin)) return begin;
  }
  return std::nullopt;
}

// Route 2: the largest lasting one-sample drop of v toward zero, after which v
// follows the speed.
std::optional<std::size_t> OffFromVoltage(const std::vector<double>& time_s, const std::vector<double>& voltage_V,
                                          const SpeedView& view) {
  const std::size_t n = voltage_V.size();
  const double run_voltage = MedianOf(voltage_V, view.level_begin, view.level_end);
  if (run_voltage == 0.0) return std::nullopt;
  const double sign = run_voltage > 0.0 ? 1.0 : -1.0;
  std::vector<double> w(n);
  for (std::size_t k = 0; k < n; ++k) w[k] = sign * voltage_V[k];
  const double sigma = std::max(EstimateChannelNoise(w).sigma, RoundingFloor(w));
  const double threshold = kVoltageJumpSigmas * kDifferenceSigmaPerSigma * sigma;
  std::optional<std::size_t> best;
  double best_jump = -threshold;
  for (std::size_t k = kPersistSamples; k + kPersistSamples <= n; ++k) {
    const double jump = w[k] - w[k - 1];
    if (!(jump < best_jump)) continue;
    if (!(MedianOf(w, k, k + kPersistSamples) < MedianOf(w, k - kPersistSamples, k) - threshold)) continue;
    if (!AtRunLevel(view, k)) continue;
    best = k;
    best_jump = jump;
  }
  if (!best) return std::nullopt;
  const Rest rest = FindRest(time_s, view, *best);
  if (rest.rest < *best + kMinCoastSamples) return std::nullopt;
  if (Correlation(w, view.forward, *best, rest.rest) < kBackEmfMinCorrelation) return std::nullopt;
  return best;
}

void CheckLength(const std::vector<double>& channel, std::size_t n, const char* name) {
  if (!channel.empty() && channel.size() != n)
    throw std::invalid_argument(std::string("FindCoast: the ") + name + " channel must have one value per time sample");
}

}  // namespace

std::string_view PowerOffEvidenceText(PowerOffEvidence evidence) {
  switch (evidence) {
    case PowerOffEvidence::kCurrentFell:
      return "current fell to zero";
    case PowerOffEvidence::kVoltageCollapsed:
      return "voltage collapsed to the back-EMF";
    case PowerOffEvidence::kSpeedFell:
      return "speed began to fall";
    case PowerOffEvidence::kStartsCoasting:
      return "the log starts during the coast";
  }
  return "";
}

std::string NoCoastText(const NoCoast& why) {
  const std::string count = std::to_string(why.count);
  const std::string needed = std::to_string(why.needed);
  switch (why.rule) {
    case NoCoastRule::kNoSpeed:
      return "no coast: the log has neither speed nor position";
    case NoCoastRule::kTooFewSamples:
      return "no coast: " + count + " samples, fewer than the " + needed + " a run and a coast need";
    case NoCoastRule::kNeverTurns:
      return "no coast: the speed is 0 in all " + count + " samples";
    case NoCoastRule::kNoFall:
      return "no coast: the speed stays within " + Format("%.4g", why.limit) + " rad/s of its run level " +
             Format("%.4g", why.value) + " rad/s until " + count + " samples before the end, fewer than the " +
             needed + " a coast needs";
    case NoCoastRule::kFallNotDown:
      return "no coast: the speed leaves its run level but a straight line through the next " + count +
             " samples does not fall (slope " + Format("%.4g", why.value) + " rad/s^2)";
    case NoCoastRule::kNoRunNoSlowing:
      return "no coast: no run level before the fall, and the first " + count + " samples fall by " +
             Format("%.4g", why.value) + " rad/s, not more than the noise band " + Format("%.4g", why.limit) +
             " rad/s";
    case NoCoastRule::kCoastTooShort:
      return "no coast: " + count + " samples from power off to rest, fewer than the " + needed +
             " a fit needs";
    case NoCoastRule::kNotFinite:
      return "no coast: the speed's noise band (" + Format("%.4g", why.value) +
             " rad/s) is beyond the range of a double";
  }
  return "no coast";
}

std::optional<CoastSegment> FindCoast(const BenchLog& log, NoCoast* why) {
  NoCoast ignored;
  if (why == nullptr) why = &ignored;
  if (!log.speed_rad_s.empty()) return FindCoast(log, log.speed_rad_s, std::nullopt, why);
  if (log.position_rad.empty()) {
    *why = {NoCoastRule::kNoSpeed, 0, 0, 0.0, 0.0};
    return std::nullopt;
  }
  if (log.size() < kMinRunSamples + kMinCoastSamples) {
    *why = {NoCoastRule::kTooFewSamples, log.size(), kMinRunSamples + kMinCoastSamples, 0.0, 0.0};
    return std::nullopt;
  }
  const DerivedSpeed derived = SpeedFromPosition(log.time_s, log.position_rad);
  return FindCoast(log, derived.speed_rad_s, derived.noise_sigma_rad_s, why);
}

std::optional<CoastSegment> FindCoast(const BenchLog& log, const std::vector<double>& speed_rad_s,
                                      std::optional<double> speed_sigma_rad_s, NoCoast* why) {
  NoCoast ignored;
  if (why == nullptr) why = &ignored;
  const std::size_t n = log.size();
  if (speed_rad_s.size() != n) throw std::invalid_argument("FindCoast: the speed must have one value per time sample");
  CheckLength(log.current_A, n, "current");
  CheckLength(log.voltage_V, n, "voltage");
  const std::optional<SpeedView> view = AnalyseSpeed(log.time_s, speed_rad_s, speed_sigma_rad_s, why);
  if (!view) return std::nullopt;

  CoastSegment coast;
  std::optional<std::size_t> off;
  if (view->starts_in_coast) {
    off = 0;
    coast.evidence = PowerOffEvidence::kStartsCoasting;
  }
  if (!off && !log.current_A.empty()) {
    off = OffFromCurrent(log.current_A, *view);
    coast.evidence = PowerOffEvidence::kCurrentFell;
  }
  if (!off && !log.voltage_V.empty()) {
    off = OffFromVoltage(log.time_s, log.voltage_V, *view);
    coast.evidence = PowerOffEvidence::kVoltageCollapsed;
  }
  if (!off) {
    off = OnsetFromSpeed(log.time_s, *view);
    coast.evidence = PowerOffEvidence::kSpeedFell;
  }
  coast.power_off = *off;
  coast.how = std::string(PowerOffEvidenceText(coast.evidence));
  const Rest rest = FindRest(log.time_s, *view, coast.power_off);
  coast.rest = rest.rest;
  coast.reached_rest = rest.reached;
  coast.direction = view->direction;
  const std::size_t level = std::min(kLevelSamples, coast.power_off);
  coast.run_speed_rad_s =
      view->direction * (level == 0 ? view->forward.front()
                                    : MedianOf(view->forward, coast.power_off - level, coast.power_off));
  coast.speed_sigma_rad_s = view->sigma;
  if (!log.current_A.empty() && coast.rest > coast.power_off) {
    coast.zero_current_A = ZeroReading(log.current_A);
    double sum = 0.0;
    double squares = 0.0;
    for (std::size_t k = coast.power_off; k < coast.rest; ++k) {
      sum += log.current_A[k] - coast.zero_current_A;
      squares += (log.current_A[k] - coast.zero_current_A) * (log.current_A[k] - coast.zero_current_A);
    }
    const auto count = static_cast<double>(coast.size());
    coast.off_current_mean_A = sum / count;
    coast.off_current_rms_A = std::sqrt(squares / count);
    // The start of the coast against its zero reading: a braking current follows the back-EMF,
    // largest at power off; an offset is the same at every speed.
    const std::size_t early_end = coast.power_off + std::max<std::size_t>(1, coast.size() / kEarlyCoastDivisor);
    coast.early_current_A = MedianOf(log.current_A, coast.power_off, early_end) - coast.zero_current_A;
    coast.current_band_A = CurrentBand(log.current_A);
  }
  return coast;
}

bool CurrentFlowsDuringCoast(const BenchLog& log, const CoastSegment& coast) {
  if (log.current_A.empty() || coast.rest <= coast.power_off) return false;
  return std::abs(coast.early_current_A) > coast.current_band_A;
}

bool StopsLongBeforeRest(const std::vector<double>& speed_rad_s, const CoastSegment& coast, double fraction) {
  if (coast.reached_rest || speed_rad_s.size() <= coast.power_off) return false;
  const std::size_t end = speed_rad_s.size();
  const std::size_t begin = end - std::min(kEndSamples, end - coast.power_off);
  const double final_speed_rad_s = coast.direction * MedianOf(speed_rad_s, begin, end);
  return final_speed_rad_s > fraction * std::abs(coast.run_speed_rad_s);
}

CoastWarnings CheckCoast(const BenchLog& log, const std::vector<double>& speed_rad_s, const CoastSegment& coast) {
  CoastWarnings warnings;
  warnings.current_flows = CurrentFlowsDuringCoast(log, coast);
  if (warnings.current_flows) {
    warnings.messages.push_back("current flows during the coast (" + Format("%.3g", coast.early_current_A) +
                                " A in its first part, mean " + Format("%.3g", coast.off_current_mean_A) +
                                " A, against the sensor's reading at rest " + Format("%.3g", coast.zero_current_A) +
                                " A and a noise band of " + Format("%.3g", coast.current_band_A) +
                                " A): the terminals are not open, a driver or a diode brakes the rotor, and "
                                "B/J and Tc/J include that braking");
  }
  warnings.stops_long_before_rest = StopsLongBeforeRest(speed_rad_s, coast);
  if (warnings.stops_long_before_rest) {
    const std::size_t end = speed_rad_s.size();
    const double final_speed_rad_s =
        coast.direction * MedianOf(speed_rad_s, end - std::min(kEndSamples, end - coast.power_off), end);
    warnings.messages.push_back("the log ends at " +
                                Format("%.0f", 100.0 * final_speed_rad_s / std::abs(coast.run_speed_rad_s)) +
                                " % of the speed at power off (more than " +
                                Format("%.0f", 100.0 * kStopsLongBeforeRestFraction) +
                                " %): the end of the coast, which shows Tc/J on its own, is missing");
  }
  return warnings;
}

}  // namespace coilspin
