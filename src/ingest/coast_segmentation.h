#pragma once
// Spin-down segmentation: where the coast of an open-circuit spin-down begins
// (power off) and ends (rest).
//
// Physics. Once the supply is disconnected i = 0 and J·dω/dt = −B·ω − Tc·sgn(ω):
//   ω(t) = (ω₀ + Tc/B)·e^(−t·B/J) − Tc/B,  at rest from t_s = (J/B)·ln(1 + B·ω₀/Tc),
// and the open terminals show the back-EMF, v = Ke·ω.
//
// Power off, from the first evidence that holds (each candidate must lie where
// the speed is still at its run level and before it falls):
//  1. current logged: the first sample of a stretch of at least 20 samples with
//     |i − i_z| ≤ 6 σ_i (σ_i the marginal noise, noise_level.h, and at least two
//     reading steps; i_z the sensor's zero reading, the median of the log's last
//     quarter; a lone sample outside does not end it), after a running current
//     whose median departs from i_z by more than twice that ("current fell to zero");
//  2. voltage logged: the largest one-sample drop of v beyond 8·√2 σ_v whose
//     5-sample medians show a lasting drop, after which v follows the speed
//     (correlation ≥ 0.9 over the coast, v = Ke·ω) ("voltage collapsed to the
//     back-EMF");
//  3. speed alone: the last departure of the speed from its run level (found
//     first with a 2 % drift allowance, then by 4 σ_ω from the median of the
//     32 run samples before it), moved back to where a straight line through
//     the first samples of the fall meets the run level ("speed began to fall").
//  4. no run level at all (the logger started after the supply was cut), the
//     speed falling over the first samples by more than its noise band: the
//     coast starts at the first sample ("the log starts during the coast").
// Rest: the first sample from which |ω| stays within 4 σ_ω for 16 samples (a
// lone sample outside does not break that), moved on to where a straight line
// through the approach meets 0 (by at most those 16 samples: an exponential
// tail never does). The line is fitted twice: first through the samples above
// the band, then through every sample before its crossing, since samples
// chosen for lying above the band sit high.
// σ of speed, voltage and current is the marginal noise of noise_level.h (second
// differences at doubling lags: a ramp does not inflate them and coloured noise is
// counted in full); a derived speed should pass its own σ.
//
// Assumptions: one coast per log, from a steady run; the precision of route 3
// is about σ_ω/|dω/dt| in time, that of routes 1 and 2 one sample.

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "src/ingest/bench_log.h"

namespace coilspin {

// A log that ends while the speed is above 20 % of its run speed has missed the
// end of the coast, where dω/dt → −Tc/J shows the Coulomb friction on its own;
// B and Tc are then hard to separate (common practice).
inline constexpr double kStopsLongBeforeRestFraction = 0.2;

enum class PowerOffEvidence { kCurrentFell, kVoltageCollapsed, kSpeedFell, kStartsCoasting };

// "current fell to zero", "voltage collapsed to the back-EMF", "speed began to fall",
// "the log starts during the coast".
std::string_view PowerOffEvidenceText(PowerOffEvidence evidence);

struct CoastSegment {
  std::size_t power_off = 0;  // first sample of the coast
  std::size_t rest = 0;       // one past the last sample before the rotor is at rest; size() if it never rests
  bool reached_rest = false;
  PowerOffEvidence evidence = PowerOffEvidence::kSpeedFell;
  std::string how;                  // PowerOffEvidenceText(evidence)
  double direction = 1.0;           // sgn ω during the run
  double run_speed_rad_s = 0.0;     // speed level just before power off (signed)
  double speed_sigma_rad_s = 0.0;   // noise σ of the speed used for the bands
  // Current (when logged), against the sensor's reading at zero current (the median
  // of the log's last quarter: its zero offset):
  double zero_current_A = 0.0;      // that reading
  double off_current_mean_A = 0.0;  // mean i − zero over [power_off, rest)
  double off_current_rms_A = 0.0;   // √(mean (i − zero)²) over [power_off, rest)
  double early_current_A = 0.0;     // median i − zero over the first quarter of the coast
  double current_band_A = 0.0;      // the noise band: 6 σ (marginal) and at least two reading steps
  std::size_t size() const { return rest - power_off; }
};

// Why a log holds no coast: the rule that found none, with its numbers.
enum class NoCoastRule {
  kNoSpeed,          // neither speed nor position logged
  kTooFewSamples,    // count < needed (a run and a coast of the minimum lengths)
  kNeverTurns,       // |ω| is 0 throughout
  kNoFall,           // the speed never leaves its run level (value: run level, limit: allowance)
                     // with `needed` samples after it: count = samples after the last run-level sample
  kFallNotDown,      // the straight line through the start of the fall does not fall
  kNoRunNoSlowing,   // no run level, and the first samples do not fall by more than the band
                     // (value: their fall, limit: the band)
  kCoastTooShort,    // power off to rest: count < needed
  kNotFinite,        // the speeds' spread or noise is beyond the range of a double (value: the allowance)
};

struct NoCoast {
  NoCoastRule rule = NoCoastRule::kNoSpeed;
  std::size_t count = 0;
  std::size_t needed = 0;
  double value = 0.0;  // in the speed's SI unit, rad/s, where the rule compares speeds
  double limit = 0.0;
};

// One sentence naming the rule and its numbers (for the log's warning).
std::string NoCoastText(const NoCoast& why);

// A coast shorter than this cannot be fitted (RequireForTest's spin-down minimum).
inline constexpr std::size_t kMinCoastSamples = 20;

// Uses the speed channel; a log with position only is differentiated with
// SpeedFromPosition's defaults (encoder_speed.h). Empty when the log has
// neither, or no coast from a run level; then `why`, when given, says which rule.
std::optional<CoastSegment> FindCoast(const BenchLog& log, NoCoast* why = nullptr);

// With the speed given (e.g. derived from position) and, optionally, its noise
// σ (a filtered speed's σ is not visible in its differences). Throws
// std::invalid_argument when a channel's length differs from the log's.
std::optional<CoastSegment> FindCoast(const BenchLog& log, const std::vector<double>& speed_rad_s,
                                      std::optional<double> speed_sigma_rad_s = std::nullopt,
                                      NoCoast* why = nullptr);

// Current during the coast: its median over the coast's first quarter departs
// from the sensor's zero reading by more than the noise band. A braking current
// (a diode, a driver holding the bridge) follows the back-EMF and is largest at
// power off; a sensor's zero offset is the same at every speed and is not
// braking. False when the log has no current.
bool CurrentFlowsDuringCoast(const BenchLog& log, const CoastSegment& coast);

// The log ends before rest while |ω| (median of its last 5 samples) is still
// above `fraction` of the run speed at power off.
bool StopsLongBeforeRest(const std::vector<double>& speed_rad_s, const CoastSegment& coast,
                         double fraction = kStopsLongBeforeRestFraction);

struct CoastWarnings {
  bool current_flows = false;
  bool stops_long_before_rest = false;
  std::vector<std::string> messages;  // one sentence per warning, with the numbers
};

CoastWarnings CheckCoast(const BenchLog& log, const std::vector<double>& speed_rad_s, const CoastSegment& coast);

}  // namespace coilspin
