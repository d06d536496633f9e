// Line ends and header encodings the reader accepts (docs/file-formats.md,
// "Text" and "Lines"): LF, CR LF and a lone CR (classic Mac OS) each end one
// line; a unit spelling that is not UTF-8 is read again as Windows-1252/Latin-1
// (ISO/IEC 8859-1: bytes 0xA0–0xFF are U+00A0–U+00FF; 0xB0 is '°', 0xB5 'µ').

#include <gtest/gtest.h>

#include <string>

#include "ingest/temp_log_file.h"
#include "src/ingest/input_error.h"
#include "src/ingest/read_bench_log.h"
#include "src/ingest/text_encoding.h"
#include "src/ingest/text_file.h"

namespace coilspin {
namespace {

BenchLog Read(const std::string& content, const ReadOptions& options = {}) {
  testing::TempLogFolder folder;
  return ReadBenchLog(folder.Write("log.csv", content), options);
}

TEST(LineEnds, ALoneCarriageReturnEndsALine) {
  const BenchLog log = Read("# a: b\rtime [s],voltage [V]\r0,1\r0.5,2\r\r1,3");
  ASSERT_EQ(log.size(), 3u);
  EXPECT_EQ(log.voltage_V, (std::vector<double>{1, 2, 3}));
  EXPECT_EQ(log.header_line, 2);
  EXPECT_EQ(log.line_of_row, (std::vector<long>{3, 4, 6}));  // the empty line 5 is counted
  ASSERT_EQ(log.notes.size(), 1u);
}

TEST(LineEnds, MixedEndsCountOneLineEach) {
  // CR LF, LF, CR, CR CR LF (a CR line end followed by a CR LF one, i.e. an empty line).
  const BenchLog log = Read("time [s],voltage [V]\r\n0,1\n1,2\r2,3\r\r\n3,4\n");
  EXPECT_EQ(log.voltage_V, (std::vector<double>{1, 2, 3, 4}));
  EXPECT_EQ(log.line_of_row, (std::vector<long>{2, 3, 4, 6}));
}

TEST(LineEnds, ACarriageReturnAtTheEndOfTheReadersBlock) {
  // A CR LF pair split across the reader's 16 MiB blocks still ends one line: rows of 16 bytes
  // put a CR LF across the first block boundary (16 MiB = 2^24 = 2^20 rows of 16 bytes).
  std::string content = "time [s],speed [rpm]\r\n";  // 22 bytes
  content += std::string(10, ' ') + "\r\n";           // pads the header part to 34 bytes, 2 lines
  std::size_t rows = 0;
  while (content.size() < (std::size_t{1} << 24) + 64) {
    char row[32];
    std::snprintf(row, sizeof row, "%09zu,%04d\r\n", rows, static_cast<int>(rows % 1000));
    content += row;
    ++rows;
  }
  const BenchLog log = Read(content);
  ASSERT_EQ(log.size(), rows);
  EXPECT_EQ(log.line_of_row.back(), static_cast<long>(rows) + 2);
}

TEST(LineEnds, TheByteAfterTheLastLineIsNeverTakenForALineEnd) {
  // io::LineReader looks one byte past the data when the last line has no line end;
  // its buffer is not cleared, and a '\n' left there made it read past the buffer
  // (AddressSanitizer, fuzz_csv_reader; docs/fuzzing.md). The byte source leaves a NUL there.
  testing::TempLogFolder folder;
  ingest::TextFile text = ingest::OpenTextFile(folder.Write("log.csv", "time [s]\n0\n1"));
  std::vector<char> buffer(64, '\n');
  const int got = text.source->read(buffer.data(), static_cast<int>(buffer.size()));
  ASSERT_EQ(got, 12);  // "time [s]" 8 bytes, 2 line feeds, 2 digits
  EXPECT_EQ(std::string(buffer.data(), 12), "time [s]\n0\n1");
  EXPECT_EQ(buffer[12], '\0');
}

TEST(HeaderEncoding, Windows1252DegreeAndMicroSigns) {
  const BenchLog log = Read("time [\xb5s],temperature [\xb0" "C]\n0,23\n2,24\n");
  EXPECT_EQ(log.time_s, (std::vector<double>{0.0, 2e-6}));  // µs, NIST SP 811, 4.3
  EXPECT_EQ(log.temperature_degC, (std::vector<double>{23.0, 24.0}));
  ASSERT_EQ(log.columns.size(), 2u);
  EXPECT_EQ(log.columns[1].unit, "\xc2\xb0" "C");  // kept as UTF-8
}

TEST(HeaderEncoding, AnUnknownByteIsNamedWithTheEncoding) {
  testing::TempLogFolder folder;
  try {
    ReadBenchLog(folder.Write("log.csv", "time [s],temperature [\xb1" "C]\n0,23\n"), {});
    FAIL() << "read an unknown unit";
  } catch (const InputError& error) {
    EXPECT_EQ(error.kind(), InputErrorKind::kUnknownUnit);
    EXPECT_EQ(error.line(), 1);
    EXPECT_EQ(error.column(), 2);
    EXPECT_NE(error.message().find("it holds byte 0xB1, which is not UTF-8 (nor, read as Windows-1252/Latin-1, a "
                                   "known unit): save the file as UTF-8"),
              std::string::npos)
        << error.message();
  }
}

TEST(TextEncoding, Utf8IsCheckedAsRfc3629Defines) {
  EXPECT_TRUE(ingest::IsUtf8("degC \xc2\xb0" "C \xe2\x82\xac \xf0\x9f\x98\x80"));  // °, €, an emoji
  EXPECT_EQ(ingest::FirstNonUtf8Byte("\xb0" "C"), "0xB0");
  EXPECT_EQ(ingest::FirstNonUtf8Byte("\xc0\xaf"), "0xC0");          // overlong '/'
  EXPECT_EQ(ingest::FirstNonUtf8Byte("\xed\xa0\x80"), "0xED");      // a surrogate, U+D800
  EXPECT_EQ(ingest::FirstNonUtf8Byte("\xf4\x90\x80\x80"), "0xF4");  // beyond U+10FFFF
  EXPECT_EQ(ingest::FirstNonUtf8Byte("ok\xe2\x82"), "0xE2");        // cut short
  EXPECT_EQ(ingest::Latin1ToUtf8("\xb0" "C \xb5s"), "\xc2\xb0" "C \xc2\xb5s");
}

}  // namespace
}  // namespace coilspin
