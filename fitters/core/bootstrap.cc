// The residual moving-block bootstrap (bootstrap.h): replicate set-up, the
// worker threads, and the percentile summaries.

#include "fitters/core/bootstrap.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <condition_variable>
#include <limits>
#include <memory>
#include <mutex>
#include <optional>
#include <thread>

#include "fitters/core/autocorrelation_widening.h"
#include "fitters/core/block_resampling.h"
#include "fitters/core/require.h"
#include "fitters/core/residual_statistics.h"

namespace coilspin::core {
namespace {

// How often the calling thread reports progress while replicates run: often
// enough to look live, rarely enough to cost nothing (common practice).
constexpr std::chrono::milliseconds kProgressInterval(250);

// 1 − h_k is floored here: a residual the fit determines alone (h_k → 1) has r̂_k ≈ 0,
// and its rescaling must not blow that rounding up (common practice).
constexpr double kMinimumResidualShare = 1e-3;

bool Fail(std::string* error, const std::string& why) {
  if (error != nullptr) *error = why;
  return false;
}

double StandardDeviation(const std::vector<double>& samples) {
  if (samples.size() < 2) return std::numeric_limits<double>::quiet_NaN();
  double mean = 0.0;
  for (double value : samples) mean += value / static_cast<double>(samples.size());
  double sum = 0.0;
  for (double value : samples) sum += (value - mean) * (value - mean);
  return std::sqrt(sum / static_cast<double>(samples.size() - 1));
}

// Everything a replicate needs that is the same for all of them.
struct Plan {
  std::vector<double> values;               // θ̂
  std::vector<Eigen::VectorXd> residuals;   // r̂_g
  std::vector<Eigen::VectorXd> rescaled;    // r̃_g = r̂_g/√(1 − h), centred for blocks: what is drawn from
  std::vector<int> block_lengths;           // ℓ_g; 0 for a wild group
  SolveOptions options;                     // the full fit's, with σ_g held
  // The full fit's input-noise bias correction θ_c − θ̂ (input_noise_bias.cc): a
  // replicate solves plain least squares and is shifted by it, the correction
  // being nearly the same for every replicate (it varies with θ only).
  std::vector<double> correction;
};

// θ*_b, or nothing when the replicate's solve did not converge.
std::optional<std::vector<double>> RunReplicate(LeastSquaresProblem& clone, const Plan& plan,
                                                std::uint64_t seed, int replicate) {
  std::mt19937_64 generator(ReplicateSeed(seed, replicate));
  clone.SetValues(plan.values);
  for (std::size_t g = 0; g < plan.residuals.size(); ++g) {
    const Eigen::VectorXd& fitted = plan.residuals[g];
    if (fitted.size() == 0) continue;
    const Eigen::VectorXd drawn = plan.block_lengths[g] == 0
                                      ? WildResample(plan.rescaled[g], generator)
                                      : ResampleBlocks(plan.rescaled[g], plan.block_lengths[g], generator);
    const Eigen::VectorXd offsets = drawn - fitted;  // δ_g = r*_g − r̂_g
    clone.SetResidualOffsets(static_cast<int>(g), std::vector<double>(offsets.data(), offsets.data() + offsets.size()));
  }
  const FitResult fit = clone.Solve(plan.options);
  if (!fit.converged) return std::nullopt;
  std::vector<double> values = clone.Values();
  for (std::size_t j = 0; j < values.size(); ++j) {
    if (j < plan.correction.size()) values[j] += plan.correction[j];
    if (!std::isfinite(values[j])) return std::nullopt;
  }
  return values;
}

}  // namespace

bool BootstrapOptions::IsValid(std::string* error) const {
  if (replicates < kMinimumBootstrapReplicates) {
    return Fail(error, "replicates must be at least " + std::to_string(kMinimumBootstrapReplicates) + ", got " +
                           std::to_string(replicates));
  }
  if (threads < 0) return Fail(error, "threads must be 0 (all cores) or positive, got " + std::to_string(threads));
  if (!(confidence > 0.0 && confidence < 1.0)) {
    return Fail(error, "confidence must lie strictly between 0 and 1, got " + std::to_string(confidence));
  }
  return true;
}

const ParameterEstimate& BootstrapResult::Get(const std::string& name) const {
  for (const ParameterEstimate& estimate : parameters) {
    if (estimate.name == name) return estimate;
  }
  Require(false, "BootstrapResult::Get: no parameter of that name");
  return parameters.front();
}

PercentileBounds Percentiles(std::vector<double> samples, double confidence) {
  Require(!samples.empty(), "Percentiles: no samples");
  Require(confidence > 0.0 && confidence < 1.0, "Percentiles: confidence must lie in (0, 1)");
  std::sort(samples.begin(), samples.end());
  // Hyndman & Fan type 7: position h = (n − 1)·q, interpolate between ⌊h⌋ and ⌊h⌋ + 1.
  const auto quantile = [&samples](double q) {
    const double h = static_cast<double>(samples.size() - 1) * q;
    const auto below = static_cast<std::size_t>(std::floor(h));
    const std::size_t above = std::min(below + 1, samples.size() - 1);
    return samples[below] + (h - std::floor(h)) * (samples[above] - samples[below]);
  };
  return {quantile(0.5 * (1.0 - confidence)), quantile(0.5 * (1.0 + confidence))};
}

ParameterEstimate BootstrapQuantity(const BootstrapResult& result, const std::string& name,
                                    const std::vector<double>& full_fit_values,
                                    const std::function<double(const std::vector<double>&)>& quantity,
                                    double confidence) {
  ParameterEstimate estimate;
  estimate.name = name;
  estimate.value = quantity(full_fit_values);
  estimate.degrees_of_freedom = std::numeric_limits<double>::quiet_NaN();
  std::vector<double> samples;
  for (const std::vector<double>& values : result.replicates) samples.push_back(quantity(values));
  if (samples.empty()) {
    estimate.std_error = estimate.ci_low = estimate.ci_high = std::numeric_limits<double>::quiet_NaN();
    return estimate;
  }
  estimate.std_error = StandardDeviation(samples);
  const PercentileBounds bounds = Percentiles(samples, confidence);
  estimate.ci_low = bounds.low;
  estimate.ci_high = bounds.high;
  return estimate;
}

double SmallSampleStretch(double degrees_of_freedom, double confidence) {
  if (!(degrees_of_freedom > 0.0) || !std::isfinite(degrees_of_freedom)) return 1.0;
  const double q = 0.5 * (1.0 + confidence);
  return StudentTQuantile(q, degrees_of_freedom) / StudentTQuantile(q, std::numeric_limits<double>::infinity());
}

BootstrapResult Bootstrap(const LeastSquaresProblem& problem, const FitResult& fit,
                          const BootstrapOptions& options) {
  BootstrapResult result;
  std::string error;
  if (!options.IsValid(&error)) {
    result.message = "invalid bootstrap options: " + error;
    return result;
  }
  if (!fit.converged || static_cast<int>(fit.parameters.size()) != problem.NumParameters() ||
      static_cast<int>(fit.groups.size()) != problem.NumGroups()) {
    result.message = "the fit to bootstrap did not converge or is not this problem's";
    return result;
  }

  Plan plan;
  for (const ParameterEstimate& estimate : fit.parameters) plan.values.push_back(estimate.value);
  const std::unique_ptr<LeastSquaresProblem> base = problem.Clone();
  base->SetValues(plan.values);
  for (int g = 0; g < problem.NumGroups(); ++g) {
    base->SetGroupSigma(g, fit.groups[static_cast<std::size_t>(g)].sigma);
    base->SetResidualOffsets(g, {});
  }
  const auto residuals = base->Residuals();
  if (!residuals) {
    result.message = "the residuals could not be evaluated at the fit";
    return result;
  }
  plan.residuals = *residuals;
  for (std::size_t g = 0; g < plan.residuals.size(); ++g) {
    const Eigen::VectorXd& r = plan.residuals[g];
    const GroupStatistics& statistics = fit.groups[g];
    // r̃_k = r̂_k/√(1 − h_k) (block_resampling.h, "Small groups")
    Eigen::VectorXd rescaled = r;
    if (statistics.leverage.size() == r.size())
      for (Eigen::Index k = 0; k < r.size(); ++k)
        rescaled(k) = r(k) / std::sqrt(std::max(1.0 - statistics.leverage(k), kMinimumResidualShare));
    const bool wild = r.size() < kMinResidualsForBlocks;
    if (!wild && rescaled.size() > 0) rescaled.array() -= rescaled.mean();
    plan.rescaled.push_back(rescaled);
    // τ of the group's own part as the fit estimated it; estimated here when the fit did not widen.
    const double tau = fit.options.widen_for_autocorrelation ? statistics.integrated_autocorrelation_time
                                                             : DecideWidening(rescaled, {}).integrated_time;
    plan.block_lengths.push_back(wild ? 0 : BlockLength(static_cast<int>(r.size()), tau));
  }
  result.block_lengths = plan.block_lengths;
  plan.options = fit.options;
  plan.options.estimate_group_sigmas = false;        // the full fit's σ_g, held
  plan.options.residual_variance_from_data = false;  // only θ* is kept; σ_g count as given
  plan.options.widen_for_autocorrelation = false;    // likewise, intervals of a replicate are unused
  plan.options.separate_input_noise = false;
  plan.correction = fit.input_noise_correction;

  const int hardware = std::max(1, static_cast<int>(std::thread::hardware_concurrency()));
  const int threads = std::min(options.replicates, options.threads == 0 ? hardware : options.threads);
  std::vector<std::unique_ptr<LeastSquaresProblem>> clones;
  for (int t = 0; t < threads; ++t) clones.push_back(base->Clone());  // cloned here, used there

  std::vector<std::optional<std::vector<double>>> outcomes(static_cast<std::size_t>(options.replicates));
  std::atomic<int> next{0};
  std::mutex mutex;
  std::condition_variable changed;
  int done = 0;
  std::vector<std::thread> workers;
  for (int t = 0; t < threads; ++t) {
    workers.emplace_back([&, t] {
      LeastSquaresProblem& clone = *clones[static_cast<std::size_t>(t)];
      for (int b = next++; b < options.replicates; b = next++) {
        outcomes[static_cast<std::size_t>(b)] = RunReplicate(clone, plan, options.seed, b);
        const std::lock_guard<std::mutex> lock(mutex);
        ++done;
        changed.notify_one();
      }
    });
  }
  {
    std::unique_lock<std::mutex> lock(mutex);
    while (done < options.replicates) {
      // Wakes at the end or after kProgressInterval, never per replicate.
      changed.wait_for(lock, kProgressInterval, [&] { return done == options.replicates; });
      if (options.progress && done < options.replicates) {
        const int so_far = done;
        lock.unlock();
        options.progress(ProgressStage::kBootstrapReplicates, so_far, options.replicates);
        lock.lock();
      }
    }
  }
  for (std::thread& worker : workers) worker.join();
  ReportProgress(options.progress, ProgressStage::kBootstrapReplicates, options.replicates, options.replicates);

  for (int b = 0; b < options.replicates; ++b) {
    auto& outcome = outcomes[static_cast<std::size_t>(b)];
    if (!outcome) {
      ++result.failed;
      continue;
    }
    result.replicates.push_back(std::move(*outcome));
    result.replicate_numbers.push_back(b);
  }
  const int succeeded = static_cast<int>(result.replicates.size());
  result.usable = succeeded >= kMinimumBootstrapReplicates;
  result.message = std::to_string(succeeded) + " of " + std::to_string(options.replicates) +
                   " replicates converged" +
                   (result.usable ? "" : "; fewer than " + std::to_string(kMinimumBootstrapReplicates) +
                                             ", so no intervals");

  for (std::size_t j = 0; j < fit.parameters.size(); ++j) {
    const ParameterEstimate& full = fit.parameters[j];
    if (full.fixed) {
      result.parameters.push_back(full);
      continue;
    }
    ParameterEstimate estimate;
    if (result.usable) {
      estimate = BootstrapQuantity(
          result, full.name, plan.values, [j](const std::vector<double>& values) { return values[j]; },
          options.confidence);
    } else {
      estimate.name = full.name;
      estimate.value = full.value;
      estimate.std_error = estimate.ci_low = estimate.ci_high = estimate.degrees_of_freedom =
          std::numeric_limits<double>::quiet_NaN();
    }
    estimate.at_bound = full.at_bound;
    result.parameters.push_back(estimate);
  }
  return result;
}

}  // namespace coilspin::core
