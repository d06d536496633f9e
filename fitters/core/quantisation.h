#pragma once
// The error of a quantised reading (an encoder's whole counts), counted exactly.
//
// The problem. An incremental encoder reports whole counts of q: zeroed at the
// start of a log, with the shaft resting a fraction φ ∈ [0, 1) of a count past
// an edge then, the reading is
//     y_k = q·floor(Δ_k/q + φ),   Δ_k = θ_k − θ_0,
// and its error e_k(φ) = y_k − Δ_k is a deterministic function of the path and
// of φ: constant at rest, a sawtooth while turning, slow while turning slowly.
// Treated as white noise of σ = q/√12 it is badly misjudged: measured on step
// fits of a 4096-count encoder, J, B and Tc intervals held the truth in 55 % of
// 40 benches with φ drawn at random (docs/coverage.md). The phase φ is what a
// bench does not control: over φ uniform, E[y_k] = Δ_k exactly
// (E floor(s + φ) = s), so the reading is unbiased and all of its error is the
// spread over φ.
//
// What is computed. At the solution, from the modelled reading ŷ (so Δ̂_k =
// ŷ_k − ŷ_0), the error e(φ_j) for K phases φ_j = (j + ½)/K (a stratified,
// deterministic sample of the uniform phase), and from them
//   - the lagged sums b_m = mean_j Σ_k e_k(φ_j)·e_{k+m}(φ_j), left out of the
//     group's own s_g² and widening like an input's noise
//     (input_noise_autocovariance.h);
//   - the covariance term C·E[g·gᵀ]·C, g = J_gᵀ·e(φ)/σ_g (first-order
//     propagation: δx = C·J_gᵀ·z for a change z of the weighted residuals),
//     added to the group's part of the covariance with no degrees of freedom
//     lost (it is computed, not estimated).
//
// When it breaks. Δ̂ stands for the true path: right to first order. Readings
// that are not whole counts of one step (an absolute encoder with an offset, a
// resolver) do not fit this model; the fitters ask for it only where the
// positions are whole multiples of one step. Counts missed or added by a noisy
// edge are not modelled.

#include <Eigen/Dense>
#include <functional>
#include <vector>

namespace coilspin::core {

// Phases K: the error's spread over φ is estimated to within about 1/K² of a
// count's contribution on a stratified grid (a smooth periodic function of φ);
// 64 makes that negligible at a cost of 64 vector products per group.
inline constexpr int kQuantisationPhases = 64;

// ŷ: the modelled reading of a group at the problem's current values (physical,
// every parameter in the order added), in the order of its residuals; empty when
// the model cannot be evaluated.
using ModelledReading = std::function<std::vector<double>(const std::vector<double>& values)>;

// Calls `visit` with e(φ_j) for j = 0 … K−1, in order, of a reading quantised in
// steps of `step` along the modelled path `modelled` (the reading's own unit), one
// vector reused (K of them would hold K·n values); returns how many were visited:
// 0 when step ≤ 0 or the path is empty.
int VisitQuantisationErrors(const std::vector<double>& modelled, double step,
                            const std::function<void(const Eigen::VectorXd& error)>& visit);

// The ModelledReading of a residual functor r = y − ŷ (the form AddResiduals
// takes) over the logged reading y: ŷ = y − r at the listed parameters.
template <class Residual>
ModelledReading ModelledReadingOf(Residual residual, std::vector<int> parameters, const std::vector<double>* reading) {
  return [residual, parameters, reading](const std::vector<double>& values) -> std::vector<double> {
    std::vector<const double*> at;
    for (int index : parameters) at.push_back(&values[static_cast<std::size_t>(index)]);
    std::vector<double> modelled(reading->size(), 0.0);
    if (!residual(at.data(), modelled.data())) return {};
    for (std::size_t k = 0; k < modelled.size(); ++k) modelled[k] = (*reading)[k] - modelled[k];  // ŷ = y − r
    return modelled;
  };
}

}  // namespace coilspin::core
