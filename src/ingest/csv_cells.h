#pragma once
// In-place splitting of one CSV line into cells (internal to ingest).
//
// A cell is the text between delimiters with spaces and tabs trimmed from both
// ends; a cell that starts with a double quote runs to the matching closing
// quote (a doubled quote "" inside stands for one quote) and may hold the
// delimiter. Nothing is copied: a cell points into the line.

#include <string>
#include <string_view>

namespace coilspin::ingest {

struct Cell {
  char* begin = nullptr;  // mutable, so that a decimal comma can be rewritten in place
  char* end = nullptr;
  bool quoted = false;
  std::string_view text() const { return {begin, static_cast<std::size_t>(end - begin)}; }
};

class CellSplitter {
 public:
  CellSplitter(char* line, char delimiter) : next_(line), delimiter_(delimiter) {}
  bool AtEnd() const { return done_; }
  Cell Next();  // only while !AtEnd()

 private:
  char* next_;
  char delimiter_;
  bool done_ = false;
};

// The delimiter of a file, from its header row: whichever of tab, ';' and ','
// occurs most often outside quotes (ties in that order); ',' when none occurs.
char DetectDelimiter(std::string_view header_line);

// A line holding nothing but spaces, tabs (and the '\r' of a CRLF ending).
bool IsBlankLine(const char* line);

// The text of a quoted cell with each doubled quote "" turned into one quote.
std::string UnescapeQuotes(std::string_view quoted_text);

}  // namespace coilspin::ingest
