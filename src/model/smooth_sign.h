#pragma once
// sgn(x) made smooth for simulators that need a continuous right-hand side
// (a SPICE transient solver takes Newton steps through it):
//   sgn(x) ≈ tanh(x/w),
// odd, continuous and bounded by 1, within 1e-4 of ±1 for |x| ≥ 5·w
// (tanh 5 = 0.99991). The cost is near x = 0: a torque below Tc does not hold
// the shaft at rest, it lets it creep at ω ≈ w·atanh(τ/Tc); the brush drop
// grows over the first few w of current instead of at once. The widths below
// keep both effects far below a bench's resolution.

namespace coilspin::model {

// Coulomb friction Tc·sgn(ω): w = 0.01 rad/s (≈ 0.1 rpm; common practice for
// a friction model in a circuit simulator, a width well under an encoder's
// speed resolution at bench sample rates).
inline constexpr double kFrictionSignWidth_rad_s = 1e-2;
// Brush drop Vb·sgn(i): w = 1 mA (common practice, well under the no-load
// current of motors this tool fits).
inline constexpr double kBrushSignWidth_A = 1e-3;

}  // namespace coilspin::model
