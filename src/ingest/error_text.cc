#include "src/ingest/error_text.h"

#include <array>
#include <charconv>

namespace coilspin::ingest {
namespace {

constexpr std::size_t kMaxQuotedChars = 40;
constexpr std::size_t kMaxListedItems = 12;

}  // namespace

std::string Quote(std::string_view text) {
  if (text.size() <= kMaxQuotedChars) return "'" + std::string(text) + "'";
  std::size_t cut = kMaxQuotedChars;
  constexpr unsigned char kContinuationMask = 0xC0;  // UTF-8: 10xxxxxx continues a character
  constexpr unsigned char kContinuationBits = 0x80;
  while (cut > 0 && (static_cast<unsigned char>(text[cut]) & kContinuationMask) == kContinuationBits) --cut;
  return "'" + std::string(text.substr(0, cut)) + "...'";
}

std::string QuoteList(const std::vector<std::string>& texts) {
  std::string list;
  for (std::size_t i = 0; i < texts.size() && i < kMaxListedItems; ++i) {
    if (i > 0) list += ", ";
    list += Quote(texts[i]);
  }
  if (texts.size() > kMaxListedItems) {
    list += " and " + std::to_string(texts.size() - kMaxListedItems) + " more";
  }
  return list;
}

std::string DescribeColumn(long column, std::string_view header) {
  return "column " + std::to_string(column) + " " + Quote(header);
}

std::string FormatNumber(double value) {
  std::array<char, 32> text{};
  const auto result = std::to_chars(text.data(), text.data() + text.size(), value);
  return std::string(text.data(), result.ptr);
}

std::string AcceptedUnitList(units::Quantity quantity) {
  std::string list;
  for (const std::string& spelling : units::AcceptedUnits(quantity)) {
    if (!list.empty()) list += ", ";
    list += spelling;
  }
  return list;
}

}  // namespace coilspin::ingest
