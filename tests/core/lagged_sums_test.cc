// Lagged sums by Fourier transform (fitters/core/lagged_sums.h) against the
// direct definition c_m = Σ_k x_k·x_{k+m}: the Wiener–Khinchin route must
// give the same numbers to rounding, at every lag, for lengths that are and
// are not powers of two.

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "fitters/core/lagged_sums.h"

namespace coilspin::core {
namespace {

double DirectSum(const Eigen::VectorXd& x, Eigen::Index lag) { return x.head(x.size() - lag).dot(x.tail(x.size() - lag)); }

TEST(LaggedSums, TransformAgreesWithTheDefinition) {
  std::mt19937_64 generator(5);
  std::normal_distribution<double> normal(0.0, 1.0);
  for (Eigen::Index n : {Eigen::Index{37}, Eigen::Index{1024}, Eigen::Index{3001}}) {
    Eigen::VectorXd x(n);
    for (Eigen::Index k = 0; k < n; ++k) x(k) = 3.0 + normal(generator);  // an offset: large sums at every lag
    const LaggedSums all = LaggedProducts(x, static_cast<int>(n - 1));
    ASSERT_EQ(static_cast<Eigen::Index>(all.size()), n);
    for (Eigen::Index m = 0; m < n; ++m)  // rounding of a transform of size 2n: a few ulps of c_0
      EXPECT_NEAR(all[static_cast<std::size_t>(m)], DirectSum(x, m), 1e-11 * all[0]) << "n " << n << " lag " << m;
    // Short requests are summed directly: exactly the definition.
    const LaggedSums few = LaggedProducts(x, 3);
    ASSERT_EQ(few.size(), 4u);
    for (Eigen::Index m = 0; m < 4; ++m) EXPECT_EQ(few[static_cast<std::size_t>(m)], DirectSum(x, m));
  }
  EXPECT_TRUE(LaggedProducts(Eigen::VectorXd(), 5).empty());
}

TEST(LaggedSums, AddingRealisationsSumsThem) {
  Eigen::VectorXd a(50), b(50);
  for (Eigen::Index k = 0; k < 50; ++k) {
    a(k) = std::sin(0.3 * static_cast<double>(k));
    b(k) = std::cos(0.1 * static_cast<double>(k));
  }
  LaggedSums sums;
  AddLaggedSums(a, 40, &sums);
  AddLaggedSums(b, 40, &sums);
  ASSERT_EQ(sums.size(), 41u);
  for (Eigen::Index m = 0; m <= 40; ++m)
    EXPECT_NEAR(sums[static_cast<std::size_t>(m)], DirectSum(a, m) + DirectSum(b, m), 1e-12 * sums[0]);
}

}  // namespace
}  // namespace coilspin::core
