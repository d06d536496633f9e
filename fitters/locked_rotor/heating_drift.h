#pragma once
// Winding heating shows as a resistance that drifts across plateaus.
//
// Each plateau gives an apparent R_j = (v̄_j − Vb·sgn(ī_j)) / (f_j·(ī_j − i_z)),
// i_z the current sensor's zero reading (an offset left in would make R_j differ
// between levels as a drift would: 20 of 40 real-rig benches warned of heating
// that was not there); a
// straight line R_j = a + b·t_j through the plateau times is fitted by
// ordinary least squares. A drift is reported when the change over the test,
// b·(t_last − t_first)/ā, exceeds kDriftWarningFraction and the slope differs
// from zero by more than kDriftWarningSigmas standard errors.

#include <optional>
#include <vector>

#include "fitters/locked_rotor/capture.h"

namespace coilspin::locked_rotor {

// Copper rises ~0.4 %/K (IEC 60028): 0.5 % is a little over 1 K of heating.
inline constexpr double kDriftWarningFraction = 0.005;
inline constexpr double kDriftWarningSigmas = 3.0;

struct ResistanceDrift {
  double relative_change = 0.0;  // (R_last − R_first)/R_mean along the fitted line
  double slope_sigmas = 0.0;     // b / se(b)
};

std::optional<ResistanceDrift> DetectResistanceDrift(const std::vector<LockedPlateau>& plateaus,
                                                     const std::vector<double>& factors, double brush_drop_V,
                                                     double zero_current_A = 0.0);

}  // namespace coilspin::locked_rotor
