// Lot statistics (src/verify/lot_statistics.h) against NumPy and SciPy from
// Debian (COILSPIN_PYTHON) on the same numbers: mean and sample standard
// deviation (numpy, ddof=1), Cpk (ISO 22514-2: min(USL − x̄, x̄ − LSL)/(3s),
// computed there from numpy's figures), the MAD (scipy.stats.median_abs_deviation)
// and the modified z-scores 0.6745·(x − median)/MAD of Iglewicz and Hoaglin.

#include "src/verify/lot_statistics.h"

#include <gtest/gtest.h>

#include <limits>
#include <nlohmann/json.hpp>
#include <sstream>

#include "reference/python_reference.h"

namespace coilspin::verify {
namespace {

// Ten resistances of a lot (ohm), one motor with a bad joint: invented numbers.
const std::vector<double> kResistances = {2.301, 2.287, 2.316, 2.294, 2.309, 2.298, 2.455, 2.305, 2.291, 2.312};
const Band kBand{2.116, 2.484};  // 2.3 ohm ± 8 %

std::string PythonList(const std::vector<double>& x) {
  std::ostringstream out;
  out.precision(17);
  out << "[";
  for (std::size_t k = 0; k < x.size(); ++k) out << (k ? ", " : "") << x[k];
  return out.str() + "]";
}

nlohmann::json SciPyFigures(const std::vector<double>& x, double lsl, double usl) {
  const std::string script =
      "import json, numpy as np, scipy.stats as st\n"
      "x = np.array(" + PythonList(x) + ")\n"
      "m, s = x.mean(), x.std(ddof=1)\n"
      "mad = st.median_abs_deviation(x)\n"
      "z = 0.6745 * (x - np.median(x)) / mad\n"
      "lsl, usl = " + std::to_string(lsl) + ", " + std::to_string(usl) + "\n"
      "print(json.dumps({'mean': m, 'std': s, 'mad': mad, 'z': list(z), 'cpk': min(usl - m, m - lsl) / (3 * s),"
      " 'cpu': (usl - m) / (3 * s), 'outliers': [int(k) for k in np.nonzero(np.abs(z) > 3.5)[0]]}))\n";
  const std::string output =
      test_support::RunCapture(std::string(COILSPIN_PYTHON) + " -c \"" + script + "\" 2>&1");
  return nlohmann::json::parse(output);
}

TEST(LotStatistics, AgreeWithNumPyAndSciPy) {
  if (!test_support::SciPyAvailable()) GTEST_SKIP() << "SciPy (python3-scipy) not found at " << COILSPIN_PYTHON;
  const nlohmann::json ref = SciPyFigures(kResistances, kBand.low, kBand.high);
  EXPECT_NEAR(Mean(kResistances), ref["mean"].get<double>(), 1e-14);
  EXPECT_NEAR(SampleStandardDeviation(kResistances), ref["std"].get<double>(), 1e-14);
  EXPECT_NEAR(MedianAbsoluteDeviation(kResistances), ref["mad"].get<double>(), 1e-14);
  EXPECT_NEAR(*ProcessCapability(kBand, kResistances), ref["cpk"].get<double>(), 1e-12);
  const std::optional<std::vector<double>> z = ModifiedZScores(kResistances);
  ASSERT_TRUE(z.has_value());
  ASSERT_EQ(z->size(), ref["z"].size());
  for (std::size_t k = 0; k < z->size(); ++k) EXPECT_NEAR((*z)[k], ref["z"][k].get<double>(), 1e-9) << k;
  // The one motor with the bad joint is the one outlier, there and here.
  ASSERT_EQ(ref["outliers"].size(), 1u);
  EXPECT_EQ(ref["outliers"][0].get<int>(), 6);
  for (std::size_t k = 0; k < z->size(); ++k) EXPECT_EQ(std::fabs((*z)[k]) > kModifiedZOutlier, k == 6) << k;
}

TEST(LotStatistics, OneSidedCapabilityIsTheSideTheBandHas) {
  if (!test_support::SciPyAvailable()) GTEST_SKIP() << "SciPy (python3-scipy) not found at " << COILSPIN_PYTHON;
  // ISO 22514-2: with only an upper limit, Cpk = Cpu = (USL − x̄)/(3s).
  const Band at_most{-std::numeric_limits<double>::infinity(), 2.484};
  const nlohmann::json ref = SciPyFigures(kResistances, 0.0, 2.484);
  EXPECT_NEAR(*ProcessCapability(at_most, kResistances), ref["cpu"].get<double>(), 1e-12);
}

TEST(LotStatistics, DegenerateLots) {
  EXPECT_FALSE(ProcessCapability(kBand, {2.3}).has_value());           // no spread from one motor
  EXPECT_FALSE(ProcessCapability(kBand, {2.3, 2.3, 2.3}).has_value());  // s = 0
  EXPECT_FALSE(ModifiedZScores({2.3, 2.4}).has_value());               // too few for a median and MAD
  EXPECT_FALSE(ModifiedZScores({2.3, 2.3, 2.3, 2.5}).has_value());     // MAD = 0: more than half equal
  EXPECT_EQ(SampleStandardDeviation({2.3}), 0.0);
  // Iglewicz and Hoaglin's constants as published.
  EXPECT_EQ(kModifiedZScale, 0.6745);
  EXPECT_EQ(kModifiedZOutlier, 3.5);
}

}  // namespace
}  // namespace coilspin::verify
