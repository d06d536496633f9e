// The brushless winding conventions and the Kt/Ke factors they produce, checked
// against a star-connected sinusoidal machine evaluated numerically here (physics:
// power balance T·ω = Σ e·i and the phase EMFs sampled over one electrical turn)
// and against references.md ("brushless conventions").

#include "src/check/winding_conventions.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "src/units/constants.h"

namespace coilspin::check {
namespace {

const double kPiFromCosine = std::acos(-1.0);  // physics (definition: cos π = −1)

const MismatchFactor* FactorNamed(const std::string& name) {
  for (const MismatchFactor& factor : WindingConventionFactors()) {
    if (factor.name == name) return &factor;
  }
  return nullptr;
}

// A star-connected machine with phase EMF amplitude k_ph per rad/s, currents of
// amplitude Î in phase with the EMFs, sampled at `steps` electrical angles.
struct SampledStarMachine {
  double line_to_line_peak_V = 0.0;
  double phase_rms_V = 0.0;
  double line_to_line_rms_V = 0.0;
  double torque_N_m = 0.0;  // T = Σ e·i / ω, the same at every angle
};

SampledStarMachine Sample(double k_ph, double speed_rad_s, double current_peak_A, int steps) {
  SampledStarMachine m;
  const double third = 2.0 * kPiFromCosine / 3.0;  // physics: phases 120° apart
  double sum_phase_sq = 0.0, sum_line_sq = 0.0;
  for (int s = 0; s < steps; ++s) {
    const double theta = 2.0 * kPiFromCosine * s / steps;
    const double e[3] = {k_ph * speed_rad_s * std::sin(theta), k_ph * speed_rad_s * std::sin(theta - third),
                         k_ph * speed_rad_s * std::sin(theta + third)};
    const double i[3] = {current_peak_A * std::sin(theta), current_peak_A * std::sin(theta - third),
                         current_peak_A * std::sin(theta + third)};
    m.line_to_line_peak_V = std::max(m.line_to_line_peak_V, std::fabs(e[0] - e[1]));
    sum_phase_sq += e[0] * e[0];
    sum_line_sq += (e[0] - e[1]) * (e[0] - e[1]);
    m.torque_N_m = (e[0] * i[0] + e[1] * i[1] + e[2] * i[2]) / speed_rad_s;
  }
  m.phase_rms_V = std::sqrt(sum_phase_sq / steps);
  m.line_to_line_rms_V = std::sqrt(sum_line_sq / steps);
  return m;
}

TEST(WindingConstants, SqrtTwoAndSqrtThree) {
  EXPECT_DOUBLE_EQ(units::kSinusoidPeakOverRms, std::sqrt(2.0));       // physics: sinusoid peak/rms
  EXPECT_DOUBLE_EQ(units::kStarLineOverPhaseVoltage, std::sqrt(3.0));  // physics: |1 − e^(−j2π/3)|
  EXPECT_EQ(units::kDefaultKtKeTolerance, 0.05);                       // common practice (stated default)
}

TEST(WindingConventions, TheBriefsFactorsAreAllPresent) {
  // physics (header derivation): √3, √2, 3/2 and their combinations, both ways
  const std::pair<const char*, double> expected[] = {
      {"\u221a3", std::sqrt(3.0)},       {"1/\u221a3", 1.0 / std::sqrt(3.0)}, {"\u221a2", std::sqrt(2.0)},
      {"1/\u221a2", 1.0 / std::sqrt(2.0)}, {"3/2", 1.5},                     {"2/3", 2.0 / 3.0},
      {"\u221a3/2", std::sqrt(3.0) / 2.0}, {"2/\u221a3", 2.0 / std::sqrt(3.0)}};
  for (const auto& [name, value] : expected) {
    const MismatchFactor* factor = FactorNamed(name);
    ASSERT_NE(factor, nullptr) << name;
    EXPECT_NEAR(factor->kt_over_ke, value, 1e-14) << name;
    EXPECT_EQ(factor->kind, MismatchKind::kWindingConvention);
  }
  for (const MismatchFactor& factor : WindingConventionFactors()) {
    EXPECT_GT(std::fabs(factor.kt_over_ke - 1.0), 0.1) << factor.name;  // physics: consistent pairs are left out
  }
}

TEST(WindingConventions, NumericalStarMachineGivesTheTableFactors) {
  const double k_ph = 0.02, speed_rad_s = 300.0, current_peak_A = 4.0;
  const SampledStarMachine m = Sample(k_ph, speed_rad_s, current_peak_A, 3600);
  // physics: torque per ampere peak and per ampere rms (Î = √2·I_rms), EMFs per rad/s
  const double kt_peak = m.torque_N_m / current_peak_A;
  const double kt_rms = m.torque_N_m / (current_peak_A / std::sqrt(2.0));
  const double ke_line_peak = m.line_to_line_peak_V / speed_rad_s;
  const double ke_line_rms = m.line_to_line_rms_V / speed_rad_s;
  const double ke_phase_rms = m.phase_rms_V / speed_rad_s;
  EXPECT_NEAR(kt_peak, 1.5 * k_ph, 1e-12);  // physics: Σ sin² over three phases = 3/2

  // references.md: Kt per A peak = (√3/2)·Ke_LL,pk
  EXPECT_NEAR(FactorNamed("\u221a3/2")->kt_over_ke, kt_peak / ke_line_peak, 1e-5);
  EXPECT_NE(FactorNamed("\u221a3/2")->explanation.find("line-to-line in peak volts"), std::string::npos);
  EXPECT_NE(FactorNamed("\u221a3/2")->explanation.find("whole machine per ampere peak"), std::string::npos);
  // references.md: Kt per A rms = √3·Ke_LL,rms
  EXPECT_NEAR(FactorNamed("\u221a3")->kt_over_ke, kt_rms / ke_line_rms, 1e-9);
  EXPECT_NE(FactorNamed("\u221a3")->explanation.find("line-to-line in rms volts"), std::string::npos);
  // physics: per phase (k_ph) against a line-to-line peak Ke (√3·k_ph) gives 1/√3
  EXPECT_NEAR(FactorNamed("1/\u221a3")->kt_over_ke, k_ph / ke_line_peak, 1e-5);
  // physics: per phase (k_ph) against a phase rms Ke (k_ph/√2) gives √2
  EXPECT_NEAR(FactorNamed("\u221a2")->kt_over_ke, k_ph / ke_phase_rms, 1e-9);
  // physics: the whole machine per A rms against a phase rms Ke gives 3
  EXPECT_NEAR(FactorNamed("3")->kt_over_ke, kt_rms / ke_phase_rms, 1e-9);
}

TEST(WindingConventions, ExplanationsNameTheConventions) {
  // references.md (brushless conventions): Ke_LL,pk = √3·k_ph
  const std::string& line_peak = FactorNamed("1/\u221a3")->explanation;
  EXPECT_NE(line_peak.find("Ke quoted line-to-line in peak volts (\u221a3\u00b7k_ph) while Kt is per phase (k_ph)"),
            std::string::npos)
      << line_peak;
  EXPECT_NE(line_peak.find("factor \u221a3, Ke the larger"), std::string::npos) << line_peak;
  // physics: 3/2 is produced with Kt the larger only; 2/3 is its reverse
  EXPECT_NE(FactorNamed("3/2")->explanation.find("Kt the larger"), std::string::npos);
  EXPECT_EQ(FactorNamed("3/2")->explanation.find("the reverse of"), std::string::npos);
  EXPECT_EQ(FactorNamed("2/3")->explanation.rfind("the reverse of", 0), 0u);
  EXPECT_NE(FactorNamed("2/3")->explanation.find("Ke the larger"), std::string::npos);
  // physics: two pairs give 1/√3: per phase with line-to-line peak, per phase per A rms with line-to-line rms
  EXPECT_NE(FactorNamed("1/\u221a3")->explanation.find("; or "), std::string::npos);
}

}  // namespace
}  // namespace coilspin::check
