// Input noise counted apart (fitters/core/input_noise_autocovariance.h): the
// probed lagged sums against their closed form, the widening decision on what
// the input does not explain, and a whole fit whose group leaves the input's
// share out of s_g² and of the widening.
//
// The model throughout is a first-order lag driven by a logged input v,
//     y_{k+1} = a·y_k + (1 − a)·g·v_k,   y_0 = 0,
// with a measured output y + e. White noise δv of σ_v on the logged input moves
// the modelled output by δy_{k+1} = a·δy_k + (1 − a)·g·δv_k, whose variance and
// lag-1 covariance follow by recursion (physics: a linear system driven by white
// noise; the stationary values are those of an AR(1) process, Box & Jenkins §3.2.4):
//     P_0 = 0,  P_{k+1} = a²·P_k + ((1 − a)·g·σ_v)²,   E[δy_{k+1}·δy_k] = a·P_k.

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <vector>

#include "fitters/core/autocorrelation_widening.h"
#include "fitters/core/input_noise_autocovariance.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

// Invented numbers; any stable lag would do. a = 0.9 gives δy a correlation time
// of about 10 samples.
constexpr double kPole = 0.9;
constexpr double kGain = 2.0;
constexpr double kInputSigma = 0.5;

// r_k = y_k − ŷ_k for the lag above; p[0] = g.
struct LagResidual {
  const std::vector<double>* input = nullptr;
  const std::vector<double>* output = nullptr;
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    T modelled = T(0.0);
    for (std::size_t k = 0; k < output->size(); ++k) {
      residual[k] = (*output)[k] - modelled;
      modelled = kPole * modelled + (1.0 - kPole) * *p[0] * (*input)[k];
    }
    return true;
  }
};

// The closed-form a_m = Σ_k a^m·P_k (k < n − m) of the header, m = 0 … max_lag.
std::vector<double> ClosedFormSums(int n, int max_lag = 1) {
  const double drive = (1.0 - kPole) * kGain * kInputSigma;
  std::vector<double> variance(static_cast<std::size_t>(n));
  double p = 0.0;
  for (int k = 0; k < n; ++k) {
    variance[static_cast<std::size_t>(k)] = p;
    p = kPole * kPole * p + drive * drive;
  }
  std::vector<double> sums(static_cast<std::size_t>(max_lag) + 1, 0.0);
  for (int m = 0; m <= max_lag; ++m)
    for (int k = 0; k + m < n; ++k) sums[static_cast<std::size_t>(m)] += std::pow(kPole, m) * variance[static_cast<std::size_t>(k)];
  return sums;
}

struct LagBench {
  std::vector<double> logged_input;  // v + δv
  std::vector<double> output;        // y + e
};

// A square-wave input, the output of the lag to it plus output noise e (AR(1)
// with coefficient phi, marginal σ_e), and the logged input with white δv.
LagBench MakeLagBench(int n, double output_sigma, double phi, unsigned seed) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  LagBench bench;
  double y = 0.0;
  double e = output_sigma * normal(generator);
  for (int k = 0; k < n; ++k) {
    const double v = (k / 200) % 2 == 0 ? 1.0 : -1.0;
    if (k > 0) e = phi * e + output_sigma * std::sqrt(1.0 - phi * phi) * normal(generator);
    bench.output.push_back(y + e);
    bench.logged_input.push_back(v + kInputSigma * normal(generator));
    y = kPole * y + (1.0 - kPole) * kGain * v;
  }
  return bench;
}

TEST(InputNoiseAutocovariance, ProbesAgreeWithTheClosedForm) {
  constexpr int kSamples = 4000;
  const LagBench bench = MakeLagBench(kSamples, 0.1, 0.0, 3);
  const std::vector<double> values = {kGain};
  const InputNoiseModel model = ProbedInputNoise(LagResidual{&bench.logged_input, &bench.output},
                                                 &LagResidual::input, {0}, kSamples, NoiseLevel{kInputSigma});
  const LaggedSums probed = model(values, 3);
  ASSERT_EQ(probed.size(), 4u);
  const std::vector<double> exact = ClosedFormSums(kSamples);
  // Monte Carlo error √(2τ/(nK)) ≈ √(2·10/(4000·16)) ≈ 1.8 % (the header); 8 % is over 4 of them.
  EXPECT_NEAR(probed[0] / exact[0], 1.0, 0.08);
  EXPECT_NEAR(probed[1] / exact[1], 1.0, 0.08);
  // Further lags decay as a^m (AR(1)).
  EXPECT_NEAR(probed[3] / (exact[0] * std::pow(kPole, 3)), 1.0, 0.08);
  // Fixed seed: the same call gives the same sums.
  EXPECT_EQ(model(values, 3), probed);
  // No noise on the input: nothing to explain.
  EXPECT_TRUE(ProbeInputNoise([](const std::vector<double>&, std::vector<double>*) { return true; },
                              bench.logged_input, NoiseLevel{0.0}, 1)
                  .empty());
}

