#include "src/ingest/csv_cells.h"

#include <array>

namespace coilspin::ingest {
namespace {

bool IsSpace(char c) { return c == ' ' || c == '\t'; }

}  // namespace

Cell CellSplitter::Next() {
  char* p = next_;
  while (*p != delimiter_ && IsSpace(*p)) ++p;
  Cell cell;
  if (*p == '"') {
    cell.quoted = true;
    cell.begin = ++p;
    while (*p != '\0') {
      if (*p == '"') {
        if (p[1] != '"') break;
        ++p;  // a doubled quote stays in the text; UnescapeQuotes removes it
      }
      ++p;
    }
    cell.end = p;
    if (*p == '"') ++p;
    while (*p != '\0' && *p != delimiter_) ++p;  // text after the closing quote is dropped
  } else {
    cell.begin = p;
    while (*p != '\0' && *p != delimiter_) ++p;
    cell.end = p;
    while (cell.end > cell.begin && IsSpace(cell.end[-1])) --cell.end;
  }
  if (*p == delimiter_) {
    next_ = p + 1;
  } else {
    done_ = true;
  }
  return cell;
}

char DetectDelimiter(std::string_view header_line) {
  constexpr std::array<char, 3> kCandidates = {'\t', ';', ','};  // ties go to the earlier one
  std::array<int, 3> counts = {0, 0, 0};
  bool in_quotes = false;
  for (char c : header_line) {
    if (c == '"') in_quotes = !in_quotes;
    if (in_quotes) continue;
    for (std::size_t i = 0; i < kCandidates.size(); ++i) {
      if (c == kCandidates[i]) ++counts[i];
    }
  }
  char delimiter = ',';
  int best_count = 0;
  for (std::size_t i = 0; i < kCandidates.size(); ++i) {
    if (counts[i] > best_count) {
      best_count = counts[i];
      delimiter = kCandidates[i];
    }
  }
  return delimiter;
}

bool IsBlankLine(const char* line) {
  for (; *line != '\0'; ++line) {
    if (!IsSpace(*line) && *line != '\r') return false;
  }
  return true;
}

std::string UnescapeQuotes(std::string_view quoted_text) {
  std::string text;
  text.reserve(quoted_text.size());
  for (std::size_t i = 0; i < quoted_text.size(); ++i) {
    text += quoted_text[i];
    if (quoted_text[i] == '"' && i + 1 < quoted_text.size() && quoted_text[i + 1] == '"') ++i;
  }
  return text;
}

}  // namespace coilspin::ingest
