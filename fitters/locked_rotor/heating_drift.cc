#include "fitters/locked_rotor/heating_drift.h"

#include <cmath>

namespace coilspin::locked_rotor {

std::optional<ResistanceDrift> DetectResistanceDrift(const std::vector<LockedPlateau>& plateaus,
                                                     const std::vector<double>& factors, double brush_drop_V,
                                                     double zero_current_A) {
  const std::size_t n = plateaus.size();
  if (n < 3) return std::nullopt;  // a line through two points has no residual to judge it by
  std::vector<double> resistance_ohm(n), time_s(n);
  double mean_r = 0.0, mean_t = 0.0;
  for (std::size_t j = 0; j < n; ++j) {
    const double direction = plateaus[j].mean_current_A > 0.0 ? 1.0 : -1.0;
    // R_j = (v̄_j − Vb·sgn(ī_j)) / (f_j·(ī_j − i_z))
    resistance_ohm[j] = (plateaus[j].mean_voltage_V - brush_drop_V * direction) /
                        (factors[j] * (plateaus[j].mean_current_A - zero_current_A));
    time_s[j] = plateaus[j].mid_time_s;
    mean_r += resistance_ohm[j] / static_cast<double>(n);
    mean_t += time_s[j] / static_cast<double>(n);
  }
  double stt = 0.0, str = 0.0;
  for (std::size_t j = 0; j < n; ++j) {
    stt += (time_s[j] - mean_t) * (time_s[j] - mean_t);
    str += (time_s[j] - mean_t) * (resistance_ohm[j] - mean_r);
  }
  if (!(stt > 0.0)) return std::nullopt;
  const double slope = str / stt;  // b = Σ(t−t̄)(R−R̄)/Σ(t−t̄)²
  double rss = 0.0;
  for (std::size_t j = 0; j < n; ++j) {
    const double e = resistance_ohm[j] - mean_r - slope * (time_s[j] - mean_t);
    rss += e * e;
  }
  const double slope_se = std::sqrt(rss / static_cast<double>(n - 2) / stt);
  ResistanceDrift drift;
  drift.relative_change = slope * (time_s.back() - time_s.front()) / mean_r;
  drift.slope_sigmas = slope_se > 0.0 ? std::fabs(slope) / slope_se : INFINITY;
  if (std::fabs(drift.relative_change) > kDriftWarningFraction && drift.slope_sigmas > kDriftWarningSigmas) return drift;
  return std::nullopt;
}

}  // namespace coilspin::locked_rotor
