#pragma once
// One motor's result against a datasheet, line by line (conformity.h for the
// decision rule).
//
// The value of a line and its interval at the fit's confidence:
//   - a parameter: the result's entry. When the sheet states the temperature of
//     R and the result gives R at another one, R (its value, interval and its
//     row of the covariance) is carried to the sheet's temperature by the
//     copper law R(θ) = R_ref·(k + θ)/(k + θ_ref) (src/model/copper_resistance.h);
//   - a derived quantity: re-evaluated at the sheet's rated voltage from the
//     parameters and their covariance by the delta method
//     (src/result/derived_intervals.h), whatever voltage the fit used.
// A line is "not-tested" when the result does not determine it (the result's
// reason is kept), when a derived quantity needs a parameter the result lacks
// (that parameter's reason), or when the value was given to the fit rather than
// measured (basis "given").

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/verify/conformity.h"
#include "src/verify/datasheet.h"

namespace coilspin::verify {

struct LineCheck {
  SpecLine line;                   // the sheet's line
  std::string key;
  std::string unit;                // SI, as the result file writes it
  Decision decision;
  std::optional<double> value;     // SI; none when not tested
  double ci_low = 0.0, ci_high = 0.0;
  std::vector<std::string> tests;  // the bench tests that informed the value
  std::string value_note;          // the result's note on the value (e.g. "brush drop not determined: taken as 0 V")
  std::optional<double> at_voltage_V;      // a derived line: the rated voltage it was evaluated at
  std::optional<double> at_temperature_degC;  // resistance: the temperature it was compared at
  bool temperature_unknown = false;  // resistance: the sheet states a temperature, the result gives none
  bool rests_on_kt_equal_to_ke = false;  // the value uses Kt taken equal to Ke (not measured)
  // Why a line is not tested.
  enum class NotTested { kNo, kNotDetermined, kGiven, kNoInterval } not_tested = NotTested::kNo;
  // kNotDetermined: the keys the result lacks (the line's own, or those a derived
  // quantity needs) with the result's reasons; kGiven: the key and the result's note.
  std::vector<std::pair<std::string, std::string>> missing;
};

struct MotorCheck {
  std::string result_file;  // as given on the command line
  std::string label;        // the result's motor label
  double confidence = 0.95;
  std::vector<LineCheck> lines;  // the sheet's order

  Verdict Worst() const;  // fail > inconclusive > not-tested > pass
};

MotorCheck CheckMotor(const Datasheet& sheet, const MotorEstimate& estimate, const std::string& result_file);

// Whether every line of every motor passed (exit status 0 of verify).
bool AllPass(const std::vector<MotorCheck>& motors);

}  // namespace coilspin::verify
