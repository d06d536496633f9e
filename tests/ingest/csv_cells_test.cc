// Splitting lines into cells, delimiter detection and number parsing.

#include "src/ingest/csv_cells.h"

#include <gtest/gtest.h>

#include <string>
#include <vector>

#include "src/ingest/number_cell.h"

namespace coilspin::ingest {
namespace {

std::vector<std::string> Split(std::string line, char delimiter) {
  std::vector<std::string> cells;
  CellSplitter splitter(line.data(), delimiter);
  while (!splitter.AtEnd()) {
    const Cell cell = splitter.Next();
    cells.push_back(cell.quoted ? UnescapeQuotes(cell.text()) : std::string(cell.text()));
  }
  return cells;
}

// The whole text as one cell (no test text holds a tab).
ParsedNumber Parse(std::string text, bool decimal_comma = false) {
  CellSplitter splitter(text.data(), '\t');
  return ParseNumber(splitter.Next(), decimal_comma);
}

TEST(CellSplitter, TrimsSpacesAndKeepsEmptyCells) {
  // docs/file-formats.md: spaces around cells are ignored; every delimiter starts a cell
  EXPECT_EQ(Split(" 1 ,2,  ,3,", ','), (std::vector<std::string>{"1", "2", "", "3", ""}));
  EXPECT_EQ(Split("a\tb c\t", '\t'), (std::vector<std::string>{"a", "b c", ""}));
  EXPECT_EQ(Split("", ','), (std::vector<std::string>{""}));
}

TEST(CellSplitter, QuotedCellsHoldDelimitersAndDoubledQuotes) {
  // RFC 4180, section 2 (rules 5–7): quoted fields may hold the delimiter; "" is one quote
  EXPECT_EQ(Split("\"Tach, filtered (RPM)\",\"time [s]\"", ','),
            (std::vector<std::string>{"Tach, filtered (RPM)", "time [s]"}));
  EXPECT_EQ(Split(" \"say \"\"hi\"\"\" ;x", ';'), (std::vector<std::string>{"say \"hi\"", "x"}));
}

TEST(DetectDelimiter, FromTheHeaderRow) {
  // docs/file-formats.md: ',' by default; ';' and tab detected from the header row
  EXPECT_EQ(DetectDelimiter("time [s],voltage [V]"), ',');
  EXPECT_EQ(DetectDelimiter("time [s];voltage [V];current [A]"), ';');
  EXPECT_EQ(DetectDelimiter("time [s]\tvoltage [V]"), '\t');
  EXPECT_EQ(DetectDelimiter("time [s]"), ',');
  EXPECT_EQ(DetectDelimiter("\"a,b\";c"), ';');  // RFC 4180: a quoted ',' is text
}

TEST(ParseNumber, AcceptsPlusSignExponentsAndDecimalComma) {
  EXPECT_EQ(Parse("+1.5").value, 1.5);         // common practice: loggers write a leading '+'
  EXPECT_EQ(Parse("-2.5e-3").value, -2.5e-3);  // C++17 std::from_chars, general format
  EXPECT_EQ(Parse(".5").value, 0.5);
  EXPECT_EQ(Parse(" \" 7 \" ").value, 7.0);    // RFC 4180: a quoted field
  EXPECT_EQ(Parse("1,25", true).value, 1.25);  // docs/file-formats.md: decimal comma with ';'
  EXPECT_EQ(Parse("1.25", true).value, 1.25);
}

TEST(ParseNumber, RejectsWhatIsNotOneFiniteNumber) {
  // common practice: a cell is one number or an error, never a guess
  EXPECT_EQ(Parse("").status, NumberStatus::kEmpty);
  EXPECT_EQ(Parse("abc").status, NumberStatus::kNotANumber);
  EXPECT_EQ(Parse("1.2.3").status, NumberStatus::kNotANumber);
  EXPECT_EQ(Parse("12 V").status, NumberStatus::kNotANumber);
  EXPECT_EQ(Parse("+-1").status, NumberStatus::kNotANumber);
  EXPECT_EQ(Parse("0x10").status, NumberStatus::kNotANumber);
  EXPECT_EQ(Parse("1,000.5", true).status, NumberStatus::kNotANumber);  // no thousands separators
  EXPECT_EQ(Parse("1,5", false).status, NumberStatus::kNotANumber);
  EXPECT_EQ(Parse("nan").status, NumberStatus::kNotFinite);  // IEEE 754: NaN is not finite
  EXPECT_EQ(Parse("-inf").status, NumberStatus::kNotFinite);
  EXPECT_EQ(Parse("Infinity").status, NumberStatus::kNotFinite);
  EXPECT_EQ(Parse("1e999").status, NumberStatus::kNotFinite);  // IEEE 754: beyond the largest double
}

}  // namespace
}  // namespace coilspin::ingest
