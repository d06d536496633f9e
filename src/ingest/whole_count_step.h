#pragma once
// The step of a position channel that holds whole encoder counts.
//
// An incremental encoder logs whole counts of q = 2π/cpr (times any gearing):
// every reading minus the first is a whole multiple of q. The smallest nonzero
// change between consecutive samples is then q itself (a shaft that turns
// slowly somewhere in the log passes one edge at a time), up to the rounding of
// the written readings, which refining q on ever larger displacements removes.
// The step is taken as found only when every reading lies within
// kWholeCountTolerance of a count on that grid, so a position that is not
// quantised (a simulated exact angle, a resolver, a filtered position) is not
// mistaken for counts.

#include <optional>
#include <vector>

namespace coilspin {

// A reading counts as whole when within this fraction of a count of the grid:
// far above the rounding of a position written with 9 significant digits over
// 10⁵ counts (1e-4 of a count), far below the half count a real misfit would show.
inline constexpr double kWholeCountTolerance = 1e-3;

// q, or nothing when the readings are not whole multiples of one step or never change.
std::optional<double> WholeCountStep(const std::vector<double>& position_rad);

}  // namespace coilspin
