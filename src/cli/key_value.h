#pragma once
// "quantity=value" option values (--column speed="Tach (RPM)", --unit current=mA).

#include <map>
#include <string>
#include <vector>

#include "src/units/units.h"

namespace coilspin::cli {

// Throws InputError (kBadOption) naming `option` when a spec has no '=' or an unknown quantity.
std::map<units::Quantity, std::string> ParseQuantityMap(const std::vector<std::string>& specs, const std::string& option);

}  // namespace coilspin::cli
