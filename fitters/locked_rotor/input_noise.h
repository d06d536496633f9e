#pragma once
// Noise on the logged voltage that drives a step capture.
//
// The step model takes the logged terminal voltage v as its input. Noise on
// that channel (marginal σ_v and lag-1 correlation φ_v, src/ingest/noise_level.h)
// passes through the
// first-order lag into the modelled current as a slowly varying error, which
// the white current-noise model of the residuals does not count; left out, it
// makes the intervals of R and L too narrow (docs/coverage.md). Its share of
// the covariance follows from first-order error propagation (a sandwich term):
//     δθ = −C·Σ_k J_kᵀ·δr_k/σ_i²,   δr_k = −Σ_m M_km·δv_m,   M_km = ∂î_k/∂v_m
//     Cov_v = C·U·Γ·Uᵀ·C,      U = Jᵀ·M/σ_i²,   Γ_mn = σ_v²·φ_v^|m−n|  (AR(1) noise)
// with C = (JᵀWJ)⁻¹ (FitResult::inverse_information), the estimator's own
// linearisation: not the reported covariance, whose s_g² and autocorrelation
// widening describe the output noise and would scale this term a second time.
// with J = ∂î/∂θ of the step capture. From the recursion
// î_{k+1} = a_k·î_k + (1 − a_k)·u_k/R, M_km = c_m·Π_{l=m+1}^{k−1} a_l for k > m,
// c_m = (1 − a_m)/R·[|v_m| > Vb], so U is computed by one backward pass:
//     S_m = J_{m+1} + a_{m+1}·S_{m+1},   U_m = c_m·S_m/σ_i²,
// and U·Γ·Uᵀ = σ_v²·Σ_m (U_m·U_mᵀ + U_m·Y_mᵀ + Y_m·U_mᵀ) with the running filter
// Y_m = φ_v·(Y_{m−1} + U_{m−1}) = Σ_{n<m} φ_v^{m−n}·U_n (one forward pass; white
// noise, φ_v = 0, leaves Σ_m U_m·U_mᵀ).
// This treats the voltage noise as measurement noise; supply ripple that the
// winding really sees is signal, and then this term is conservative.

#include "fitters/core/least_squares.h"
#include "fitters/core/shared_parameters.h"
#include "fitters/locked_rotor/locked_rotor_fit.h"

namespace coilspin::locked_rotor {

// Adds Cov_v of every step capture to fit->covariance and updates the standard
// errors, intervals (same degrees of freedom) and correlation of the estimates.
void AddVoltageNoiseCovariance(const LockedRotorPlan& plan, const core::SharedParameters& parameters,
                               core::FitResult* fit);

}  // namespace coilspin::locked_rotor
