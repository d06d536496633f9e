// The text table (src/output/parameter_table.h): every column lines up in every
// section, whatever the length of a key, symbol or unit.

#include <gtest/gtest.h>

#include <sstream>

#include "src/output/parameter_table.h"

namespace coilspin::testing {
namespace {

QuantityEstimate Quantity(const std::string& key, const std::string& symbol, const std::string& unit, double value) {
  QuantityEstimate q;
  q.key = key;
  q.symbol = symbol;
  q.unit = unit;
  q.value = value;
  q.std_error = 1e-3 * value;
  q.ci_low = value - 2e-3 * value;
  q.ci_high = value + 2e-3 * value;
  q.tests = {"locked-rotor"};
  return q;
}

// Where `cell` starts in the table line that begins with "  key".
std::size_t ColumnOf(const std::string& table, const std::string& key, const std::string& cell) {
  std::istringstream lines(table);
  std::string line;
  while (std::getline(lines, line))
    if (line.rfind("  " + key + " ", 0) == 0) return line.find(" " + cell + " ", 2 + key.size()) + 1;
  ADD_FAILURE() << "no row " << key << " in\n" << table;
  return 0;
}

TEST(ParameterTable, ColumnsAlignWhateverTheLengthOfKeysSymbolsAndUnits) {
  MotorEstimate e;
  e.parameters = {Quantity("resistance", "R", "ohm", 1.25), Quantity("inductance", "L", "H", 8.2e-4)};
  e.ratios = {Quantity("torque_constant_over_inertia", "Kt/J", "rad/(s^2*A)", 656.2)};
  e.derived = {Quantity("stall_current", "I_stall", "A", 3.7), Quantity("peak_efficiency", "eta_max", "1", 0.43),
               Quantity("stall_torque_with_friction", "T_stall_f", "N*m/sqrt(W)", 0.0733)};
  const std::string table = output::ParameterTable(e);
  const struct {
    const char *key, *symbol, *unit;
  } rows[] = {{"resistance", "R", "ohm"},
              {"inductance", "L", "H"},
              {"torque_constant_over_inertia", "Kt/J", "rad/(s^2*A)"},
              {"stall_current", "I_stall", "A"},
              {"peak_efficiency", "eta_max", "1"},
              {"stall_torque_with_friction", "T_stall_f", "N*m/sqrt(W)"}};
  const std::size_t symbol_column = ColumnOf(table, rows[0].key, rows[0].symbol);
  const std::size_t unit_column = ColumnOf(table, rows[0].key, rows[0].unit);
  for (const auto& r : rows) {
    EXPECT_EQ(ColumnOf(table, r.key, r.symbol), symbol_column) << r.key << "\n" << table;
    EXPECT_EQ(ColumnOf(table, r.key, r.unit), unit_column) << r.key << "\n" << table;
  }
  // Values are right-aligned: each ends two spaces before the unit column.
  std::istringstream lines(table);
  std::string line;
  int checked = 0;
  while (std::getline(lines, line))
    for (const auto& r : rows)
      if (line.rfind(std::string("  ") + r.key + " ", 0) == 0) {
        EXPECT_EQ(line.substr(unit_column - 2, 2), "  ") << line;
        EXPECT_NE(line[unit_column - 3], ' ') << line;
        ++checked;
      }
  EXPECT_EQ(checked, 6);
}

}  // namespace
}  // namespace coilspin::testing
