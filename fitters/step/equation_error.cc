#include "fitters/step/equation_error.h"

#include <Eigen/Dense>
#include <cmath>

namespace coilspin::step {
namespace {

// The rotor counts as turning once its speed exceeds this many noise σ (a
// Gaussian exceeds 5 σ about once in 3.5 million samples: statistics handbook).
constexpr double kTurningSigmas = 5.0;
// Each regression needs this many rows beyond its three unknowns to average noise
// (common practice: several times the number of unknowns).
constexpr std::size_t kMinRows = 20;

double Sign(double x) { return x > 0.0 ? 1.0 : (x < 0.0 ? -1.0 : 0.0); }

// Least squares y ≈ X·β (three columns) by column-pivoting QR; empty when X is rank deficient.
std::optional<Eigen::Vector3d> Solve3(const Eigen::MatrixXd& x, const Eigen::VectorXd& y) {
  Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(x);
  if (qr.rank() < 3) return std::nullopt;
  return Eigen::Vector3d(qr.solve(y));
}

// θ_k − θ_k₀ from the position channel, or by the trapezoidal rule over ω.
std::vector<double> AngleFrom(const StepSignals& s, std::size_t k0) {
  const std::vector<double>& t = *s.time_s;
  std::vector<double> angle(t.size(), 0.0);
  for (std::size_t k = k0 + 1; k < t.size(); ++k) {
    angle[k] = s.position_rad ? (*s.position_rad)[k] - (*s.position_rad)[k0]
                              : angle[k - 1] + 0.5 * (t[k] - t[k - 1]) * ((*s.speed_rad_s)[k] + (*s.speed_rad_s)[k - 1]);
  }
  return angle;
}

}  // namespace

std::optional<EquationErrorStart> EstimateStepStart(const StepSignals& s, std::string* why) {
  const std::vector<double>& t = *s.time_s;
  const std::vector<double>& v = *s.voltage_V;
  const std::vector<double>& i = *s.current_A;
  const std::vector<double>& w = *s.speed_rad_s;
  const std::size_t n = t.size();
  EquationErrorStart start;
  if (n < kMinRows + 3) {
    *why = "the log is too short for a starting estimate";
    return std::nullopt;
  }

  // Where the rotor begins to turn (the sample before); a rotor that never turns gives no Ke either.
  std::size_t k0 = 0;
  const double threshold = kTurningSigmas * s.speed_noise_rad_s;
  const bool starts_turning = std::fabs(w[0]) > threshold;
  if (!starts_turning) {
    while (k0 < n && std::fabs(w[k0]) <= threshold) ++k0;
    if (k0 > 0) --k0;
  }
  if (k0 + kMinRows + 3 >= n) {
    *why = "the rotor hardly turns in this log";
    return std::nullopt;
  }
  // Electrical: ∫(v − Vb·sgn i) dt = R·∫i dt + L·(i_k − i_0) + Ke·(θ_k − θ_0), from k₀ = 0.
  {
    const std::vector<double> angle = AngleFrom(s, 0);
    Eigen::MatrixXd x(static_cast<Eigen::Index>(n - 1), 3);
    Eigen::VectorXd y(static_cast<Eigen::Index>(n - 1));
    double voltage_integral = 0.0, current_integral = 0.0;
    for (std::size_t k = 1; k < n; ++k) {
      const double dt = t[k] - t[k - 1];
      voltage_integral += dt * (v[k - 1] - s.brush_drop_V * Sign(i[k - 1]));  // v held over [t_k−1, t_k)
      current_integral += 0.5 * dt * (i[k] + i[k - 1]);
      const auto row = static_cast<Eigen::Index>(k - 1);
      x(row, 0) = current_integral;
      x(row, 1) = i[k] - i[0];
      x(row, 2) = angle[k];
      y(row) = voltage_integral;
    }
    const auto beta = Solve3(x, y);
    if (!beta) {
      *why = "the current and speed do not vary independently (is there a step?)";
      return std::nullopt;
    }
    start.resistance_ohm = (*beta)(0);
    start.inductance_H = (*beta)(1);
    start.back_emf = (*beta)(2);
  }

  start.mechanical_start = k0;
  // Mechanical, from k₀, with B taken as 0 (see the header). With a speed channel:
  //   ω_k − ω_k₀ = a·∫i dt − c·∫sgn(ω) dt
  // With an encoder, integrated once more so that no differentiated speed enters
  // (a speed derived from quantised counts is a staircase at low speed):
  //   θ_k − θ_k₀ − ω_k₀·(t_k − t_k₀) = a·∬i dt − c·∬sgn(ω) dt
  {
    const std::vector<double> angle = AngleFrom(s, k0);
    const bool twice = s.position_rad != nullptr;
    const std::size_t rows = n - k0 - 1;
    Eigen::MatrixXd x(static_cast<Eigen::Index>(rows), 2);
    Eigen::VectorXd y(static_cast<Eigen::Index>(rows));
    double current_integral = 0.0, sign_integral = 0.0;  // ∫i, ∫sgn ω
    double current_double = 0.0, sign_double = 0.0;      // ∬i, ∬sgn ω
    for (std::size_t k = k0 + 1; k < n; ++k) {
      const double dt = t[k] - t[k - 1];
      const double previous_current = current_integral, previous_sign = sign_integral;
      current_integral += 0.5 * dt * (i[k] + i[k - 1]);
      sign_integral += 0.5 * dt * (Sign(w[k]) + Sign(w[k - 1]));
      current_double += 0.5 * dt * (current_integral + previous_current);
      sign_double += 0.5 * dt * (sign_integral + previous_sign);
      const auto row = static_cast<Eigen::Index>(k - k0 - 1);
      x(row, 0) = twice ? current_double : current_integral;
      x(row, 1) = twice ? -sign_double : -sign_integral;
      y(row) = twice ? angle[k] - w[k0] * (t[k] - t[k0]) : w[k] - w[k0];
    }
    Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(x);
    if (qr.rank() < 2) {
      *why = "current and time are not independent over the run (no acceleration seen?)";
      return std::nullopt;
    }
    const Eigen::Vector2d beta = qr.solve(y);
    start.torque_over_inertia = beta(0);
    start.viscous_over_inertia = 0.0;
    start.coulomb_over_inertia = beta(1);
  }
  if (!(start.resistance_ohm > 0.0 && start.inductance_H > 0.0 && start.back_emf > 0.0 &&
        start.torque_over_inertia > 0.0)) {
    *why = "the linear estimate gave a non-positive R, L, Ke or Kt/J (R " + std::to_string(start.resistance_ohm) +
           ", L " + std::to_string(start.inductance_H) + ", Ke " + std::to_string(start.back_emf) + ", Kt/J " +
           std::to_string(start.torque_over_inertia) + ")";
    return std::nullopt;
  }
  return start;
}

}  // namespace coilspin::step
