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
// departure d_k from the median of both, and the limit kOutlierScales·S_k there.
struct Scan {
  std::vector<double> left, right, departure, limit;
  double floor = 0.0;  // kOutlierScales times the reading step: no limit is below it
};

// S_k = 1.4826·median |d| over the block of kScaleBlock samples holding k and the
// blocks either side: the scale follows the channel where its noise changes (a
// coast's back-EMF carries commutation ripple that the supply-held run before it
// and the rest after it do not; one scale for the whole channel flagged the ripple's
// peaks by the hundred).
std::vector<double> LocalLimits(const std::vector<double>& magnitudes, double floor) {
  const std::size_t n = magnitudes.size();
  const std::size_t blocks = (n + kScaleBlock - 1) / kScaleBlock;
  std::vector<double> block_scale(blocks);
  for (std::size_t b = 0; b < blocks; ++b) {
    const auto begin = magnitudes.begin() + static_cast<std::ptrdiff_t>(b * kScaleBlock);
    const auto end = magnitudes.begin() + static_cast<std::ptrdiff_t>(std::min(n, (b + 1) * kScaleBlock));
    block_scale[b] = kMadToSigma * Median(std::vector<double>(begin, end));
  }
  std::vector<double> limits(n);
  for (std::size_t k = 0; k < n; ++k) {
    const std::size_t b = k / kScaleBlock;
    double scale = block_scale[b];
    if (b > 0) scale = std::max(scale, block_scale[b - 1]);
    if (b + 1 < blocks) scale = std::max(scale, block_scale[b + 1]);
    limits[k] = std::max(kOutlierScales * scale, floor);
  }
  return limits;
}

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
  scan.floor = kOutlierScales * SmallestStep(x);
  scan.limit = LocalLimits(magnitudes, scan.floor);
  return scan;
}

// Samples near a level change of the channel. E_k is how far the medians of the
// kEdgeNeighbours readings either side differ beyond what the local slope (the
// median first difference around the sample) explains; a level change is an E_k
// beyond kOutlierScales of E's own robust scale (so coloured noise, whose slow
// wander moves window medians apart far more than it moves one reading from its
// neighbours, is not taken for edges), and beyond the channel's outlier limit.
// The windows are wide enough that a run of bad readings is a minority in them,
// so a dropout is no edge, and a steep ramp (a fast coast, a current rise) is not
// one either.
void MarkEdges(const std::vector<double>& x, const Scan& scan, std::vector<bool>* edges) {
  const std::size_t n = x.size();
  const std::size_t w = kEdgeNeighbours;
  if (n < 2 * w + 1) return;
  std::vector<double> scratch, changes, excess(n, 0.0), magnitudes;
  for (std::size_t k = w; k + w < n; ++k) {
    const double left = MedianOf(x, k - w, k, n, &scratch), right = MedianOf(x, k + 1, k + w + 1, n, &scratch);
    changes.clear();
    for (std::size_t j = k - w; j < k + w; ++j) changes.push_back(x[j + 1] - x[j]);
    const double slope = Median(changes);  // per sample
    excess[k] = right - left - slope * static_cast<double>(w + 1);  // the windows' medians sit w + 1 samples apart
    magnitudes.push_back(std::abs(excess[k]));
  }
  const std::vector<double> limits = LocalLimits(magnitudes, scan.floor);  // excess[k] sits at magnitudes[k − w]
  for (std::size_t k = w; k + w < n; ++k) {
    if (!(std::abs(excess[k]) > std::max(limits[k - w], scan.limit[k]))) continue;
    for (std::size_t j = k - kOutlierNeighbours; j <= k + kOutlierNeighbours; ++j) (*edges)[j] = true;
  }
}

std::vector<std::size_t> Outliers(const Scan& scan, const std::vector<double>& x, const std::vector<bool>& edges) {
  const std::size_t n = x.size();
  const std::size_t w = kOutlierNeighbours;
  std::vector<std::size_t> outliers;
  for (std::size_t k = w; k + w < n; ++k) {
    const double limit = scan.limit[k];
    if (edges[k] || !(limit > 0.0) || !(std::abs(scan.departure[k]) > limit)) continue;
    const double sign = scan.departure[k] > 0.0 ? 1.0 : -1.0;
    const double left = sign * (x[k] - scan.left[k]), right = sign * (x[k] - scan.right[k]);
    // Far from both sides, in the same direction, and farther from each than the sides are apart.
    if (left > 0.5 * limit && right > 0.5 * limit &&
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
