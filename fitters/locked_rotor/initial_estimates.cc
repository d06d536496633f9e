#include "fitters/locked_rotor/initial_estimates.h"

#include <Eigen/Dense>
#include <cmath>

#include "fitters/locked_rotor/step_residual.h"

namespace coilspin::locked_rotor {
namespace {

// The final level is averaged over this last fraction of a step capture.
constexpr double kFinalLevelFraction = 0.1;

}  // namespace

std::optional<PlateauLine> FitPlateauLine(const std::vector<LockedPlateau>& plateaus,
                                          const std::vector<double>& factors, bool estimate_brush_drop) {
  const int unknowns = estimate_brush_drop ? 2 : 1;
  const int n = static_cast<int>(plateaus.size());
  if (n < unknowns) return std::nullopt;
  Eigen::MatrixXd design(n, unknowns);
  Eigen::VectorXd voltage(n);
  for (int j = 0; j < n; ++j) {
    design(j, 0) = factors[j] * plateaus[j].mean_current_A;             // ∂v̄/∂R
    if (estimate_brush_drop) design(j, 1) = plateaus[j].mean_current_A > 0 ? 1.0 : -1.0;  // ∂v̄/∂Vb
    voltage(j) = plateaus[j].mean_voltage_V;
  }
  Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(design);
  if (qr.rank() < unknowns) return std::nullopt;
  const Eigen::VectorXd solution = qr.solve(voltage);
  PlateauLine line;
  line.resistance_ohm = solution(0);
  if (estimate_brush_drop) line.brush_drop_V = solution(1);
  if (!(line.resistance_ohm > 0.0)) return std::nullopt;
  return line;
}

std::optional<StepStart> EstimateStepStart(const BenchLog& log, double brush_drop_V,
                                           std::optional<double> known_resistance_ohm) {
  const std::size_t n = log.size();
  if (n < 3) return std::nullopt;
  StepStart start;
  if (known_resistance_ohm) {
    start.resistance_ohm = *known_resistance_ohm;
  } else {
    const std::size_t begin = n - std::max<std::size_t>(1, static_cast<std::size_t>(kFinalLevelFraction * n));
    double drive_V = 0.0, current_A = 0.0;
    for (std::size_t k = begin; k < n; ++k) {
      drive_V += DriveVoltage(log.voltage_V[k], brush_drop_V);
      current_A += log.current_A[k];
    }
    if (current_A == 0.0) return std::nullopt;
    start.resistance_ohm = drive_V / current_A;  // R = ū/ī over the final level
  }
  if (!(start.resistance_ohm > 0.0)) return std::nullopt;
  double sum_yd = 0.0, sum_dd = 0.0;
  for (std::size_t k = 1; k + 1 < n; ++k) {
    const double d = (log.current_A[k + 1] - log.current_A[k - 1]) / (log.time_s[k + 1] - log.time_s[k - 1]);
    const double y = DriveVoltage(log.voltage_V[k], brush_drop_V) - start.resistance_ohm * log.current_A[k];
    sum_yd += y * d;  // L·d_k = y_k
    sum_dd += d * d;
  }
  if (!(sum_dd > 0.0)) return std::nullopt;
  start.inductance_H = sum_yd / sum_dd;
  if (!(start.inductance_H > 0.0)) return std::nullopt;
  start.initial_current_A = log.current_A[0];
  return start;
}

}  // namespace coilspin::locked_rotor
