#pragma once
// Rows of text cells printed as columns: each column as wide as its widest
// cell, two spaces between columns, cells left-aligned unless the column is
// marked right-aligned, trailing spaces dropped.

#include <string>
#include <vector>

namespace coilspin::output {

// `indent` before every row; `right[k]` right-aligns column k (missing: left).
std::string AlignedColumns(const std::vector<std::vector<std::string>>& rows, const std::string& indent,
                           const std::vector<bool>& right = {});

}  // namespace coilspin::output
