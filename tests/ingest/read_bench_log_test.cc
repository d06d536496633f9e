// Reading bench logs that follow docs/file-formats.md: layouts, header forms,
// delimiters, unit conversion, the column map and the unit map.

#include "src/ingest/read_bench_log.h"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "ingest/temp_log_file.h"
#include "src/ingest/input_error.h"

namespace coilspin {
namespace {

using units::Quantity;

constexpr double kRpm_rad_s = 0.10471975511965977;  // physics (definition): 2π/60
constexpr double kPi = 3.141592653589793;

// Sample i of a channel; a failure (not a crash) when the channel is shorter.
double At(const std::vector<double>& channel, std::size_t i) {
  if (i < channel.size()) return channel[i];
  ADD_FAILURE() << "channel has " << channel.size() << " samples, wanted sample " << i;
  return std::nan("");
}

TEST(ReadBenchLog, ReadsChannelsLinesNotesAndColumns) {
  testing::TempLogFolder folder;
  const std::string path = folder.Write("locked.csv",
                                        "# motor: spindle B-7\n"
                                        "# a comment without a key\n"
                                        "time [s],voltage [V],current [A]\n"
                                        "0.0,1.0,0.5\n"
                                        "0.1,2.0,1.0\n"
                                        "0.2,3.0,1.5\n");
  const BenchLog log = ReadBenchLog(path, {});
  // docs/file-formats.md: values in s, V, A are already SI
  ASSERT_EQ(log.size(), 3u);
  EXPECT_EQ(log.time_s, (std::vector<double>{0.0, 0.1, 0.2}));
  EXPECT_EQ(log.voltage_V, (std::vector<double>{1.0, 2.0, 3.0}));
  EXPECT_EQ(log.current_A, (std::vector<double>{0.5, 1.0, 1.5}));
  EXPECT_TRUE(log.speed_rad_s.empty());
  EXPECT_EQ(log.line_of_row, (std::vector<long>{4, 5, 6}));  // counted in the file above
  EXPECT_EQ(log.header_line, 3);
  ASSERT_EQ(log.notes.size(), 1u);
  EXPECT_EQ(log.notes[0].first, "motor");
  EXPECT_EQ(log.notes[0].second, "spindle B-7");
  ASSERT_EQ(log.columns.size(), 3u);
  EXPECT_EQ(log.columns[2].quantity, Quantity::kCurrent);
  EXPECT_EQ(log.columns[2].header, "current [A]");
  EXPECT_EQ(log.columns[2].unit, "A");
  EXPECT_EQ(log.columns[2].column, 3);
  EXPECT_TRUE(log.Has(Quantity::kCurrent));
  EXPECT_FALSE(log.Has(Quantity::kTorque));
  EXPECT_EQ(&log.Channel(Quantity::kVoltage), &log.voltage_V);
}

class HeaderForm : public ::testing::TestWithParam<const char*> {};

TEST_P(HeaderForm, NamesTheTimeColumnInMilliseconds) {
  testing::TempLogFolder folder;
  const std::string path = folder.Write("log.csv", std::string(GetParam()) + ",voltage [V]\n5,1\n7,2\n");
  const BenchLog log = ReadBenchLog(path, {});
  ASSERT_EQ(log.size(), 2u);
  EXPECT_DOUBLE_EQ(At(log.time_s, 0), 5e-3);  // NIST SP 811, 4.3: 1 ms = 10⁻³ s
  EXPECT_DOUBLE_EQ(At(log.time_s, 1), 7e-3);
  EXPECT_EQ(log.columns[0].unit, "ms");
}

// docs/file-formats.md: `quantity [unit]` or `quantity (unit)`, quantity in any case, quoted cells.
INSTANTIATE_TEST_SUITE_P(Forms, HeaderForm,
                         ::testing::Values("time [ms]", "time (ms)", "Time [ms]", "TIME (ms)",
                                           "\"time [ms]\"", "  time [ ms ]  ", "time[ms]",
                                           "\" time (ms) \""));

struct DelimiterCase {
  const char* name;
  const char* content;
};

class Delimiter : public ::testing::TestWithParam<DelimiterCase> {};

TEST_P(Delimiter, IsDetectedFromTheHeader) {
  testing::TempLogFolder folder;
  const BenchLog log = ReadBenchLog(folder.Write("log.csv", GetParam().content), {});
  // docs/file-formats.md: ',', ';' (with decimal comma) and tab give the same values
  ASSERT_EQ(log.size(), 2u);
  EXPECT_EQ(log.time_s, (std::vector<double>{0.5, 1.25}));
  EXPECT_EQ(log.voltage_V, (std::vector<double>{-1.5, 12.0}));
}

INSTANTIATE_TEST_SUITE_P(
    Files, Delimiter,
    ::testing::Values(DelimiterCase{"comma", "time [s],voltage [V]\n0.5,-1.5\n1.25,12\n"},
                      DelimiterCase{"semicolon", "time [s];voltage [V]\n0.5;-1.5\n1.25;12\n"},
                      DelimiterCase{"semicolon_decimal_comma", "time [s];voltage [V]\n0,5;-1,5\n1,25;12\n"},
                      DelimiterCase{"tab", "time [s]\tvoltage [V]\n0.5\t-1.5\n1.25\t12\n"},
                      DelimiterCase{"crlf_bom_plus",
                                    "\xEF\xBB\xBFtime [s],voltage [V]\r\n+0.5, -1.5\r\n1.25 ,+12\r\n"},
                      DelimiterCase{"no_final_newline", "time [s],voltage [V]\n0.5,-1.5\n1.25,12"},
                      DelimiterCase{"blank_and_comment_lines",
                                    "\n# a: b\n\ntime [s],voltage [V]\n0.5,-1.5\n\n# mark\n1.25,12\n\n  \n"}),
    [](const ::testing::TestParamInfo<DelimiterCase>& info) { return std::string(info.param.name); });

TEST(ReadBenchLog, LongFileBeyondTheCheckedFirstBlock) {
  // 100 000 rows (about 1.5 MB) run past the 64 KiB block that is checked for text.
  constexpr int kRows = 100000;
  std::string content = "time [ms],current [A]\n";
  for (int row = 0; row < kRows; ++row) content += std::to_string(row) + "," + std::to_string(row % 7) + "\n";
  testing::TempLogFolder folder;
  const BenchLog log = ReadBenchLog(folder.Write("long.csv", content), {});
  ASSERT_EQ(log.size(), static_cast<std::size_t>(kRows));
  EXPECT_DOUBLE_EQ(At(log.time_s, kRows - 1), (kRows - 1) * 1e-3);  // NIST SP 811, 4.3
  EXPECT_EQ(At(log.current_A, kRows - 1), (kRows - 1) % 7);
  EXPECT_EQ(log.line_of_row.back(), kRows + 1);  // after the header line
}

TEST(ReadBenchLog, ExtraColumnsAreIgnoredEvenWhenNotNumeric) {
  testing::TempLogFolder folder;
  const std::string path = folder.Write("log.csv",
                                        "sample,time [s],label,gain [V/V],current limit [A],current [A]\n"
                                        "1,0.0,start,x,5,0.25\n"
                                        "2,0.1,,y,5,0.50\n");
  const BenchLog log = ReadBenchLog(path, {});
  // docs/file-formats.md: extra columns are ignored
  EXPECT_EQ(log.current_A, (std::vector<double>{0.25, 0.50}));
  ASSERT_EQ(log.columns.size(), 2u);
  EXPECT_EQ(log.columns[1].column, 6);
  EXPECT_EQ(log.header_cells.size(), 6u);
  EXPECT_EQ(log.header_cells[4], "current limit [A]");
}

TEST(ReadBenchLog, ConvertsEveryQuantityToSi) {
  testing::TempLogFolder folder;
  const std::string path = folder.Write(
      "log.csv",
      "time [us],voltage [mV],current [mA],speed [rpm],position [deg],torque [oz*in],temperature [K]\n"
      "0,12000,250,3000,90,100,300\n"
      "100,-500,-20,-60,-180,-1,273.15\n");
  const BenchLog log = ReadBenchLog(path, {});
  ASSERT_EQ(log.size(), 2u);
  EXPECT_DOUBLE_EQ(At(log.time_s, 1), 100e-6);                    // NIST SP 811, 4.3 (micro)
  EXPECT_DOUBLE_EQ(At(log.voltage_V, 0), 12.0);                   // NIST SP 811, 4.3 (milli)
  EXPECT_DOUBLE_EQ(At(log.current_A, 1), -0.020);                 // NIST SP 811, 4.3 (milli)
  EXPECT_DOUBLE_EQ(At(log.speed_rad_s, 0), 3000.0 * kRpm_rad_s);  // physics (definition)
  EXPECT_DOUBLE_EQ(At(log.speed_rad_s, 1), -2.0 * kPi);           // physics: 60 rpm = 1 rev/s
  EXPECT_DOUBLE_EQ(At(log.position_rad, 0), kPi / 2.0);           // physics: 90° = π/2
  EXPECT_DOUBLE_EQ(At(log.torque_N_m, 0), 0.7061552);             // NIST SP 811, App. B: 100 ozf·in
  EXPECT_NEAR(At(log.temperature_degC, 0), 26.85, 1e-12);         // NIST SP 811, 4.2.1.1
  EXPECT_NEAR(At(log.temperature_degC, 1), 0.0, 1e-12);
}

TEST(ReadBenchLog, KilogramForceCentimetreAndTorqueSynonyms) {
  testing::TempLogFolder folder;
  const BenchLog log = ReadBenchLog(folder.Write("log.csv", "time [s],torque [kgf*cm]\n0,10\n1,1\n"), {});
  EXPECT_DOUBLE_EQ(At(log.torque_N_m, 0), 0.980665);  // NIST SP 811, App. B: 10 kgf·cm = 0.0980665 kgf·m·10
  const BenchLog middle_dot =
      ReadBenchLog(folder.Write("dot.csv", "time [s],torque (N\u00b7m)\n0,0.25\n1,0.5\n"), {});
  EXPECT_EQ(At(middle_dot.torque_N_m, 1), 0.5);  // physics: N·m is the SI unit
}

TEST(ReadBenchLog, ColumnMapAndUnitOverride) {
  // A log in mV and ms with a tachometer column named in its own way.
  testing::TempLogFolder folder;
  const std::string path = folder.Write("odd.csv",
                                        "t (ms);U [mV];I;Tach (RPM);speed [rad/s]\n"
                                        "0;1200,5;300;1000;1\n"
                                        "2,5;2400;600;2000;2\n");
  ReadOptions options;
  options.column_for[Quantity::kTime] = "t";            // the part before the bracket
  options.column_for[Quantity::kVoltage] = "U [mV]";    // the full text
  options.column_for[Quantity::kCurrent] = "I";         // a cell with no unit ...
  options.unit_for[Quantity::kCurrent] = "mA";          // ... gets one from the unit map
  options.column_for[Quantity::kSpeed] = "Tach (RPM)";  // wins over 'speed [rad/s]'
  const BenchLog log = ReadBenchLog(path, options);
  ASSERT_EQ(log.size(), 2u);
  EXPECT_DOUBLE_EQ(At(log.time_s, 1), 2.5e-3);                    // NIST SP 811, 4.3
  EXPECT_DOUBLE_EQ(At(log.voltage_V, 0), 1.2005);                 // NIST SP 811, 4.3
  EXPECT_DOUBLE_EQ(At(log.current_A, 1), 0.6);                    // NIST SP 811, 4.3
  EXPECT_DOUBLE_EQ(At(log.speed_rad_s, 1), 2000.0 * kRpm_rad_s);  // physics (definition)
  ASSERT_EQ(log.columns.size(), 4u);
  EXPECT_EQ(log.columns[3].header, "Tach (RPM)");
  EXPECT_EQ(log.columns[3].unit, "RPM");
  EXPECT_EQ(log.columns[2].unit, "mA");
}

TEST(ReadBenchLog, UnitMapReplacesTheUnitOfTheHeader) {
  testing::TempLogFolder folder;
  ReadOptions options;
  options.unit_for[Quantity::kVoltage] = "mV";  // the logger wrote [V] but logs millivolts
  const BenchLog log =
      ReadBenchLog(folder.Write("log.csv", "time [s],voltage [V]\n0,500\n1,1500\n"), options);
  EXPECT_DOUBLE_EQ(At(log.voltage_V, 1), 1.5);  // NIST SP 811, 4.3
  EXPECT_EQ(log.columns[1].unit, "mV");
}

TEST(ReadBenchLog, QuotedHeaderMayHoldTheDelimiter) {
  testing::TempLogFolder folder;
  ReadOptions options;
  options.column_for[Quantity::kSpeed] = "Tach, filtered (rev/s)";
  const BenchLog log =
      ReadBenchLog(folder.Write("log.csv", "time [s],\"Tach, filtered (rev/s)\"\n0,1\n1,\"2\"\n"), options);
  EXPECT_DOUBLE_EQ(At(log.speed_rad_s, 1), 4.0 * kPi);  // physics: 2 rev/s = 4π rad/s; RFC 4180 quoting
}

TEST(ReadBenchLog, EncoderCountsGearRatioAndNoInventedSpeed) {
  testing::TempLogFolder folder;
  ReadOptions options;
  options.counts_per_rev = 2048.0;
  options.gear_ratio = 4.0;
  const BenchLog log = ReadBenchLog(
      folder.Write("enc.csv", "time [s],position [counts]\n0,0\n0.01,1024\n0.02,-512\n"), options);
  // physics: 1024 of 2048 counts = half a turn = π rad at the output, × 4 at the motor shaft
  EXPECT_DOUBLE_EQ(At(log.position_rad, 1), 4.0 * kPi);
  EXPECT_DOUBLE_EQ(At(log.position_rad, 2), -2.0 * kPi);
  EXPECT_TRUE(log.speed_rad_s.empty());  // read_bench_log.h: speed is derived later, never here

  const BenchLog geared =
      ReadBenchLog(folder.Write("speed.csv", "time [s],speed [rpm],voltage [V]\n0,60,2\n1,120,3\n"), options);
  EXPECT_DOUBLE_EQ(At(geared.speed_rad_s, 0), 4.0 * 2.0 * kPi);  // physics: 60 rpm = 2π rad/s, × gear 4
  EXPECT_EQ(At(geared.voltage_V, 0), 2.0);                       // the gear ratio touches only the shaft
}

}  // namespace
}  // namespace coilspin
