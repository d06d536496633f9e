#include "src/ingest/bench_log.h"

#include <numeric>

namespace coilspin {

const std::vector<double>& BenchLog::Channel(units::Quantity quantity) const {
  switch (quantity) {
    case units::Quantity::kTime:
      return time_s;
    case units::Quantity::kVoltage:
      return voltage_V;
    case units::Quantity::kCurrent:
      return current_A;
    case units::Quantity::kSpeed:
      return speed_rad_s;
    case units::Quantity::kPosition:
      return position_rad;
    case units::Quantity::kTorque:
      return torque_N_m;
    case units::Quantity::kTemperature:
      return temperature_degC;
  }
  return time_s;  // unreachable: the switch covers every quantity
}

std::vector<double>& BenchLog::Channel(units::Quantity quantity) {
  return const_cast<std::vector<double>&>(static_cast<const BenchLog&>(*this).Channel(quantity));
}

bool BenchLog::Has(units::Quantity quantity) const { return !Channel(quantity).empty(); }

std::optional<double> MeanLoggedTemperature(const BenchLog& log) {
  if (log.temperature_degC.empty()) return std::nullopt;
  return std::accumulate(log.temperature_degC.begin(), log.temperature_degC.end(), 0.0) /
         static_cast<double>(log.temperature_degC.size());
}

}  // namespace coilspin
