#pragma once
// What a fit of one motor produces, independent of Ceres: the values with
// their uncertainty, what could not be determined and why, and how each test
// was used. The result file and the table render this and nothing else.

#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace coilspin {

// One estimated quantity, SI, with a two-sided interval at the fit's confidence.
struct QuantityEstimate {
  std::string key;      // "resistance"
  std::string symbol;   // "R"
  std::string unit;     // "ohm"
  double value = 0.0;
  double std_error = 0.0;
  double ci_low = 0.0;
  double ci_high = 0.0;
  double degrees_of_freedom = 0.0;
  std::vector<std::string> tests;    // the test kinds that informed it
  std::string basis;                 // e.g. "measured" / "equal-to-Ke" for Kt; empty otherwise
  std::optional<double> at_voltage_V;
  std::optional<double> at_temperature_degC;
  std::string note;
  // Assumptions this value rests on that its tests cannot check, each in words with
  // the size of its effect where it can be bounded ("brush_drop = 0 V: ...").
  std::vector<std::string> assumes;
};

struct ChannelResidual {
  std::string channel;  // "voltage", "current"
  std::string unit;     // "V", "A"
  double rms = 0.0;     // RMS of measured − model
  double sigma = 0.0;   // noise level the fit weighted this channel by
  double lag1_autocorrelation = 0.0;
  int samples = 0;      // residuals in this channel (plateau means count one each)
};

struct TestSummary {
  std::string kind;     // TestKindToString
  std::string file;
  long samples = 0;     // rows read
  std::string method;   // how the fitter used the log, in words
  std::vector<ChannelResidual> residuals;
  std::vector<std::string> warnings;
  // Per estimated parameter: this test's share of its information (variance
  // contribution, core::GroupStatistics::information_share), summing to 1 over tests.
  std::vector<std::pair<std::string, double>> information_share;
  // Readings set aside as isolated outliers (src/ingest/outliers.h), per channel:
  // the channel's name and the file lines of the readings.
  std::vector<std::pair<std::string, std::vector<long>>> set_aside;
  // Whether the log added anything to the fit (false: no coast found, a step refused,
  // no settled plateau): a test given that contributes nothing is a failure to report.
  bool contributed = false;
};

struct SolverSummary {
  bool converged = false;
  std::string termination;
  int iterations = 0;
  double initial_cost = 0.0;
  double final_cost = 0.0;
};

struct Consistency {
  std::optional<double> kt_over_ke;
  std::optional<double> ci_low;
  std::optional<double> ci_high;
  double tolerance = 0.0;
  std::string verdict;  // "consistent" | "inconsistent" | "not-checked"
  std::string note;
};

// Shaft torque against speed at one terminal voltage, with a pointwise band.
struct TorqueSpeedPoint {
  double speed_rad_s = 0.0;
  double torque_N_m = 0.0;
  double ci_low = 0.0;
  double ci_high = 0.0;
};

struct TorqueSpeedLine {
  double at_voltage_V = 0.0;
  bool includes_friction = false;
  std::vector<TorqueSpeedPoint> points;
};

// How the intervals were made (docs/intervals.md).
struct IntervalReport {
  std::string method = "wald";        // "wald" | "profile" | "bootstrap"
  std::string robust_loss = "none";   // "none" | "huber" | "cauchy"
  int replicates = 0;                 // bootstrap: replicates that converged
  int failed_replicates = 0;
  unsigned long long seed = 0;        // bootstrap seed
  std::vector<std::string> notes;     // sides not found, widened channels, ...
};

struct MotorEstimate {
  std::string motor_label;
  double confidence = 0.95;
  IntervalReport intervals;
  std::vector<QuantityEstimate> parameters;
  std::vector<std::pair<std::string, std::string>> not_identified;  // key, reason
  std::vector<QuantityEstimate> ratios;
  std::vector<QuantityEstimate> derived;
  // Sensor zero readings estimated from the logs (src/model/sensor_offsets.h), keyed by
  // channel ("current"); same entry shape as parameters.
  std::vector<QuantityEstimate> sensor_offsets;
  std::vector<std::string> correlation_names;         // parameters of the covariance, in order
  std::vector<std::vector<double>> correlation;
  std::vector<std::vector<double>> covariance;          // SI, same order (for derived quantities)
  std::optional<TorqueSpeedLine> torque_speed;
  std::optional<Consistency> consistency;
  std::vector<TestSummary> tests;
  std::vector<SolverSummary> solver;
  std::vector<std::string> warnings;
  std::vector<std::pair<std::string, std::string>> settings;  // effective options, as text

  const QuantityEstimate* Find(const std::string& key) const {
    for (const auto& q : parameters)
      if (q.key == key) return &q;
    return nullptr;
  }
};

}  // namespace coilspin
