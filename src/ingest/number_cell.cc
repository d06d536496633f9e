#include "src/ingest/number_cell.h"

#include <charconv>
#include <cmath>
#include <system_error>

namespace coilspin::ingest {

ParsedNumber ParseNumber(Cell cell, bool decimal_comma) {
  const char* begin = cell.begin;
  const char* end = cell.end;
  if (cell.quoted) {  // a quoted number: trim inside the quotes too
    while (begin < end && (*begin == ' ' || *begin == '\t')) ++begin;
    while (end > begin && (end[-1] == ' ' || end[-1] == '\t')) --end;
  }
  if (begin == end) return {NumberStatus::kEmpty, 0.0};
  if (*begin == '+') {
    ++begin;
    if (begin == end || *begin == '-' || *begin == '+') return {NumberStatus::kNotANumber, 0.0};
  }
  if (decimal_comma) {
    for (char* p = cell.begin; p != cell.end; ++p) {
      if (*p == ',') *p = '.';
    }
  }
  double value = 0.0;
  const auto [stop, error] = std::from_chars(begin, end, value);
  if (error == std::errc::result_out_of_range && stop == end) return {NumberStatus::kNotFinite, 0.0};
  if (error != std::errc() || stop != end) return {NumberStatus::kNotANumber, 0.0};
  if (!std::isfinite(value)) return {NumberStatus::kNotFinite, value};
  return {NumberStatus::kOk, value};
}

}  // namespace coilspin::ingest
