#pragma once
// The part of a group's residual autocovariance that noise on a logged input
// explains.
//
// The problem. A model driven by a logged input v (a step fit takes the logged
// terminal voltage) passes that channel's noise δv through its dynamics into the
// modelled output: the residual of group g is then r = e + u, e the output's own
// noise and u = r(v + δv) − r(v) the input's, a slowly varying error because the
// dynamics low-pass it. A separate covariance term counts u exactly (a sandwich
// term, fitters/locked_rotor/input_noise.h, fitters/step/input_noise.h). The
// group's own term s_g²·M_g must then count e alone: neither u's variance in
// s_g² nor u's autocorrelation in the widening of autocorrelation_widening.h,
// else u is counted twice (measured on the joint coverage benchmark: L's interval
// 2.65 spreads wide, covering 100 %; docs/coverage.md).
//
// What is computed. The expected lagged sums of u over the group,
//     a_m = E[ Σ_k u_k·u_{k+m} ],   m = 0 … M
// (a_0 the expected sum of squares), by random probes: δv drawn as AR(1) noise
// of the channel's marginal σ_v and lag-1 correlation φ_v (ar1_noise.h; white
// when φ_v = 0), one evaluation of the residuals per probe, averaged over a
// fixed-seed set of probes. Each probe already averages over the n samples, so
// a few probes suffice: the relative Monte Carlo error of a_m is about
// √(2·τ/(n·K)) for u of correlation time τ samples.
//
// How the core uses it (analysis.cc): with z = r/σ_g and c_m = Σ_k z_k·z_{k+m},
// the output noise's own autocorrelation is estimated as
//     ρ_m = (c_m − a_m/σ_g²) / (c_0 − a_0/σ_g²)
// and its variance s_g² = (RSS_g − a_0/σ_g²)/(n_g − h_g) (group_covariance.h).
//
// When it breaks. u is taken to first order in δv (the probes move the input by
// σ_v, so a model that is far from linear over σ_v is misjudged), and δv as
// measurement noise: supply ripple that the winding really sees is signal, and
// then a_m is too large and the group's own term too small.

#include <Eigen/Dense>
#include <cstdint>
#include <functional>
#include <vector>

#include "fitters/core/ar1_noise.h"
#include "fitters/core/lagged_sums.h"

namespace coilspin::core {

// Probes per evaluation (K): the estimate of a_m is an average over n samples
// already, so its Monte Carlo error at K = 16 is a few percent of a_m for n in
// the hundreds, far below the size of the effect it corrects.
inline constexpr int kInputNoiseAutocovarianceProbes = 16;

// The probes' generator seed: fixed, so the same fit repeats exactly (style.md habit 13).
inline constexpr std::uint64_t kInputNoiseAutocovarianceSeed = 20261203;

// The model of a group's input noise, given to GroupSpec::input_noise: the
// problem's current parameter values (physical, every parameter in the order
// added) and the largest lag M wanted, to a_0 … a_M.
using InputNoiseModel = std::function<LaggedSums(const std::vector<double>& values, int max_lag)>;

// The residuals of a group at `values` when its logged input is `input`; false
// when the model cannot be evaluated.
using ResidualsForInput =
    std::function<bool(const std::vector<double>& input, std::vector<double>* residuals)>;

// a_0 … a_max_lag by random probes of AR(1) noise of the given level on `input`
// (ar1_noise.h; φ = 0 is white). Empty when its σ is not positive or an evaluation fails.
LaggedSums ProbeInputNoise(const ResidualsForInput& residuals, const std::vector<double>& input,
                           const NoiseLevel& noise, int max_lag);

// The InputNoiseModel of a residual functor (the form AddResiduals takes) whose
// logged input is the member `input`: the functor is evaluated at the listed
// parameters with that member pointed at probed copies of the input.
template <class Residual>
InputNoiseModel ProbedInputNoise(Residual residual, const std::vector<double>* Residual::*input,
                                 std::vector<int> parameters, int num_residuals, NoiseLevel noise) {
  return [residual, input, parameters, num_residuals, noise](const std::vector<double>& values,
                                                                   int max_lag) -> LaggedSums {
    std::vector<const double*> at;
    for (int index : parameters) at.push_back(&values[static_cast<std::size_t>(index)]);
    const auto evaluate = [&](const std::vector<double>& logged, std::vector<double>* residuals) {
      Residual moved = residual;
      moved.*input = &logged;
      residuals->assign(static_cast<std::size_t>(num_residuals), 0.0);
      return moved(at.data(), residuals->data());
    };
    return ProbeInputNoise(evaluate, *(residual.*input), noise, max_lag);
  };
}

}  // namespace coilspin::core
