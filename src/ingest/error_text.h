#pragma once
// Pieces of InputError messages shared by the ingest files (internal to ingest).

#include <string>
#include <string_view>
#include <vector>

#include "src/units/units.h"

namespace coilspin::ingest {

// 'text' in single quotes, cut after 40 characters.
std::string Quote(std::string_view text);
// 'a', 'b', 'c' (at most 12, then "and N more").
std::string QuoteList(const std::vector<std::string>& texts);
// column 3 'current [A]'
std::string DescribeColumn(long column, std::string_view header);
// The shortest text that reads back as the same double ("0.2051", "1e-06").
std::string FormatNumber(double value);
// The accepted spellings: "s, ms, us, sec, µs, μs".
std::string AcceptedUnitList(units::Quantity quantity);

}  // namespace coilspin::ingest
