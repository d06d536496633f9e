#include "src/ingest/small_text_and_statistics.h"
#include "src/ingest/encoder_speed.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <limits>
#include <stdexcept>
#include <utility>

#include "src/units/constants.h"

namespace coilspin {
namespace {

// Uniform quantisation of step q: error uniform on [−q/2, q/2], variance q²/12
// (statistics handbook: variance of the uniform distribution).
const double kUniformSigmaPerStep = 1.0 / std::sqrt(12.0);
// Φ⁻¹(0.75): σ = MAD/0.6745 for normal data (normal quantile; statistics handbook).
constexpr double kNormalMadPerSigma = 0.6744897501960817;
// A quadratic has three coefficients: the least number of samples a fit needs.
constexpr std::size_t kQuadraticTerms = 3;
// Noise estimate: 5-sample local fits, the shortest window leaving two degrees
// of freedom beyond the quadratic (the same reasoning as min_half_width).
constexpr std::size_t kNoiseHalfWidth = 2;
// Residuals below this many ulps of the positions' magnitude are rounding, not
// noise (as in segmentation.cc; common practice).
constexpr double kRoundingUlps = 1024.0;
// Weights are reused while a window's time offsets t_j − t_n match, to 10⁻⁶ of
// the window's half-span, those they were computed for; that acts like a
// timestamp error of 10⁻⁶ of the window, far below a data logger's clock
// jitter (common practice), and makes uniform records cost one fit.
constexpr double kReuseTolerance = 1e-6;
// Σ_{k=−m..m} k² = m(m+1)(2m+1)/3 (sum of squares; handbook).
constexpr double kSumOfSquaresDivisor = 3.0;

// Solves the 3×3 system M·r = e_d by Gaussian elimination with partial pivoting.
std::array<double, 3> SolveUnit(std::array<std::array<double, 3>, 3> m, std::size_t d) {
  std::array<double, 3> r{};
  r[d] = 1.0;
  for (std::size_t col = 0; col < 3; ++col) {
    std::size_t pivot = col;
    for (std::size_t row = col + 1; row < 3; ++row)
      if (std::abs(m[row][col]) > std::abs(m[pivot][col])) pivot = row;
    std::swap(m[col], m[pivot]);
    std::swap(r[col], r[pivot]);
    for (std::size_t row = col + 1; row < 3; ++row) {
      const double factor = m[row][col] / m[col][col];
      for (std::size_t k = col; k < 3; ++k) m[row][k] -= factor * m[col][k];
      r[row] -= factor * r[col];
    }
  }
  for (std::size_t col = 3; col-- > 0;) {
    for (std::size_t k = col + 1; k < 3; ++k) r[col] -= m[col][k] * r[k];
    r[col] /= m[col][col];
  }
  return r;
}

// Weights of one coefficient of the least-squares quadratic through samples
// [begin, begin + count), written in x = (t − t_n)/h with h half the window's
// span (so that the normal equations are O(1)): a_d = Σ_j w_j·θ_{begin+j}.
// coefficient 0 is the fitted value at t_n, 1 the slope dθ/dt at t_n.
void QuadraticWeights(const std::vector<double>& time_s, std::size_t begin, std::size_t count, std::size_t n,
                      std::size_t coefficient, std::vector<double>* weights) {
  const double h = 0.5 * (time_s[begin + count - 1] - time_s[begin]);
  weights->resize(count);
  std::array<double, 5> moments{};  // Σ x^p, p = 0..4
  for (std::size_t j = 0; j < count; ++j) {
    const double x = (time_s[begin + j] - time_s[n]) / h;
    (*weights)[j] = x;
    double power = 1.0;
    for (double& moment : moments) {
      moment += power;
      power *= x;
    }
  }
  const std::array<std::array<double, 3>, 3> normal = {{{moments[0], moments[1], moments[2]},
                                                        {moments[1], moments[2], moments[3]},
                                                        {moments[2], moments[3], moments[4]}}};
  const std::array<double, 3> r = SolveUnit(normal, coefficient);
  const double scale = coefficient == 1 ? 1.0 / h : 1.0;
  for (double& w : *weights) w = (r[0] + r[1] * w + r[2] * w * w) * scale;
}

void CheckArguments(const std::vector<double>& time_s, const std::vector<double>& position_rad) {
  if (time_s.size() != position_rad.size())
    throw std::invalid_argument("SpeedFromPosition: time and position must have as many samples");
  if (time_s.size() < kQuadraticTerms)
    throw std::invalid_argument("SpeedFromPosition: a quadratic fit needs at least 3 samples");
  for (std::size_t k = 1; k < time_s.size(); ++k)
    if (!(time_s[k] > time_s[k - 1])) throw std::invalid_argument("SpeedFromPosition: time must increase strictly");
}

// σ_ω of the centred uniform filter: ‖c‖₂ = 1/(Δt·√Σk²).
double CentredSpeedSigma(double position_sigma_rad, std::size_t m, double step_s) {
  const double half = static_cast<double>(m);
  const double sum_of_squares = half * (half + 1.0) * (2.0 * half + 1.0) / kSumOfSquaresDivisor;
  return position_sigma_rad / (step_s * std::sqrt(sum_of_squares));
}

std::size_t ChooseHalfWidth(const std::vector<double>& time_s, const std::vector<double>& position_rad,
                            double position_sigma_rad, const SpeedFromPositionOptions& options) {
  const std::size_t n = time_s.size();
  std::vector<double> steps(n - 1);
  for (std::size_t k = 0; k + 1 < n; ++k) steps[k] = time_s[k + 1] - time_s[k];
  const double step_s = Median(steps);
  const std::size_t span = std::min(2 * options.max_half_width, n - 1);
  double lowest = std::numeric_limits<double>::infinity();
  double highest = -lowest;
  for (std::size_t k = 0; k + span < n; ++k) {
    const double secant = (position_rad[k + span] - position_rad[k]) / (time_s[k + span] - time_s[k]);
    lowest = std::min(lowest, secant);
    highest = std::max(highest, secant);
  }
  const double allowed = options.target_noise_fraction * (highest - lowest);
  for (std::size_t m = options.min_half_width; m <= options.max_half_width; ++m)
    if (CentredSpeedSigma(position_sigma_rad, m, step_s) <= allowed) return m;
  return options.max_half_width;
}

// Derivative weights of the window [begin, begin + count) at sample n, reused
// from the last fit while the time offsets match (kReuseTolerance).
class DerivativeWeights {
 public:
  const std::vector<double>& At(const std::vector<double>& time_s, std::size_t begin, std::size_t count,
                                std::size_t n) {
    offsets_.resize(count);
    for (std::size_t j = 0; j < count; ++j) offsets_[j] = time_s[begin + j] - time_s[n];
    const double half_span = 0.5 * (offsets_.back() - offsets_.front());
    bool same = reference_.size() == count;
    for (std::size_t j = 0; same && j < count; ++j)
      same = std::abs(offsets_[j] - reference_[j]) <= kReuseTolerance * half_span;
    if (!same) {
      QuadraticWeights(time_s, begin, count, n, 1, &weights_);
      std::swap(reference_, offsets_);
    }
    return weights_;
  }