TEST(InputNoiseAutocovariance, ColouredInputNoiseIsProbedAsColoured) {
  // An input channel whose noise is AR(1) with lag-1 correlation φ reaches the lag's
  // output with the stationary variance of two first-order stages in cascade,
  //     Var δy = b²·σ_v²·(1 + a·φ)/((1 − a²)·(1 − a·φ)),   b = (1 − a)·g
  // (an ARMA(2,1) variance; Box & Jenkins ch. 3 — from memory), which is
  // (1 + aφ)/(1 − aφ) = 9.5 times white noise's at a = φ = 0.9: the white probes of
  // the first version missed that factor.
  constexpr int kSamples = 20000;
  constexpr double kPhi = 0.9;
  const LagBench bench = MakeLagBench(kSamples, 0.1, 0.0, 4);
  const InputNoiseModel model = ProbedInputNoise(LagResidual{&bench.logged_input, &bench.output},
                                                 &LagResidual::input, {0}, kSamples, NoiseLevel{kInputSigma, kPhi});
  const LaggedSums probed = model({kGain}, 0);
  const double b = (1.0 - kPole) * kGain;
  const double variance = b * b * kInputSigma * kInputSigma * (1.0 + kPole * kPhi) /
                          ((1.0 - kPole * kPole) * (1.0 - kPole * kPhi));
  // Monte Carlo error of a_0: √(2τ/(nK)) with τ ≈ 40 samples here ≈ 1.6 %; 8 % covers the start from rest too.
  EXPECT_NEAR(probed[0] / (kSamples * variance), 1.0, 0.08);
}

// Residuals e − s·δy: output noise e (unit variance, AR(1) with coefficient phi)
// and s times the input-driven part δy of the header, stationary from rest.
Eigen::VectorXd OutputPlusInputPart(int n, double phi, double input_scale, unsigned seed) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  const double drive = (1.0 - kPole) * kGain * kInputSigma;
  Eigen::VectorXd r(n);
  double u = 0.0, e = normal(generator);
  for (int k = 0; k < n; ++k) {
    if (k > 0) e = phi * e + std::sqrt(1.0 - phi * phi) * normal(generator);
    r(k) = e - input_scale * u;
    u = kPole * u + drive * normal(generator);
  }
  return r;
}

// The input's lag-1 correlation alone trips the widening; taken out, white e is
// not widened and AR(1) e is widened by its own (1 + φ)/(1 − φ).
TEST(InputNoiseAutocovariance, WideningRestsOnWhatTheInputDoesNotExplain) {
  constexpr int kSamples = 20000;
  // Var δy → drive²/(1 − a²) ≈ 0.053; times 3² it is 0.47 of e's variance, and the
  // sum's lag-1 correlation ≈ 0.9·0.47/1.47 ≈ 0.29, far above the 0.05 floor.
  constexpr double kScale = 3.0;
  // The input's part decays as a^m: by lag 400 it is below 10⁻¹⁸ of its variance, so
  // the closed form to that lag explains all of it that Geyer's sum can see.
  std::vector<double> explained = ClosedFormSums(kSamples, 400);
  for (double& sum : explained) sum *= kScale * kScale;
  const Eigen::VectorXd white = OutputPlusInputPart(kSamples, 0.0, kScale, 5);
  ASSERT_TRUE(DecideWidening(white, {}).widened);
  const AutocorrelationWidening apart = DecideWidening(white, explained);
  EXPECT_FALSE(apart.widened) << apart.inflation;
  EXPECT_EQ(apart.inflation, 1.0);

  constexpr double kPhi = 0.3;
  const Eigen::VectorXd correlated = OutputPlusInputPart(kSamples, kPhi, kScale, 6);
  const AutocorrelationWidening own = DecideWidening(correlated, explained);
  ASSERT_TRUE(own.widened);
  // The own part's autocorrelation is the whole series' less the input part's expectation; the
  // input part's realisation differs from that by about √(τ_u/n) of its variance at every lag,
  // correlated over its τ_u ≈ 19 lags (Bartlett, from memory), and the estimate keeps summing
  // pairs while that difference is clearly positive: measured 1.17 here. Never below the
  // own AR(1) factor (its lag-1 estimate: standard error ≈ 1/√n, 9 %), at most 25 % above it.
  EXPECT_GT(own.inflation / ((1.0 + kPhi) / (1.0 - kPhi)), 0.91);
  EXPECT_LT(own.inflation / ((1.0 + kPhi) / (1.0 - kPhi)), 1.25);
  // More explained than there is: no own noise left, no widening.
  EXPECT_FALSE(DecideWidening(correlated, {2.0 * correlated.squaredNorm()}).widened);
}

