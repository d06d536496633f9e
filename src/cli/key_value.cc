#include "src/cli/key_value.h"

#include "src/ingest/input_error.h"

namespace coilspin::cli {

std::map<units::Quantity, std::string> ParseQuantityMap(const std::vector<std::string>& specs, const std::string& option) {
  std::map<units::Quantity, std::string> result;
  for (const auto& spec : specs) {
    const auto equals = spec.find('=');
    if (equals == std::string::npos || equals == 0 || equals + 1 == spec.size())
      throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                       option + " expects quantity=value (e.g. " + option + " speed=\"Tach (RPM)\"), got '" + spec + "'");
    const std::string name = spec.substr(0, equals);
    const auto quantity = units::QuantityFromName(name);
    if (!quantity)
      throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                       option + ": unknown quantity '" + name +
                           "' (expected time, voltage, current, speed, position, torque or temperature)");
    result[*quantity] = spec.substr(equals + 1);
  }
  return result;
}

}  // namespace coilspin::cli
