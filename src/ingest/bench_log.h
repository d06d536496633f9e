#pragma once
// One bench log after ingest: every channel in SI (time s, voltage V, current A,
// speed rad/s, position rad, torque N·m), temperature in degC. A channel the
// log does not have is empty. Speed and position refer to the motor shaft
// (already multiplied by the gear ratio when one was given).

#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "src/units/units.h"

namespace coilspin {

struct ColumnSource {
  units::Quantity quantity;
  std::string header;  // the header cell as written
  std::string unit;    // the unit spelling as written
  long column = 0;     // 1-based
};

// Readings of one channel set aside as isolated outliers (src/ingest/outliers.h),
// by the file line of their row; their values in the log are the repaired ones.
struct SetAside {
  units::Quantity quantity;
  std::vector<long> lines;
};

struct BenchLog {
  std::string path;
  std::vector<double> time_s;
  std::vector<double> voltage_V;
  std::vector<double> current_A;
  std::vector<double> speed_rad_s;
  std::vector<double> position_rad;
  std::vector<double> torque_N_m;
  std::vector<double> temperature_degC;
  std::vector<ColumnSource> columns;                         // what was read, in header order
  std::vector<std::pair<std::string, std::string>> notes;    // "# key: value" comments
  std::vector<long> line_of_row;                             // 1-based file line of each row
  std::vector<std::string> header_cells;                     // every header cell as written, read or not
  long header_line = 0;                                      // 1-based file line of the header row
  std::vector<SetAside> set_aside;                           // outliers repaired, per channel

  std::size_t size() const { return time_s.size(); }
  bool Has(units::Quantity quantity) const;
  const std::vector<double>& Channel(units::Quantity quantity) const;
  std::vector<double>& Channel(units::Quantity quantity);
};

// The mean of the temperature column [degC]; empty when the log has none.
std::optional<double> MeanLoggedTemperature(const BenchLog& log);

}  // namespace coilspin
