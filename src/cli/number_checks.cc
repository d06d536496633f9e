#include "src/cli/number_checks.h"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <functional>
#include <optional>
#include <string>

#include "src/units/constants.h"

namespace coilspin::cli {
namespace {

// The number the whole text spells, or nothing.
std::optional<double> NumberIn(const std::string& text) {
  if (text.empty()) return std::nullopt;
  char* end = nullptr;
  const double value = std::strtod(text.c_str(), &end);
  if (end != text.c_str() + text.size()) return std::nullopt;
  return value;
}

std::string Shown(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%g", value);
  return buffer;
}

// A validator that accepts a finite number for which `accept` holds; `expected`
// completes "must be ...".
CLI::Validator Check(const std::string& name, const std::string& expected, std::function<bool(double)> accept) {
  return CLI::Validator(
      [expected, accept](std::string& text) -> std::string {
        const std::optional<double> value = NumberIn(text);
        if (value && std::isfinite(*value) && accept(*value)) return {};
        return "must be " + expected + ", got '" + text + "'";
      },
      name);
}

}  // namespace

CLI::Validator PositiveNumber() {
  return Check("POSITIVE", "a positive number", [](double x) { return x > 0.0; });
}

CLI::Validator NonNegativeNumber() {
  return Check("NONNEGATIVE", "a number >= 0", [](double x) { return x >= 0.0; });
}

CLI::Validator FiniteNumber() {
  return Check("NUMBER", "a finite number", [](double) { return true; });
}

CLI::Validator OpenInterval(double low, double high) {
  return Check("(" + Shown(low) + ", " + Shown(high) + ")",
               "a number between " + Shown(low) + " and " + Shown(high) + " (exclusive)",
               [low, high](double x) { return x > low && x < high; });
}

CLI::Validator WholeNumberFromTo(long long low, long long high) {
  return Check("[" + std::to_string(low) + ", " + std::to_string(high) + "]",
               "a whole number from " + std::to_string(low) + " to " + std::to_string(high),
               [low, high](double x) {
                 return x == std::floor(x) && x >= static_cast<double>(low) && x <= static_cast<double>(high);
               });
}

CLI::Validator WindingTemperature() {
  const double lowest_degC = -units::kCopperTemperatureConstant_degC;
  return Check("DEGC", "a temperature in degC above " + Shown(lowest_degC) + " (where copper's resistance reaches 0)",
               [lowest_degC](double x) { return x > lowest_degC; });
}

}  // namespace coilspin::cli