 private:
  std::vector<double> offsets_;
  std::vector<double> reference_;  // the offsets weights_ was computed for
  std::vector<double> weights_;
};

std::string Method(std::size_t window, std::size_t m) {
  return "Savitzky–Golay first derivative, quadratic, " + std::to_string(window) +
         "-sample window (least squares in t; one-sided fits at the first and last " + std::to_string(m) +
         " samples)";
}

}  // namespace

bool SpeedFromPositionOptions::IsValid(std::string* error) const {
  const auto fail = [&](const std::string& why) {
    if (error != nullptr) *error = why;
    return false;
  };
  if (counts_per_rev && !(std::isfinite(*counts_per_rev) && *counts_per_rev > 0.0))
    return fail("counts per revolution must be positive, got " + Format("%g", *counts_per_rev));
  if (half_width && *half_width < 1) return fail("the half width m must be at least 1 (a 3-sample window)");
  if (min_half_width < 1) return fail("min_half_width must be at least 1 (a 3-sample window)");
  if (max_half_width < min_half_width) return fail("max_half_width must not be below min_half_width");
  if (!(std::isfinite(target_noise_fraction) && target_noise_fraction > 0.0))
    return fail("target_noise_fraction must be positive, got " + Format("%g", target_noise_fraction));
  return true;
}

PositionNoise EstimatePositionNoise(const std::vector<double>& time_s, const std::vector<double>& position_rad) {
  CheckArguments(time_s, position_rad);
  const std::size_t n = time_s.size();
  const std::size_t window = 2 * kNoiseHalfWidth + 1;
  std::vector<double> normalised;
  std::vector<double> weights;
  for (std::size_t c = kNoiseHalfWidth; c + kNoiseHalfWidth < n; ++c) {
    const std::size_t begin = c - kNoiseHalfWidth;
    const auto first = position_rad.begin() + static_cast<std::ptrdiff_t>(begin);
    if (std::all_of(first, first + static_cast<std::ptrdiff_t>(window), [&](double x) { return x == *first; }))
      continue;  // at rest the quantisation error is a constant, not noise
    QuadraticWeights(time_s, begin, window, c, 0, &weights);
    // r = θ_c − Σ_j w_j·θ_j = Σ_j h_j·θ_j, h = e_c − w; Σ h_j = 0, so θ_c may be subtracted first.
    double residual = 0.0;
    double norm_squared = 0.0;
    for (std::size_t j = 0; j < window; ++j) {
      const double h = (j == kNoiseHalfWidth ? 1.0 : 0.0) - weights[j];
      residual += h * (position_rad[begin + j] - position_rad[c]);
      norm_squared += h * h;
    }
    normalised.push_back(residual / std::sqrt(norm_squared));
  }
  if (normalised.empty()) return {0.0, "no motion: position noise not estimated"};
  double magnitude = 0.0;
  for (double angle : position_rad) magnitude = std::max(magnitude, std::abs(angle));
  const double rounding = kRoundingUlps * std::numeric_limits<double>::epsilon() * magnitude;
  const double center = Median(normalised);
  for (double& z : normalised) z = std::abs(z - center);
  const double sigma = Median(normalised) / kNormalMadPerSigma;
  if (sigma > rounding) {
    return {sigma, "estimated from the residuals of 5-sample local quadratic fits (MAD), sigma_theta = " +
                       Format("%.3g", sigma) + " rad"};
  }
  double step = std::numeric_limits<double>::infinity();
  for (std::size_t k = 1; k < n; ++k) {
    const double difference = std::abs(position_rad[k] - position_rad[k - 1]);
    if (difference > rounding) step = std::min(step, difference);
  }
  if (!std::isfinite(step)) return {0.0, "no motion beyond rounding: position noise not estimated"};
  return {step * kUniformSigmaPerStep, "positions on a grid of q = " + Format("%.4g", step) +
                                           " rad (the smallest step), sigma_theta = q/sqrt(12)"};
}

DerivedSpeed SpeedFromPosition(const std::vector<double>& time_s, const std::vector<double>& position_rad,
                               const SpeedFromPositionOptions& options) {
  std::string error;
  if (!options.IsValid(&error)) throw std::invalid_argument("SpeedFromPosition: " + error);
  CheckArguments(time_s, position_rad);
  const std::size_t n = time_s.size();

  DerivedSpeed result;
  result.options = options;
  if (options.counts_per_rev) {
    const double step_rad = units::kRadiansPerRevolution / *options.counts_per_rev;
    result.position_sigma_rad = step_rad * kUniformSigmaPerStep;
    result.noise_source = "encoder quantisation: q = 2*pi/" + Format("%g", *options.counts_per_rev) +
                          " rad, sigma_theta = q/sqrt(12) = " + Format("%.3g", result.position_sigma_rad) + " rad";
  } else {
    PositionNoise noise = EstimatePositionNoise(time_s, position_rad);
    result.position_sigma_rad = noise.sigma_rad;
    result.noise_source = std::move(noise.source);
  }
  const std::size_t wanted =
      options.half_width ? *options.half_width
                         : ChooseHalfWidth(time_s, position_rad, result.position_sigma_rad, options);
  const std::size_t m = std::min(wanted, (n - 1) / 2);
  const std::size_t window = 2 * m + 1;
  result.half_width = m;
  result.window_samples = window;
  result.method = Method(window, m);

  result.speed_rad_s.resize(n);
  result.speed_sigma_rad_s.resize(n);
  std::vector<double> correlations;
  correlations.reserve(n - 1);
  DerivativeWeights derivative;
  std::vector<double> previous;
  std::size_t previous_begin = 0;
  double previous_norm_squared = 0.0;
  for (std::size_t k = 0; k < n; ++k) {
    const std::size_t begin = k < m ? 0 : std::min(k - m, n - window);
    const std::vector<double>& weights = derivative.At(time_s, begin, window, k);
    // ω_k = Σ_j c_j·θ_j; Σ c_j = 0 (the slope of a constant), so θ_k is subtracted to keep the digits.
    double speed = 0.0;
    double norm_squared = 0.0;
    for (std::size_t j = 0; j < window; ++j) {
      speed += weights[j] * (position_rad[begin + j] - position_rad[k]);
      norm_squared += weights[j] * weights[j];
    }
    result.speed_rad_s[k] = speed;
    result.speed_sigma_rad_s[k] = result.position_sigma_rad * std::sqrt(norm_squared);
    if (k > 0) {
      // cov(ω_{k−1}, ω_k) = σ_θ²·Σ over shared samples of c_{k−1}·c_k (independent errors).
      double shared = 0.0;
      for (std::size_t g = begin; g < previous_begin + window; ++g)
        shared += previous[g - previous_begin] * weights[g - begin];
      correlations.push_back(shared / std::sqrt(previous_norm_squared * norm_squared));
    }
    previous = weights;
    previous_begin = begin;
    previous_norm_squared = norm_squared;
  }
  result.noise_sigma_rad_s = Median(result.speed_sigma_rad_s);
  result.lag1_correlation = Median(std::move(correlations));
  return result;
}

}  // namespace coilspin
