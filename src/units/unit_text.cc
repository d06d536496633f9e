#include "src/units/unit_text.h"

#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <utility>

namespace coilspin::units {
namespace {

bool IsSpace(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v'; }
bool IsLetter(char c) { return std::isalpha(static_cast<unsigned char>(c)) != 0; }

std::string_view Trimmed(std::string_view text) {
  while (!text.empty() && IsSpace(text.front())) text.remove_prefix(1);
  while (!text.empty() && IsSpace(text.back())) text.remove_suffix(1);
  return text;
}

// Multi-byte spellings replaced as they are (UTF-8).
constexpr std::array<std::pair<std::string_view, std::string_view>, 4> kReplacements = {{
    {"\u00b7", "*"},   // MIDDLE DOT
    {"\u00b2", "^2"},  // SUPERSCRIPT TWO
    {"\u00b5", "u"},   // MICRO SIGN
    {"\u03bc", "u"},   // GREEK SMALL LETTER MU
}};
constexpr std::string_view kSquareRoot = "\u221a";  // SQUARE ROOT

}  // namespace

std::string NormalisedUnitSpelling(std::string_view spelling) {
  std::string out;
  for (std::size_t i = 0; i < spelling.size();) {
    bool replaced = false;
    for (const auto& [from, to] : kReplacements) {
      if (spelling.substr(i, from.size()) == from) {
        out += to;
        i += from.size();
        replaced = true;
        break;
      }
    }
    if (replaced) continue;
    if (spelling.substr(i, kSquareRoot.size()) == kSquareRoot) {
      i += kSquareRoot.size();
      if (i < spelling.size() && spelling[i] == '(') {
        out += "sqrt";
      } else {
        out += "sqrt(";
        while (i < spelling.size() && IsLetter(spelling[i])) out += spelling[i++];
        out += ')';
      }
      continue;
    }
    const char c = spelling[i];
    const bool joins_letters = (c == '-' || c == '.') && !out.empty() && IsLetter(out.back()) &&
                               i + 1 < spelling.size() && IsLetter(spelling[i + 1]);
    if (joins_letters) {
      out += '*';
    } else if (!IsSpace(c)) {
      out += c;
    }
    ++i;
  }
  return out;
}

NumberAndUnit SplitNumberAndUnit(std::string_view text, std::string_view example) {
  NumberAndUnit result;
  const std::string_view trimmed = Trimmed(text);
  result.trimmed = std::string(trimmed);
  const std::string expected = "expected a number and a unit, such as '" + std::string(example) + "'";
  if (trimmed.empty()) {
    result.error = expected + ", got nothing";
    return result;
  }
  double value = 0.0;
  const char* first = trimmed.data();
  const char* last = trimmed.data() + trimmed.size();
  const auto [end, error] = std::from_chars(first, last, value);
  if (error != std::errc() || end == first) {
    result.error = "'" + result.trimmed + "' does not start with a number; " + expected;
    return result;
  }
  if (!std::isfinite(value)) {
    result.error = "'" + result.trimmed + "': the number must be finite";
    return result;
  }
  result.unit = std::string(Trimmed(std::string_view(end, static_cast<std::size_t>(last - end))));
  if (!result.unit.empty() && result.unit.front() == ',') {
    result.error = "'" + result.trimmed + "': write the decimal separator as '.', not ','";
    return result;
  }
  result.value = value;
  return result;
}

}  // namespace coilspin::units
