// The fitting core against the NIST/ITL Statistical Reference Datasets for
// nonlinear regression (https://www.itl.nist.gov/div898/strd/nls/nls_main.shtml;
// public domain, U.S. government): 27 problems, two starting points each,
// with certified parameter values and certified standard deviations.
//
// Score: the log relative error LRE = −log10(|estimate − certified| / |certified|),
// the number of matching significant digits, capped at the digits the certified
// value is printed with (NIST/ITL StRD; used by Mondragon & Borchers, J. Modern
// Applied Statistical Methods 4(1):343–351, 2005). Target (docs/nist-strd.md):
// ≥ 6 digits for every parameter and every standard deviation from start 2 on
// all 27 sets, and from start 1 except for the sets listed in
// kStartOneFailures.
//
// Every number comes from the .dat files at run time. Run the binary directly to
// see the table of docs/nist-strd.md:
//     build/tests/test_reference --gtest_filter='NistStrd*' | grep '^| '

#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <functional>
#include <limits>
#include <map>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "reference/nist_strd_file.h"
#include "reference/nist_strd_models.h"

namespace coilspin::nist {
namespace {

// Digits at which a parameter or standard deviation counts as reproduced (docs/nist-strd.md).
constexpr double kRequiredDigits = 6.0;

// Sets whose start-1 fit does not reach kRequiredDigits, with the reason
// measured (docs/nist-strd.md). The test checks that each still fails, so the
// list cannot go stale.
const std::map<std::string, std::string> kStartOneFailures = {
    {"BoxBOD",
     "from b1 = 1, b2 = 1 Levenberg-Marquardt moves to b2 = 84, where exp(-b2*x) is 0 at every x >= 1: "
     "the model is the constant b1 = mean(y) and b2 moves no residual, a stationary point the core stops "
     "at and reports (b2 not identifiable, no covariance)"},
    {"MGH17",
     "the solver stops at the default limit of 500 iterations (NO_CONVERGENCE) while still crawling "
     "along the valley between the two exponentials; with max_iterations = 1000 it converges after 605 "
     "iterations to 10.8 digits"},
};

// Sets whose certified standard deviations lie below what double precision
// can reproduce, with the digits that double precision does give. Lanczos1's
// data were generated to 13 digits (the file says so), so its residual sum of
// squares, 1.4e-25, is rounding: the residuals (about 9e-14) are some 200
// units in the last place of y (about 2.5). Storing the decimal data in binary
// already moves every residual by up to half a unit in the last place, about
// 0.1 %, and the standard deviations scale with sqrt(RSS): 3 digits. Measured:
// 3.1 from both starts, whatever the tolerances; the parameters reach 10.5.
// (Evaluating the residual values in quad precision from the decimal text
// gives 7.7 digits from start 1 but 4.8 from start 2, where the last units in
// the last place of the double-precision parameters decide; docs/nist-strd.md.)
struct DigitFloor {
  double digits;
  const char* reason;
};
const std::map<std::string, DigitFloor> kStandardDeviationFloors = {
    {"Lanczos1", {2.5, "certified RSS at the rounding level of double precision"}},
};

// One observation as the core's residual functor: r = Response(y) − f(x; b).
template <class Form>
struct Residual {
  double y;
  std::array<double, Form::kPredictors> x;
  // r = Response(y) − f(x; b), b from the core in physical units
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    std::array<T, Form::kParameters> b;
    for (int k = 0; k < Form::kParameters; ++k) b[static_cast<std::size_t>(k)] = *p[k];
    r[0] = Form::Response(y) - Form::Mean(b.data(), x.data());
    return true;
  }
};

template <class Form>
core::FitResult Fit(const DataSet& data, int start) {
  core::LeastSquaresProblem problem;
  std::vector<int> indices;
  for (const DataSetParameter& parameter : data.parameters) {
    core::ParameterSpec spec;
    spec.name = parameter.name;
    spec.initial = parameter.starts[static_cast<std::size_t>(start - 1)];
    spec.scale = std::abs(spec.initial);
    indices.push_back(problem.AddParameter(spec));
  }
  const int group = problem.AddGroup({data.name, 1.0});
  for (const std::vector<double>& row : data.rows) {
    Residual<Form> residual{row[0], {}};
    for (std::size_t k = 0; k < Form::kPredictors; ++k) residual.x[k] = row[k + 1];
    problem.AddResiduals(group, indices, 1, residual);
  }
  core::SolveOptions options;
  // NIST's certified standard deviations assume independent residuals (the
  // classical s²·(JᵀJ)⁻¹); several sets' residuals are autocorrelated, which the
  // default widening would count.
  options.widen_for_autocorrelation = false;
  return problem.Solve(options);
}

using Fitter = std::function<core::FitResult(const DataSet&, int)>;

struct SetDefinition {
  std::string name;
  int num_parameters;
  std::size_t num_predictors;
  Fitter fit;
};

template <class Form>
SetDefinition Define(const std::string& name) {
  return {name, Form::kParameters, Form::kPredictors, &Fit<Form>};
}

const std::vector<SetDefinition>& Sets() {
  // Ordered as NIST lists them: lower, average, higher difficulty.
  static const std::vector<SetDefinition> sets = {
      Define<ExponentialRise>("Misra1a"),  Define<Chwirut>("Chwirut2"),
      Define<Chwirut>("Chwirut1"),         Define<Lanczos>("Lanczos3"),
      Define<Gauss>("Gauss1"),             Define<Gauss>("Gauss2"),
      Define<DanWood>("DanWood"),          Define<Misra1b>("Misra1b"),
      Define<QuadraticOverQuadratic>("Kirby2"), Define<CubicOverCubic>("Hahn1"),
      Define<Nelson>("Nelson"),            Define<Mgh17>("MGH17"),
      Define<Lanczos>("Lanczos1"),         Define<Lanczos>("Lanczos2"),
      Define<Gauss>("Gauss3"),             Define<Misra1c>("Misra1c"),
      Define<Misra1d>("Misra1d"),          Define<Roszman1>("Roszman1"),
      Define<Enso>("ENSO"),                Define<Mgh09>("MGH09"),
      Define<CubicOverCubic>("Thurber"),   Define<ExponentialRise>("BoxBOD"),
      Define<Rat42>("Rat42"),              Define<Mgh10>("MGH10"),
      Define<Eckerle4>("Eckerle4"),        Define<Rat43>("Rat43"),
      Define<Bennett5>("Bennett5"),
  };
  return sets;
}

// Matching significant digits of `estimate`, between 0 and the certified value's own digits.
double LogRelativeError(double estimate, const CertifiedValue& certified) {
  if (!std::isfinite(estimate)) return 0.0;
  const double cap = certified.significant_digits;
  const double error = std::abs(estimate - certified.value);
  if (error == 0.0) return cap;
  return std::clamp(-std::log10(error / std::abs(certified.value)), 0.0, cap);
}

std::string DataDirectory() { return COILSPIN_NIST_STRD_DIR; }

struct Case {
  std::size_t set;
  int start;
};

struct Score {
  int start;
  double parameter_digits;
  double deviation_digits;
};

std::vector<Score>& Summary() {
  static std::vector<Score> scores;
  return scores;
}

// Prints the averages of docs/nist-strd.md when the whole suite ran in one process.
class NistStrd : public testing::TestWithParam<Case> {
 public:
  static void TearDownTestSuite() {
    for (int start : {1, 2}) {
      double parameters = 0.0, deviations = 0.0, worst = std::numeric_limits<double>::infinity();
      int count = 0;
      for (const Score& score : Summary()) {
        if (score.start != start) continue;
        parameters += score.parameter_digits;
        deviations += score.deviation_digits;
        worst = std::min(worst, score.parameter_digits);
        ++count;
      }
      if (count == 0) continue;
      std::printf("| average, start %d over %d sets | parameters %.1f | standard deviations %.1f | worst parameter %.1f |\n",
                  start, count, parameters / count, deviations / count, worst);
    }
  }
};

TEST_P(NistStrd, ReproducesCertifiedValuesAndStandardDeviations) {
  const std::string directory = DataDirectory();
  if (!std::filesystem::is_directory(directory)) {
    GTEST_SKIP() << "NIST StRD nonlinear regression data not found at " << directory
                 << "; source: NIST/ITL Statistical Reference Datasets";
  }
  const SetDefinition& set = Sets()[GetParam().set];
  const int start = GetParam().start;
  const ReadResult read = ReadDataSet(directory + "/" + set.name + ".dat", set.name);
  ASSERT_TRUE(read.error.empty()) << read.error;
  const DataSet& data = read.data;
  ASSERT_EQ(static_cast<int>(data.parameters.size()), set.num_parameters)
      << set.name << ": the file's parameter count differs from the model form";
  ASSERT_EQ(data.rows.front().size(), 1 + set.num_predictors)
      << set.name << ": the file's predictor count differs from the model form";

  const core::FitResult fit = set.fit(data, start);
  double parameter_digits = std::numeric_limits<double>::infinity();
  double deviation_digits = std::numeric_limits<double>::infinity();
  std::string detail;
  for (std::size_t j = 0; j < data.parameters.size(); ++j) {
    const DataSetParameter& certified = data.parameters[j];
    const core::ParameterEstimate& estimate = fit.Get(certified.name);
    const double value_lre = LogRelativeError(estimate.value, certified.estimate);
    const double deviation_lre = LogRelativeError(estimate.std_error, certified.standard_deviation);
    parameter_digits = std::min(parameter_digits, value_lre);
    deviation_digits = std::min(deviation_digits, deviation_lre);
    char line[160];
    std::snprintf(line, sizeof line, "  %s: %.12g (LRE %.1f), sd %.12g (LRE %.1f)\n", certified.name.c_str(),
                  estimate.value, value_lre, estimate.std_error, deviation_lre);
    detail += line;
  }
  const double rss_lre = LogRelativeError(2.0 * fit.final_cost, data.residual_sum_of_squares);
  std::printf("| %-8s | %d | %5.1f | %5.1f | %5.1f | %4d | %s |\n", set.name.c_str(), start, parameter_digits,
              deviation_digits, rss_lre, fit.iterations, fit.termination.c_str());

  Summary().push_back({start, parameter_digits, deviation_digits});

  const auto known = kStartOneFailures.find(set.name);
  if (start == 1 && known != kStartOneFailures.end()) {
    // Listed as failing from start 1: check that it still does, so the list stays true.
    EXPECT_LT(std::min(parameter_digits, deviation_digits), kRequiredDigits)
        << set.name << " now reaches " << kRequiredDigits
        << " digits from start 1: remove it from kStartOneFailures and docs/nist-strd.md\n"
        << detail;
    return;
  }
  double deviation_required = kRequiredDigits;
  const auto floor = kStandardDeviationFloors.find(set.name);
  if (floor != kStandardDeviationFloors.end()) {
    deviation_required = floor->second.digits;
    // The floor is a limit of double precision, not a target: it must stay below the bar.
    EXPECT_LT(deviation_digits, kRequiredDigits) << set.name << " standard deviations now reach "
                                                 << kRequiredDigits << " digits: remove its floor\n"
                                                 << detail;
  }
  EXPECT_TRUE(fit.usable) << fit.message;
  EXPECT_GE(parameter_digits, kRequiredDigits) << set.name << " start " << start << "\n" << detail << fit.message;
  EXPECT_GE(deviation_digits, deviation_required)
      << set.name << " start " << start << "\n" << detail << fit.message
      << (floor != kStandardDeviationFloors.end() ? std::string("\nfloor: ") + floor->second.reason : "");
}

std::vector<Case> AllCases() {
  std::vector<Case> cases;
  constexpr int kStarts = 2;  // NIST gives two starting points per set
  for (std::size_t set = 0; set < Sets().size(); ++set) {
    for (int start = 1; start <= kStarts; ++start) cases.push_back({set, start});
  }
  return cases;
}

INSTANTIATE_TEST_SUITE_P(AllSets, NistStrd, testing::ValuesIn(AllCases()),
                         [](const testing::TestParamInfo<Case>& info) {
                           return Sets()[info.param.set].name + "_start" + std::to_string(info.param.start);
                         });

}  // namespace
}  // namespace coilspin::nist
