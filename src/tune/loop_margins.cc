#include "src/tune/loop_margins.h"

#include <cmath>
#include <complex>
#include <functional>
#include <vector>

#include "src/units/constants.h"

namespace coilspin::tune {
namespace {

using Complex = std::complex<double>;

// The sweep: 10⁻⁴…10⁴ times the design frequency, 100 points a decade (a
// factor's phase moves far less than π between points), then bisection in
// log ω to a relative width of 2^-50 of the bracket.
constexpr double kSweepDecades = 4.0;
constexpr int kPointsPerDecade = 100;
constexpr int kBisections = 50;

// A loop as a product of factors f_k(jω)^e_k, e_k = ±1.
struct Factor {
  std::function<Complex(Complex)> value;
  int exponent;
};

Complex Pi(const PiGains& g, Complex s) { return g.kp + g.ki / s; }

double Magnitude(const std::vector<Factor>& loop, double w) {
  double m = 1.0;
  for (const auto& f : loop) m *= std::pow(std::abs(f.value(Complex(0.0, w))), f.exponent);
  return m;
}

// Phase of each factor at w, on the branch nearest to `previous` (its phase nearby).
std::vector<double> Phases(const std::vector<Factor>& loop, double w, const std::vector<double>& previous) {
  std::vector<double> phases;
  for (std::size_t k = 0; k < loop.size(); ++k) {
    double a = std::arg(loop[k].value(Complex(0.0, w)));
    if (!previous.empty())
      a += units::kRadiansPerRevolution * std::round((previous[k] - a) / units::kRadiansPerRevolution);
    phases.push_back(a);
  }
  return phases;
}

double Total(const std::vector<Factor>& loop, const std::vector<double>& phases) {
  double total = 0.0;
  for (std::size_t k = 0; k < loop.size(); ++k) total += loop[k].exponent * phases[k];
  return total;
}

std::optional<Margin> MarginOf(const std::vector<Factor>& loop, double design_rad_s) {
  const int points = static_cast<int>(2.0 * kSweepDecades * kPointsPerDecade);
  const double low = design_rad_s * std::pow(10.0, -kSweepDecades);
  const double step = std::pow(10.0, 1.0 / kPointsPerDecade);
  double w = low;
  std::vector<double> phases = Phases(loop, w, {});
  bool above = Magnitude(loop, w) >= 1.0;
  for (int k = 1; k <= points; ++k) {
    const double next = w * step;
    const std::vector<double> next_phases = Phases(loop, next, phases);
    const bool next_above = Magnitude(loop, next) >= 1.0;
    if (above && !next_above) {
      double lo = w, hi = next;  // |L(lo)| ≥ 1 > |L(hi)|
      for (int b = 0; b < kBisections; ++b) {
        const double mid = std::sqrt(lo * hi);
        (Magnitude(loop, mid) >= 1.0 ? lo : hi) = mid;
      }
      const double crossover = std::sqrt(lo * hi);
      const double phase = Total(loop, Phases(loop, crossover, phases));
      return Margin{crossover, units::kDegreesPerRevolution / 2.0 + phase * units::kDegreesPerRevolution /
                                                                        units::kRadiansPerRevolution};
    }
    w = next;
    phases = next_phases;
    above = next_above;
  }
  return std::nullopt;
}

}  // namespace

std::optional<Margin> CurrentLoopMargin(const model::MotorParameters& p, const PiGains& current, double design) {
  const double r = p.resistance_ohm, l = p.inductance_H, j = p.inertia_kg_m2, b = p.viscous_friction_N_m_s_per_rad;
  const double ktke = p.torque_constant_N_m_per_A * p.back_emf_constant_V_s_per_rad;
  const std::vector<Factor> loop = {
      {[=](Complex s) { return Pi(current, s); }, 1},
      {[=](Complex s) { return j * s + b; }, 1},                              // J·s + B
      {[=](Complex s) { return (l * s + r) * (j * s + b) + ktke; }, -1}};     // (L·s + R)(J·s + B) + Kt·Ke
  return MarginOf(loop, design);
}

std::optional<Margin> SpeedLoopMargin(const model::MotorParameters& p, const PiGains& current, const PiGains& speed,
                                      double design) {
  const double r = p.resistance_ohm, l = p.inductance_H, j = p.inertia_kg_m2, b = p.viscous_friction_N_m_s_per_rad;
  const double kt = p.torque_constant_N_m_per_A, ktke = kt * p.back_emf_constant_V_s_per_rad;
  // T_i·Kt/(J·s + B) = C_i·Kt / ((L·s + R + C_i)(J·s + B) + Kt·Ke), times s/s to keep every factor finite at ω → 0:
  //   = (kp_i·s + ki_i)·Kt / (s·(L·s + R + kp_i)(J·s + B) + ki_i·(J·s + B) + Kt·Ke·s)
  const std::vector<Factor> loop = {
      {[=](Complex s) { return Pi(speed, s); }, 1},
      {[=](Complex s) { return (current.kp * s + current.ki) * kt; }, 1},
      {[=](Complex s) { return s * (l * s + r + current.kp) * (j * s + b) + current.ki * (j * s + b) + ktke * s; },
       -1}};
  return MarginOf(loop, design);
}

}  // namespace coilspin::tune
