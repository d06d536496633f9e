#include "src/units/units.h"

#include <array>
#include <cctype>

#include "src/units/constants.h"

namespace coilspin::units {
namespace {

struct QuantityInfo {
  Quantity quantity;
  std::string_view name;           // as written in a header cell and in --column
  std::string_view internal_unit;  // the SI unit the tool works in
};

constexpr std::array<QuantityInfo, 7> kQuantities = {{
    {Quantity::kTime, "time", "s"},
    {Quantity::kVoltage, "voltage", "V"},
    {Quantity::kCurrent, "current", "A"},
    {Quantity::kSpeed, "speed", "rad/s"},
    {Quantity::kPosition, "position", "rad"},
    {Quantity::kTorque, "torque", "N*m"},
    {Quantity::kTemperature, "temperature", "degC"},
}};

struct UnitSpelling {
  Quantity quantity;
  std::string_view spelling;  // matched exactly, case included
  Conversion conversion;
};

// The one table of unit spellings. Per quantity, the spellings of
// docs/file-formats.md come first, then the synonyms. x_SI = x·factor + offset.
const std::array<UnitSpelling, 33> kUnitTable = {{
    // time → s. SI prefixes: NIST SP 811, 4.3.
    {Quantity::kTime, "s", {1.0, 0.0, false}},
    {Quantity::kTime, "ms", {kMilli, 0.0, false}},
    {Quantity::kTime, "us", {kMicro, 0.0, false}},
    {Quantity::kTime, "sec", {1.0, 0.0, false}},
    {Quantity::kTime, "\u00b5s", {kMicro, 0.0, false}},  // µ as MICRO SIGN
    {Quantity::kTime, "\u03bcs", {kMicro, 0.0, false}},  // μ as GREEK SMALL LETTER MU
    // voltage → V.
    {Quantity::kVoltage, "V", {1.0, 0.0, false}},
    {Quantity::kVoltage, "mV", {kMilli, 0.0, false}},
    {Quantity::kVoltage, "Volt", {1.0, 0.0, false}},
    {Quantity::kVoltage, "volt", {1.0, 0.0, false}},
    // current → A.
    {Quantity::kCurrent, "A", {1.0, 0.0, false}},
    {Quantity::kCurrent, "mA", {kMilli, 0.0, false}},
    // speed → rad/s. 1 rpm = 2π rad per 60 s (physics, definition).
    {Quantity::kSpeed, "rad/s", {1.0, 0.0, false}},
    {Quantity::kSpeed, "rpm", {kRadiansPerRevolution / kSecondsPerMinute, 0.0, false}},
    {Quantity::kSpeed, "rev/s", {kRadiansPerRevolution, 0.0, false}},
    {Quantity::kSpeed, "RPM", {kRadiansPerRevolution / kSecondsPerMinute, 0.0, false}},
    // position → rad. counts: 2π per revolution, divided by the counts per revolution.
    {Quantity::kPosition, "rad", {1.0, 0.0, false}},
    {Quantity::kPosition, "deg", {kRadiansPerRevolution / kDegreesPerRevolution, 0.0, false}},
    {Quantity::kPosition, "rev", {kRadiansPerRevolution, 0.0, false}},
    {Quantity::kPosition, "counts", {kRadiansPerRevolution, 0.0, true}},
    // torque → N·m. ozf·in, lbf·in and kgf·cm: NIST SP 811, Appendix B.
    {Quantity::kTorque, "N*m", {1.0, 0.0, false}},
    {Quantity::kTorque, "mN*m", {kMilli, 0.0, false}},
    {Quantity::kTorque, "oz*in", {kOunceForceInch_N_m, 0.0, false}},
    {Quantity::kTorque, "kgf*cm", {kStandardGravity_m_s2 * kCenti, 0.0, false}},
    {Quantity::kTorque, "lbf*in", {kPoundForceInch_N_m, 0.0, false}},
    {Quantity::kTorque, "Nm", {1.0, 0.0, false}},
    {Quantity::kTorque, "N\u00b7m", {1.0, 0.0, false}},  // MIDDLE DOT
    {Quantity::kTorque, "N.m", {1.0, 0.0, false}},
    {Quantity::kTorque, "mNm", {kMilli, 0.0, false}},
    {Quantity::kTorque, "mN\u00b7m", {kMilli, 0.0, false}},
    // temperature stays in degC; t/degC = T/K − 273.15 (NIST SP 811, 4.2.1.1).
    {Quantity::kTemperature, "degC", {1.0, 0.0, false}},
    {Quantity::kTemperature, "K", {1.0, -kCelsiusZero_K, false}},
    {Quantity::kTemperature, "\u00b0C", {1.0, 0.0, false}},  // DEGREE SIGN + C
}};

const QuantityInfo& InfoOf(Quantity quantity) {
  for (const QuantityInfo& info : kQuantities) {
    if (info.quantity == quantity) return info;
  }
  return kQuantities.front();  // unreachable: every enumerator has a row
}

bool EqualIgnoringCase(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i) {
    const auto lower_a = std::tolower(static_cast<unsigned char>(a[i]));
    const auto lower_b = std::tolower(static_cast<unsigned char>(b[i]));
    if (lower_a != lower_b) return false;
  }
  return true;
}

}  // namespace

std::string_view QuantityName(Quantity quantity) { return InfoOf(quantity).name; }

std::optional<Quantity> QuantityFromName(std::string_view name) {
  for (const QuantityInfo& info : kQuantities) {
    if (EqualIgnoringCase(info.name, name)) return info.quantity;
  }
  return std::nullopt;
}

const std::vector<Quantity>& AllQuantities() {
  static const std::vector<Quantity> all = [] {
    std::vector<Quantity> quantities;
    for (const QuantityInfo& info : kQuantities) quantities.push_back(info.quantity);
    return quantities;
  }();
  return all;
}

std::string_view InternalUnit(Quantity quantity) { return InfoOf(quantity).internal_unit; }

std::optional<Conversion> LookUpUnit(Quantity quantity, std::string_view spelling) {
  for (const UnitSpelling& unit : kUnitTable) {
    if (unit.quantity == quantity && unit.spelling == spelling) return unit.conversion;
  }
  return std::nullopt;
}

std::vector<std::string> AcceptedUnits(Quantity quantity) {
  std::vector<std::string> spellings;
  for (const UnitSpelling& unit : kUnitTable) {
    if (unit.quantity == quantity) spellings.emplace_back(unit.spelling);
  }
  return spellings;
}

}  // namespace coilspin::units
