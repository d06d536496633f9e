#include "src/ingest/outliers.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "src/ingest/small_text_and_statistics.h"

namespace coilspin {
namespace {

// 1/Φ⁻¹(0.75): the median absolute deviation times this estimates σ for normal
// data (statistics handbook; Hampel 1974).
constexpr double kMadToSigma = 1.482602218505602;

double MedianOf(const std::vector<double>& x, std::size_t begin, std::size_t end, std::size_t skip,
                std::vector<double>* scratch) {
  scratch->clear();
  for (std::size_t j = begin; j < end; ++j)
    if (j != skip) scratch->push_back(x[j]);
  return Median(*scratch);
}

// The smallest positive change between neighbours: a quantised channel's step;
// for a continuous one a value far below its noise.
double SmallestStep(const std::vector<double>& x) {
  double step = std::numeric_limits<double>::infinity();
  for (std::size_t k = 1; k < x.size(); ++k) {
    const double change = std::abs(x[k] - x[k - 1]);
    if (change > 0.0) step = std::min(step, change);
  }
  return std::isfinite(step) ? step : 0.0;
}

// Per sample: the medians of the w neighbours on the left and on the right, the
// departure d_k from the median of both, and the channel's limit kOutlierScales·S.
struct Scan {
  std::vector<double> left, right, departure;
  double limit = 0.0;
};

Scan ScanChannel(const std::vector<double>& x) {
  const std::size_t n = x.size();
  const std::size_t w = kOutlierNeighbours;
  Scan scan;
  scan.left.assign(n, 0.0);
  scan.right.assign(n, 0.0);
  scan.departure.assign(n, 0.0);
  std::vector<double> scratch, magnitudes(n);
  for (std::size_t k = 0; k < n; ++k) {
    const std::size_t begin = k >= w ? k - w : 0;
    const std::size_t end = std::min(n, k + w + 1);
    scan.departure[k] = x[k] - MedianOf(x, begin, end, k, &scratch);
    magnitudes[k] = std::abs(scan.departure[k]);
    if (k >= w && k + w < n) {
      scan.left[k] = MedianOf(x, k - w, k, n, &scratch);
      scan.right[k] = MedianOf(x, k + 1, k + w + 1, n, &scratch);
    }
  }
  // d has median ≈ 0 for any smooth signal, so MAD(d) is the median of |d|.
  scan.limit = kOutlierScales * std::max(kMadToSigma * Median(magnitudes), SmallestStep(x));
  return scan;
}

// Samples near a level change of the channel: the medians of the kEdgeNeighbours
// readings either side differ by more than its limit beyond what the local slope
// (the median first difference around the sample) explains. The windows are wide
// enough that a run of bad readings is a minority in them, so a dropout is no
// edge, and a steep ramp (a fast coast, a current rise) is not one either.
void MarkEdges(const std::vector<double>& x, const Scan& scan, std::vector<bool>* edges) {
  const std::size_t n = x.size();
  const std::size_t w = kEdgeNeighbours;
  std::vector<double> scratch, changes;
  for (std::size_t k = w; k + w < n; ++k) {
    const double left = MedianOf(x, k - w, k, n, &scratch), right = MedianOf(x, k + 1, k + w + 1, n, &scratch);
    changes.clear();
    for (std::size_t j = k - w; j < k + w; ++j) changes.push_back(x[j + 1] - x[j]);
    const double slope = Median(changes);  // per sample
    // The windows' medians sit (w + 1) samples either side of k on a ramp.
    if (!(std::abs(right - left - slope * static_cast<double>(w + 1)) > scan.limit)) continue;
    for (std::size_t j = k - kOutlierNeighbours; j <= k + kOutlierNeighbours; ++j) (*edges)[j] = true;
  }
}

std::vector<std::size_t> Outliers(const Scan& scan, const std::vector<double>& x, const std::vector<bool>& edges) {
  const std::size_t n = x.size();
  const std::size_t w = kOutlierNeighbours;
  std::vector<std::size_t> outliers;
  if (!(scan.limit > 0.0)) return outliers;
  for (std::size_t k = w; k + w < n; ++k) {
    if (edges[k] || !(std::abs(scan.departure[k]) > scan.limit)) continue;
    const double sign = scan.departure[k] > 0.0 ? 1.0 : -1.0;
    const double left = sign * (x[k] - scan.left[k]), right = sign * (x[k] - scan.right[k]);
    // Far from both sides, in the same direction, and farther from each than the sides are apart.
    if (left > 0.5 * scan.limit && right > 0.5 * scan.limit &&
        std::abs(scan.left[k] - scan.right[k]) < std::min(left, right))
      outliers.push_back(k);
  }
  return outliers;
}

}  // namespace

std::vector<std::size_t> FindIsolatedOutliers(const std::vector<double>& x) {
  if (x.size() < 2 * kOutlierNeighbours + 1) return {};
  const Scan scan = ScanChannel(x);
  std::vector<bool> edges(x.size(), false);
  MarkEdges(x, scan, &edges);
  return Outliers(scan, x, edges);
}

void SetAsideOutliers(BenchLog* log) {
  const units::Quantity examined[] = {units::Quantity::kVoltage, units::Quantity::kCurrent, units::Quantity::kSpeed,
                                      units::Quantity::kTorque};
  const std::size_t n = log->size();
  if (n < 2 * kOutlierNeighbours + 1) return;
  // A level change in any channel (a supply step, power off) marks its neighbourhood in all of
  // them: the current's inrush peak at a voltage step is the motor's answer, not a bad reading.
  std::vector<Scan> scans;
  std::vector<bool> edges(n, false);
  for (units::Quantity quantity : examined) {
    const std::vector<double>& x = log->Channel(quantity);
    scans.push_back(x.size() == n ? ScanChannel(x) : Scan());
    if (x.size() == n) MarkEdges(x, scans.back(), &edges);
  }
  for (std::size_t c = 0; c < scans.size(); ++c) {
    std::vector<double>& x = log->Channel(examined[c]);
    if (x.size() != n) continue;
    const std::vector<std::size_t> rows = Outliers(scans[c], x, edges);
    if (rows.empty()) continue;
    std::vector<bool> bad(n, false);
    for (std::size_t k : rows) bad[k] = true;
    // Each outlier by the straight line (in time) between the nearest good readings either side.
    for (std::size_t k : rows) {
      std::size_t before = k, after = k;
      while (before > 0 && bad[before]) --before;
      while (after + 1 < n && bad[after]) ++after;
      const double t0 = log->time_s[before], t1 = log->time_s[after];
      const double weight = t1 > t0 ? (log->time_s[k] - t0) / (t1 - t0) : 0.5;
      x[k] = x[before] + weight * (x[after] - x[before]);
    }
    SetAside entry;
    entry.quantity = examined[c];
    for (std::size_t k : rows)
      entry.lines.push_back(k < log->line_of_row.size() ? log->line_of_row[k] : static_cast<long>(k + 1));
    log->set_aside.push_back(std::move(entry));
  }
}

}  // namespace coilspin
