#pragma once
// Two small helpers several stages share: a printf-style number in a message,
// and the median (order statistics; robust to outliers).

#include <algorithm>
#include <array>
#include <cstdio>
#include <limits>
#include <string>
#include <vector>

namespace coilspin {

// One number formatted with a printf format such as "%.3g".
inline std::string Format(const char* format, double value) {
  std::array<char, 64> buffer{};
  std::snprintf(buffer.data(), buffer.size(), format, value);
  return buffer.data();
}

// The median; the mean of the two middle values for an even count, taken as
// lower/2 + upper/2: the same number as (lower + upper)/2 (halving is exact in
// binary floating point), but finite for values near the largest double.
// NaN for no values.
inline double Median(std::vector<double> values) {
  if (values.empty()) return std::numeric_limits<double>::quiet_NaN();
  const std::size_t middle = values.size() / 2;
  std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(middle), values.end());
  const double upper = values[middle];
  if (values.size() % 2 == 1) return upper;
  const double lower = *std::max_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(middle));
  return 0.5 * lower + 0.5 * upper;
}

}  // namespace coilspin