// A whole fit of g: with the input noise given to its group, s_g² estimates the
// output noise alone and the input's slow error does not widen the interval;
// inverse_information is the covariance before s_g² and widening.
TEST(InputNoiseAutocovariance, FitLeavesTheInputShareOutOfTheGroupTerm) {
  constexpr int kSamples = 4000;
  // Var δy → ((1 − a)·g·σ_v)²/(1 − a²) ≈ 0.053 against σ_e² = 0.25: a sixth of the residual
  // variance. (Where δy dominates, the realised Σ δy², whose relative spread is about
  // √(2τ/n), leaves a noisy remainder: a model of the input noise cannot recover an
  // output noise far below it.)
  constexpr double kOutputSigma = 0.5;
  const LagBench bench = MakeLagBench(kSamples, kOutputSigma, 0.0, 11);
  const LagResidual residual{&bench.logged_input, &bench.output};
  const auto fit_with = [&](bool apart) {
    LeastSquaresProblem problem;
    const int g = problem.AddParameter({"gain", 1.0, 0.0, {}, {}, false});
    GroupSpec spec{"output", kOutputSigma};
    if (apart) spec.input_noise = ProbedInputNoise(residual, &LagResidual::input, {g}, kSamples, NoiseLevel{kInputSigma});
    problem.AddResiduals(problem.AddGroup(spec), {g}, kSamples, residual);
    return problem.Solve(SolveOptions{});
  };
  const FitResult together = fit_with(false);
  const FitResult apart = fit_with(true);
  ASSERT_TRUE(together.usable);
  ASSERT_TRUE(apart.usable);
  // The same least-squares solution, then corrected for the input noise's bias (the next test).
  EXPECT_NEAR(apart.parameters[0].value - apart.input_noise_correction[0], together.parameters[0].value, 1e-10);
  EXPECT_EQ(together.input_noise_correction[0], 0.0);
  // Together: the input's correlated part widens the group (lag-1 ≈ 0.9·0.053/0.303 ≈ 0.16).
  EXPECT_TRUE(together.groups[0].widened_for_autocorrelation);
  EXPECT_FALSE(apart.groups[0].widened_for_autocorrelation);
  // s_g² of the output noise alone: (RSS − a_0)/(n − 1) ≈ 1 in units of σ_e²; its
  // sampling error is √(2/n) ≈ 2 %, plus the realised Σ δy²'s 7 % and the probes' 2 %
  // of a sixth; 10 % bound.
  EXPECT_NEAR(apart.groups[0].own_residual_variance, 1.0, 0.10);
  EXPECT_GT(together.groups[0].own_residual_variance, 1.1);  // ≈ 1.21 with the input's share
  // RSS/(n − 1) itself, input noise included, moves only by the correction's second-order rise.
  EXPECT_NEAR(apart.groups[0].residual_variance / together.groups[0].residual_variance, 1.0, 0.01);
  // One unwidened group: Cov = s_g²·C.
  EXPECT_NEAR(apart.covariance(0, 0) / (apart.groups[0].own_residual_variance * apart.inverse_information(0, 0)),
              1.0, 1e-12);
}

// Errors in variables: an output-error fit of the gain from a noisy logged input
// is attenuated, E[ĝ] ≈ g·Σ(Gv)²/(Σ(Gv)² + Σ(G·δv)²) (the classical attenuation
// of regression on a noisy regressor; Fuller, Measurement Error Models, 1987,
// §1.1 — from memory). Here Σ(G·δv)²/Σ(Gv)² ≈ 0.053/(2² − …) ≈ 1.4 %, about three
// spreads of ĝ. The corrected estimate θ̂ + ½·C·∇A removes it to first order.
TEST(InputNoiseAutocovariance, BiasCorrectionUndoesTheAttenuationOfAGain) {
  constexpr int kSamples = 4000;
  constexpr int kBenches = 40;
  constexpr double kOutputSigma = 0.5;
  double plain_sum = 0.0, corrected_sum = 0.0, spread_sum = 0.0;
  for (int b = 0; b < kBenches; ++b) {
    const LagBench bench = MakeLagBench(kSamples, kOutputSigma, 0.0, 100 + static_cast<unsigned>(b));
    const LagResidual residual{&bench.logged_input, &bench.output};
    LeastSquaresProblem problem;
    const int g = problem.AddParameter({"gain", 1.0, 0.0, {}, {}, false});
    GroupSpec spec{"output", kOutputSigma};
    spec.input_noise = ProbedInputNoise(residual, &LagResidual::input, {g}, kSamples, NoiseLevel{kInputSigma});
    problem.AddResiduals(problem.AddGroup(spec), {g}, kSamples, residual);
    const FitResult fit = problem.Solve(SolveOptions{});
    ASSERT_TRUE(fit.usable);
    corrected_sum += fit.parameters[0].value;
    plain_sum += fit.parameters[0].value - fit.input_noise_correction[0];
    spread_sum += fit.parameters[0].std_error;
  }
  const double plain = plain_sum / kBenches, corrected = corrected_sum / kBenches;
  const double standard_error_of_mean = spread_sum / kBenches / std::sqrt(static_cast<double>(kBenches));
  // The least-squares estimate is low by about 1.4 % (≈ 17 standard errors of the mean of 40).
  EXPECT_LT((plain - kGain) / kGain, -0.008);
  // Corrected: unbiased within 3 standard errors of the mean over 40 benches.
  EXPECT_NEAR(corrected, kGain, 3.0 * standard_error_of_mean);
}

}  // namespace
}  // namespace coilspin::core
