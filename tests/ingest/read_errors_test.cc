// Every error class of docs/file-formats.md: the InputErrorKind, and the line
// and column the error points at, counted by hand in the file each test writes.

#include <gtest/gtest.h>

#include <string>

#include "ingest/temp_log_file.h"
#include "src/ingest/input_error.h"
#include "src/ingest/read_bench_log.h"

namespace coilspin {
namespace {

using units::Quantity;

// Reads `content` and returns the error it raises (a failed test when none).
InputError ErrorOf(const std::string& content, const ReadOptions& options = {},
                   const std::string& file_name = "log.csv") {
  testing::TempLogFolder folder;
  const std::string path = folder.Write(file_name, content);
  try {
    ReadBenchLog(path, options);
  } catch (const InputError& error) {
    return error;
  }
  ADD_FAILURE() << "no InputError for:\n" << content;
  return InputError(InputErrorKind::kBadSession, "", 0, 0, "none");
}

bool Contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

TEST(ReadErrors, CannotOpen) {
  testing::TempLogFolder folder;
  const std::string missing = folder.PathOf("missing.csv");
  try {
    ReadBenchLog(missing, {});
    FAIL() << "read a file that does not exist";
  } catch (const InputError& error) {
    EXPECT_EQ(error.kind(), InputErrorKind::kCannotOpen);
    EXPECT_EQ(error.file(), missing);
    EXPECT_EQ(error.line(), 0);
  }
  try {
    ReadBenchLog(folder.PathOf(""), {});  // a folder where a file is expected
    FAIL() << "read a folder";
  } catch (const InputError& error) {
    EXPECT_EQ(error.kind(), InputErrorKind::kCannotOpen);
  }
}

TEST(ReadErrors, EmptyFileOnlyCommentsAndHeaderWithoutRows) {
  EXPECT_EQ(ErrorOf("").kind(), InputErrorKind::kEmptyFile);
  EXPECT_EQ(ErrorOf("# motor: x\n\n# nothing else\n").kind(), InputErrorKind::kEmptyFile);
  const InputError header_only = ErrorOf("# note\ntime [s],voltage [V]\n\n");
  EXPECT_EQ(header_only.kind(), InputErrorKind::kEmptyFile);
  EXPECT_EQ(header_only.line(), 2);  // the header row
}

TEST(ReadErrors, BinaryFile) {
  const InputError nul = ErrorOf("time [s],voltage [V]\n0,1\n1," + std::string(1, '\0') + "\n");
  EXPECT_EQ(nul.kind(), InputErrorKind::kBinaryFile);
  EXPECT_EQ(nul.line(), 3);  // the NUL byte is on line 3
  EXPECT_EQ(ErrorOf("time [s]\x01,voltage\n").kind(), InputErrorKind::kBinaryFile);
  const InputError utf16 = ErrorOf(std::string("\xFF\xFEt\0i\0", 6));
  EXPECT_EQ(utf16.kind(), InputErrorKind::kBinaryFile);
  EXPECT_TRUE(Contains(utf16.message(), "UTF-16"));
}

TEST(ReadErrors, MissingHeader) {
  const InputError error = ErrorOf("# logger v2\n# rate: 1 kHz\n0.0,1.5,0.2\n0.1,1.5,0.2\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kMissingHeader);
  EXPECT_EQ(error.line(), 3);  // the first line that is not a comment
  EXPECT_TRUE(Contains(error.message(), "'0.0'"));
}

TEST(ReadErrors, MissingTimeColumnAndUnmatchedColumnMap) {
  const InputError no_time = ErrorOf("# x: y\nvoltage [V],current [A]\n1,2\n");
  EXPECT_EQ(no_time.kind(), InputErrorKind::kMissingColumn);
  EXPECT_EQ(no_time.line(), 2);
  EXPECT_TRUE(Contains(no_time.message(), "'voltage [V]', 'current [A]'"));

  ReadOptions options;
  options.column_for[Quantity::kSpeed] = "Tach";
  const InputError unmatched = ErrorOf("time [s],Tacho (RPM)\n0,1\n", options);
  EXPECT_EQ(unmatched.kind(), InputErrorKind::kMissingColumn);
  EXPECT_EQ(unmatched.line(), 1);
  EXPECT_TRUE(Contains(unmatched.message(), "'Tacho (RPM)'"));
}

TEST(ReadErrors, DuplicateColumns) {
  const InputError error = ErrorOf("time [s],speed [rpm],voltage [V],Speed [rad/s]\n0,1,2,3\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kDuplicateColumn);
  EXPECT_EQ(error.line(), 1);
  EXPECT_EQ(error.column(), 4);  // the second cell naming speed

  ReadOptions options;
  options.column_for[Quantity::kVoltage] = "U";
  const InputError mapped = ErrorOf("time [s],U [V],U (mV)\n0,1,2\n", options);
  EXPECT_EQ(mapped.kind(), InputErrorKind::kDuplicateColumn);
  EXPECT_EQ(mapped.column(), 3);
}

TEST(ReadErrors, UnknownUnitListsTheAcceptedOnes) {
  const InputError error = ErrorOf("time [s],voltage [Volts],current [A]\n0,1,2\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kUnknownUnit);
  EXPECT_EQ(error.line(), 1);
  EXPECT_EQ(error.column(), 2);
  EXPECT_TRUE(Contains(error.message(), "V, mV"));  // docs/file-formats.md: voltage in V or mV

  const InputError no_unit = ErrorOf("\"time\",voltage [V]\n0,1\n");
  EXPECT_EQ(no_unit.kind(), InputErrorKind::kUnknownUnit);
  EXPECT_EQ(no_unit.column(), 1);

  ReadOptions options;
  options.unit_for[Quantity::kCurrent] = "amps";
  EXPECT_EQ(ErrorOf("time [s],current [A]\n0,1\n", options).kind(), InputErrorKind::kUnknownUnit);
}

TEST(ReadErrors, NonNumericCellIsQuoted) {
  const InputError error = ErrorOf("time [s],voltage [V],current [A]\n0,1,2\n0.1,1,2\n0.2,1,2 A\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kNonNumericCell);
  EXPECT_EQ(error.line(), 4);
  EXPECT_EQ(error.column(), 3);
  EXPECT_TRUE(Contains(error.message(), "'2 A'"));
  EXPECT_TRUE(Contains(error.what(), "log.csv:4:3: "));

  const InputError empty = ErrorOf("time [s],voltage [V]\n0,1\n1,\n");
  EXPECT_EQ(empty.kind(), InputErrorKind::kNonNumericCell);
  EXPECT_EQ(empty.line(), 3);
  EXPECT_EQ(empty.column(), 2);
}

TEST(ReadErrors, NotFinite) {
  for (const char* cell : {"nan", "NaN", "inf", "-Infinity", "1e999"}) {
    const InputError error = ErrorOf("time [s],voltage [V]\n0,1\n1," + std::string(cell) + "\n");
    EXPECT_EQ(error.kind(), InputErrorKind::kNotFinite) << cell;  // IEEE 754: not a finite double
    EXPECT_EQ(error.line(), 3);
    EXPECT_EQ(error.column(), 2);
  }
}

TEST(ReadErrors, TimeNotIncreasingNamesBothTimes) {
  std::string content = "time [s],speed [rpm]\n";
  for (int row = 0; row < 410; ++row) content += "0." + std::to_string(1000 + row) + ",100\n";
  content += "0.2051,100\n0.2050,100\n";  // lines 412 and 413
  const InputError error = ErrorOf(content, {}, "spin_down.csv");
  EXPECT_EQ(error.kind(), InputErrorKind::kTimeNotIncreasing);
  EXPECT_EQ(error.line(), 413);
  EXPECT_EQ(error.column(), 0);
  // style.md habit 7, the project's example message
  EXPECT_EQ(error.message(), "time is not increasing (0.2050 s after 0.2051 s)");

  const InputError repeated = ErrorOf("time [ms],voltage [V]\n1,0\n2,0\n2,0\n");
  EXPECT_EQ(repeated.kind(), InputErrorKind::kTimeNotIncreasing);  // strictly increasing
  EXPECT_EQ(repeated.line(), 4);
  EXPECT_EQ(repeated.message(), "time is not increasing (2 ms after 2 ms)");
}

TEST(ReadErrors, TruncatedAndOverlongRows) {
  const InputError short_row = ErrorOf("time [s],voltage [V],current [A]\n0,1,2\n0.1,1");
  EXPECT_EQ(short_row.kind(), InputErrorKind::kTruncatedRow);
  EXPECT_EQ(short_row.line(), 3);
  EXPECT_EQ(short_row.column(), 3);  // the first missing cell

  const InputError long_row = ErrorOf("time [s],voltage [V]\n0,1\n0.1,1,5\n");
  EXPECT_EQ(long_row.kind(), InputErrorKind::kTruncatedRow);
  EXPECT_EQ(long_row.line(), 3);
  EXPECT_EQ(long_row.column(), 3);  // the first cell beyond the header

  // docs/file-formats.md: a decimal comma needs ';' as the delimiter
  const InputError comma = ErrorOf("time [s],voltage [V]\n0,5,1,5\n");
  EXPECT_EQ(comma.kind(), InputErrorKind::kTruncatedRow);
  EXPECT_TRUE(Contains(comma.message(), "decimal comma"));
}

TEST(ReadErrors, CountsWithoutCountsPerRevolution) {
  const InputError error = ErrorOf("time [s],voltage [V],position [counts]\n0,1,2\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kCountsWithoutCpr);
  EXPECT_EQ(error.line(), 1);
  EXPECT_EQ(error.column(), 3);
}

TEST(ReadErrors, BadOptions) {
  const std::string log = "time [s],voltage [V]\n0,1\n";
  ReadOptions zero_gear;
  zero_gear.gear_ratio = 0.0;
  EXPECT_EQ(ErrorOf(log, zero_gear).kind(), InputErrorKind::kBadOption);
  ReadOptions negative_cpr;
  negative_cpr.counts_per_rev = -500.0;
  EXPECT_EQ(ErrorOf(log, negative_cpr).kind(), InputErrorKind::kBadOption);
  ReadOptions same_cell;
  same_cell.column_for[Quantity::kVoltage] = "voltage";
  same_cell.column_for[Quantity::kCurrent] = "voltage [V]";
  const InputError twice = ErrorOf(log, same_cell);
  EXPECT_EQ(twice.kind(), InputErrorKind::kBadOption);
  EXPECT_EQ(twice.column(), 2);
}

}  // namespace
}  // namespace coilspin
