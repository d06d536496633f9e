#pragma once
// How a locked-rotor log is used.
//
// A plateau log holds the supply at several levels long enough to settle; only
// the settled means carry information (R, Vb), and using means keeps long logs
// cheap. A step capture samples fast enough to resolve the current rise
// (several samples per electrical time constant L/R); it is fitted sample by
// sample with the logged voltage as input (R, L). The choice is made from the
// data: the current's response to the largest voltage change is timed in samples.

#include <cstddef>
#include <string>
#include <vector>

#include "src/ingest/bench_log.h"
#include "src/ingest/segmentation.h"

namespace coilspin::locked_rotor {

enum class CaptureKind { kPlateaus, kStep };

// Which rule made a log a plateau log rather than a step capture.
enum class PlateauRule {
  kNoVoltageStep,     // no voltage step stands out of the noise (FindStepOnset)
  kNoCurrentChange,   // the current's change across the step is within 5 noise σ
  kRiseTooCoarse,     // the rise is resolved by fewer than kMinSamplesPerTimeConstant samples
};

struct CaptureClassification {
  CaptureKind kind = CaptureKind::kPlateaus;
  PlateauRule rule = PlateauRule::kNoVoltageStep;  // for plateau logs
  std::size_t onset = 0;            // sample where the voltage step begins
  double rise_samples = 0.0;        // samples from onset until the current covers 63 % of its change
  double current_change_A = 0.0;    // the current's change across the step
  double current_noise_A = 0.0;     // its noise σ (differences)
};

// Why a plateau log is not a step capture, with the numbers (for the test's summary).
std::string PlateauRuleText(const CaptureClassification& c);

// A current rise resolved by at least this many samples per time constant is a
// step capture (common practice: 10 samples per time constant). Coarser logs
// would carry a hold-discretisation bias of order (Δ/τ)·R_s/(2R) into L.
inline constexpr double kMinSamplesPerTimeConstant = 10.0;

CaptureClassification ClassifyCapture(const BenchLog& log);

// One settled plateau of a locked-rotor log, with what the fit needs.
struct LockedPlateau {
  double mean_voltage_V = 0.0;
  double mean_current_A = 0.0;
  double voltage_std_V = 0.0;
  double current_std_A = 0.0;
  double mid_time_s = 0.0;
  double temperature_degC = 0.0;    // mean logged temperature, when logged
  bool has_temperature = false;
  double mean_torque_N_m = 0.0;     // mean logged torque (load cell), when logged
  double torque_std_N_m = 0.0;
  bool has_torque = false;
  std::size_t samples = 0;
};

// Settled plateaus whose current is distinguishable from zero.
std::vector<LockedPlateau> FindLockedPlateaus(const BenchLog& log, const PlateauOptions& options);

}  // namespace coilspin::locked_rotor
