#include "src/verify/lot_statistics.h"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "src/ingest/small_text_and_statistics.h"

namespace coilspin::verify {
namespace {

// Fewer values than these give no spread or no robust centre worth the name.
constexpr std::size_t kValuesForSpread = 2;
constexpr std::size_t kValuesForRobustScores = 3;

}  // namespace

double Mean(const std::vector<double>& x) {
  return x.empty() ? 0.0 : std::accumulate(x.begin(), x.end(), 0.0) / static_cast<double>(x.size());
}

double SampleStandardDeviation(const std::vector<double>& x) {
  if (x.size() < kValuesForSpread) return 0.0;
  const double mean = Mean(x);
  double sum = 0.0;
  for (double v : x) sum += (v - mean) * (v - mean);
  return std::sqrt(sum / static_cast<double>(x.size() - 1));
}

double MedianAbsoluteDeviation(const std::vector<double>& x) {
  if (x.empty()) return 0.0;
  const double centre = Median(x);
  std::vector<double> deviations;
  for (double v : x) deviations.push_back(std::fabs(v - centre));
  return Median(deviations);
}

std::optional<double> ProcessCapability(const Band& band, const std::vector<double>& x) {
  const double s = SampleStandardDeviation(x);
  if (x.size() < kValuesForSpread || !(s > 0.0) || (!band.HasLow() && !band.HasHigh())) return std::nullopt;
  const double mean = Mean(x);
  double nearest = std::numeric_limits<double>::infinity();
  if (band.HasHigh()) nearest = std::min(nearest, band.high - mean);  // Cpu·3s
  if (band.HasLow()) nearest = std::min(nearest, mean - band.low);    // Cpl·3s
  return nearest / (kCapabilitySigmas * s);
}

std::optional<std::vector<double>> ModifiedZScores(const std::vector<double>& x) {
  if (x.size() < kValuesForRobustScores) return std::nullopt;
  const double mad = MedianAbsoluteDeviation(x);
  if (!(mad > 0.0)) return std::nullopt;
  const double centre = Median(x);
  std::vector<double> z;
  for (double v : x) z.push_back(kModifiedZScale * (v - centre) / mad);
  return z;
}

}  // namespace coilspin::verify
