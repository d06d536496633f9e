// The fitted model over each log (MotorEstimate::model_traces, for the report):
// at the right samples, in the log's own sign. Checked against the same bench
// simulated without noise — the truth a fitted model must follow (physics: the
// simulator is the model at the true parameters) — and against the residual
// figures the fitters report for each channel.

#include <gtest/gtest.h>

#include <cmath>
#include <map>

#include "free_shaft/free_shaft_bench.h"

namespace coilspin::testing {
namespace {

double Rms(const std::vector<double>& v) {
  double s = 0.0;
  for (double x : v) s += x * x;
  return std::sqrt(s / static_cast<double>(v.size()));
}

TEST(ModelTraces, FollowTheNoiselessBenchAtTheirSamples) {
  // A motor run backwards too: the coast turns negative (its fitter flips the data to run forward).
  const model::MotorParameters m = IdealMotor(1.4, 0.8e-3, 0.021, 3.2e-5, 1.1e-6, 2.0e-4, 0.0);
  BenchOptions o;
  o.step = true;
  o.torque_column = true;
  std::vector<joint::TestLog> noisy = SimulateBench(m, -12.0, o);
  o.noise_scale = 0.0;
  const std::vector<joint::TestLog> truth = SimulateBench(m, -12.0, o);
  joint::MotorFitOptions options;
  options.keep_model_traces = true;
  const MotorEstimate e = joint::FitMotor(noisy, options);
  ASSERT_EQ(e.tests.size(), 4u);
  ASSERT_FALSE(e.model_traces.empty());
  const std::map<std::string, double> sigma = {  // the bench's noise (free_shaft_bench.h)
      {"voltage", 5e-3}, {"current", 2e-3}, {"speed", 0.2}, {"torque", 2e-4}};
  std::map<std::string, int> seen;
  for (const ModelTrace& t : e.model_traces) {
    const TestSummary& summary = e.tests[t.test];
    const BenchLog* log = nullptr;
    for (const auto& l : truth)
      if (l.log.path == summary.file) log = &l.log;
    ASSERT_NE(log, nullptr) << summary.file;
    const std::vector<double>& clean = log->Channel(*units::QuantityFromName(t.channel));
    ASSERT_EQ(t.model.size(), t.residual.size());
    // The measured side (model + residual: the sample, or the plateau's mean) is the truth at the
    // same samples plus noise; the model is the truth to within the noise of one sample. A sample
    // or a plateau off by one place, or a coast left in its flipped sign, misses by far more (the
    // current of a step jumps by amperes in a sample; a coast turns at -570 rad/s).
    std::vector<double> error, measured_error, standardised;  // standardised: measured error over σ/√n
    for (std::size_t k = 0; k < t.model.size(); ++k) {
      double truth_value = 0.0;
      if (t.plateau_means) {
        const auto [begin, end] = t.spans[k];
        for (std::size_t i = begin; i < end; ++i) truth_value += clean[i] / static_cast<double>(end - begin);
        standardised.push_back((t.model[k] + t.residual[k] - truth_value) * std::sqrt(static_cast<double>(end - begin)));
      } else {
        truth_value = clean[t.first_sample + k];
      }
      error.push_back(t.model[k] - truth_value);
      measured_error.push_back(t.model[k] + t.residual[k] - truth_value);
    }
    const double s = sigma.at(t.channel);
    // A plateau mean of n samples carries σ/√n of white noise (statistics: the mean's standard
    // error), so its standardised errors have an RMS near 1; the settled part of a level can be
    // short (segmentation.h drops what still settles), so the bound is per plateau, not a fixed σ/10.
    if (t.plateau_means) EXPECT_LT(Rms(standardised), 2.0 * s) << summary.kind << " " << t.channel;
    else EXPECT_LT(Rms(measured_error), 1.5 * s) << summary.kind << " " << t.channel;
    EXPECT_LT(Rms(error), 1.5 * s) << summary.kind << " " << t.channel;
    // The residuals are the fitters' own: their RMS is the one the test reports for the channel.
    for (const ChannelResidual& r : summary.residuals)
      if (r.channel == t.channel && r.samples == static_cast<int>(t.residual.size()))
        EXPECT_NEAR(Rms(t.residual), r.rms, 1e-9 * r.rms + 1e-15) << summary.kind << " " << t.channel;
    ++seen[summary.kind + " " + t.channel];
  }
  for (const char* expected : {"locked-rotor voltage", "locked-rotor torque", "no-load voltage", "no-load current",
                               "spin-down speed", "spin-down voltage", "step current", "step speed"})
    EXPECT_EQ(seen[expected], 1) << expected;
}

}  // namespace
}  // namespace coilspin::testing
