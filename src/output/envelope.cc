#include "src/output/envelope.h"

#include <algorithm>
#include <cmath>

namespace coilspin::output {

std::vector<std::size_t> EnvelopeSamples(const std::vector<double>& time_s,
                                         const std::vector<const std::vector<double>*>& series, std::size_t columns,
                                         const std::vector<std::size_t>& also) {
  const std::size_t n = time_s.size();
  std::vector<std::size_t> kept;
  if (n == 0) return kept;
  const std::size_t bound = 2 * columns * series.size() + 2 + also.size();
  if (n <= bound || columns == 0) {
    kept.resize(n);
    for (std::size_t k = 0; k < n; ++k) kept[k] = k;
    return kept;
  }
  const double t0 = time_s.front(), span = time_s.back() - time_s.front();
  const auto bin_of = [&](std::size_t k) {
    if (!(span > 0.0)) return std::size_t{0};
    const double x = (time_s[k] - t0) / span * static_cast<double>(columns);
    return std::min(columns - 1, static_cast<std::size_t>(std::max(0.0, x)));
  };
  constexpr std::size_t kNone = static_cast<std::size_t>(-1);
  for (const std::vector<double>* values : series) {
    std::vector<std::size_t> low(columns, kNone), high(columns, kNone);
    for (std::size_t k = 0; k < n; ++k) {
      const double v = (*values)[k];
      if (std::isnan(v)) continue;
      const std::size_t b = bin_of(k);
      if (low[b] == kNone || v < (*values)[low[b]]) low[b] = k;
      if (high[b] == kNone || v > (*values)[high[b]]) high[b] = k;
    }
    for (std::size_t b = 0; b < columns; ++b)
      for (std::size_t k : {low[b], high[b]})
        if (k != kNone) kept.push_back(k);
  }
  kept.push_back(0);
  kept.push_back(n - 1);
  for (std::size_t k : also)
    if (k < n) kept.push_back(k);
  std::sort(kept.begin(), kept.end());
  kept.erase(std::unique(kept.begin(), kept.end()), kept.end());
  return kept;
}

}  // namespace coilspin::output
