#pragma once
// Test helper: a CSV that `coilspin simulate` wrote (comma-delimited, SI or
// the units asked for), read back as comment lines, header cells and rows of numbers.

#include <filesystem>
#include <sstream>
#include <string>
#include <vector>

#include "cli/run_coilspin.h"

namespace coilspin::testing {

struct Csv {
  std::vector<std::string> comments;  // without the leading "# "
  std::vector<std::string> header;
  std::vector<std::vector<double>> rows;

  // The values of column `index`, top to bottom.
  std::vector<double> Column(std::size_t index) const {
    std::vector<double> values;
    for (const auto& row : rows) values.push_back(row.at(index));
    return values;
  }
};

inline std::vector<std::string> Cells(const std::string& line) {
  std::vector<std::string> cells;
  std::istringstream in(line);
  for (std::string cell; std::getline(in, cell, ',');) cells.push_back(cell);
  return cells;
}

inline Csv ReadCsv(const std::filesystem::path& path) {
  Csv csv;
  std::istringstream in(Slurp(path));
  for (std::string line; std::getline(in, line);) {
    if (line.rfind("# ", 0) == 0) {
      csv.comments.push_back(line.substr(2));
    } else if (csv.header.empty()) {
      csv.header = Cells(line);
    } else {
      std::vector<double> row;
      for (const std::string& cell : Cells(line)) row.push_back(std::stod(cell));
      csv.rows.push_back(row);
    }
  }
  return csv;
}

}  // namespace coilspin::testing
