#include "src/output/aligned_columns.h"

#include <algorithm>

namespace coilspin::output {
namespace {

// UTF-8 (RFC 3629): a continuation byte is 10xxxxxx.
constexpr unsigned char kUtf8LeadingBitsMask = 0xC0;
constexpr unsigned char kUtf8ContinuationBits = 0x80;

// Display width: UTF-8 continuation bytes take no column.
std::size_t Width(const std::string& text) {
  return static_cast<std::size_t>(std::count_if(text.begin(), text.end(), [](char c) {
    return (static_cast<unsigned char>(c) & kUtf8LeadingBitsMask) != kUtf8ContinuationBits;
  }));
}

}  // namespace

std::string AlignedColumns(const std::vector<std::vector<std::string>>& rows, const std::string& indent,
                           const std::vector<bool>& right) {
  std::vector<std::size_t> widths;
  for (const auto& row : rows) {
    if (widths.size() < row.size()) widths.resize(row.size(), 0);
    for (std::size_t k = 0; k < row.size(); ++k) widths[k] = std::max(widths[k], Width(row[k]));
  }
  std::string text;
  for (const auto& row : rows) {
    std::string line = indent;
    for (std::size_t k = 0; k < row.size(); ++k) {
      const std::string fill(widths[k] - Width(row[k]), ' ');
      const bool align_right = k < right.size() && right[k];
      line += (k == 0 ? "" : "  ") + (align_right ? fill + row[k] : row[k] + fill);
    }
    while (!line.empty() && line.back() == ' ') line.pop_back();
    text += line + "\n";
  }
  return text;
}

}  // namespace coilspin::output
