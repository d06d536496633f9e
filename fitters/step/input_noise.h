#pragma once
// Noise on the logged voltage that drives a step fit (docs/methods.md §3.3).
//
// The step model takes the logged terminal voltage as its input, so the
// voltage channel's noise (σ_v, from first differences) passes through the
// motor's dynamics into the modelled current and speed as a slowly varying
// error the white output-noise model does not count; left out, the intervals
// are too narrow (measured on 40 simulated steps of tests/step's servo motor
// with σ_v = 20 mV: L's 95 % interval held the truth 22 times without this
// term and 40 with it; R 32 and 40, Ke 30 and 40, J 33 and 39; with σ_v = 2 mV
// the term changes little). To first order (a sandwich term, as for
// the locked-rotor capture, fitters/locked_rotor/input_noise.h),
//     δθ = C·g,   g = Σ_c J_cᵀ·δŷ_c/σ_c²,   Cov_v = C·E[g·gᵀ]·C
// with C = (JᵀWJ)⁻¹ (FitResult::inverse_information), not the reported
// covariance (whose s_g² and widening describe the output noise alone: the
// groups leave this noise out of both, GroupSpec::input_noise)
// over the channels c of the log, with δŷ_c the change of the modelled output
// when the input moves by δv. Here E[g·gᵀ] is estimated by random probes:
// δv = σ_v·z with z standard normal and independent per sample, δŷ from one
// forward simulation per probe (so the cost is kInputNoiseProbes simulations,
// not one per sample), averaged over a fixed-seed set of probes. Its Monte
// Carlo error, about √(2/K) relative, is small beside the term's own effect.
// Treating the voltage noise as measurement noise is conservative when part
// of it is real supply ripple that the winding sees.

#include "fitters/core/least_squares.h"
#include "fitters/step/step_fit.h"

namespace coilspin::step {

// Random probes per step log (K).
inline constexpr int kInputNoiseProbes = 128;

// Adds Cov_v of every step log (after AddStep and the solve) to fit->covariance
// and updates the standard errors, intervals and correlation.
void AddStepVoltageNoiseCovariance(const StepTestPlan& plan, core::FitResult* fit);

}  // namespace coilspin::step
