#include "src/output/number_format.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>

namespace coilspin::output {
namespace {

constexpr int kErrorSignificantDigits = 2;
constexpr int kMaxSignificantDigits = 12;
// Fixed notation for magnitudes in [kFixedLow, kFixedHigh).
constexpr double kFixedLow = 1e-2;
constexpr double kFixedHigh = 1e5;

}  // namespace

std::string FormatValue(double value, double std_error, int fallback_significant) {
  if (!std::isfinite(value)) return value != value ? "nan" : (value > 0 ? "inf" : "-inf");
  const double magnitude = std::fabs(value);
  int significant = fallback_significant;
  if (std_error > 0.0 && std::isfinite(std_error) && magnitude > 0.0) {
    const int value_exponent = static_cast<int>(std::floor(std::log10(magnitude)));
    const int error_exponent = static_cast<int>(std::floor(std::log10(std_error)));
    significant = std::clamp(value_exponent - error_exponent + kErrorSignificantDigits, 1, kMaxSignificantDigits);
  }
  char buffer[64];
  if (magnitude == 0.0 || (magnitude >= kFixedLow && magnitude < kFixedHigh)) {
    const int value_exponent = magnitude > 0.0 ? static_cast<int>(std::floor(std::log10(magnitude))) : 0;
    const int decimals = std::max(0, significant - 1 - value_exponent);
    std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
  } else {
    std::snprintf(buffer, sizeof buffer, "%.*e", std::max(0, significant - 1), value);
  }
  return buffer;
}

std::string ShortNumber(double value, int significant) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", significant, value);
  return buffer;
}

std::string ExactNumber(double value) {
  char buffer[32];
  const auto written = std::to_chars(buffer, buffer + sizeof buffer, value);
  return std::string(buffer, written.ptr);
}

}  // namespace coilspin::output
