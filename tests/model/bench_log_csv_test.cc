#include "src/output/bench_log_csv.h"

#include <gtest/gtest.h>
#include <stdlib.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace coilspin::output {
namespace {

namespace fs = std::filesystem;

// What the tiny reader below finds in a file.
struct ParsedCsv {
  std::vector<std::string> comments;
  std::vector<std::string> header;
  std::vector<std::vector<double>> columns;
};

std::vector<std::string> Split(const std::string& line, char delimiter) {
  std::vector<std::string> cells;
  std::string cell;
  std::istringstream stream(line);
  while (std::getline(stream, cell, delimiter)) cells.push_back(cell);
  return cells;
}

// A deliberately small reader, independent of src/ingest: '#' lines, one header, numbers.
ParsedCsv ReadCsv(const fs::path& path, char delimiter, bool decimal_comma) {
  ParsedCsv csv;
  std::ifstream in(path);
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("#", 0) == 0) {
      csv.comments.push_back(line);
    } else if (csv.header.empty()) {
      csv.header = Split(line, delimiter);
      csv.columns.resize(csv.header.size());
    } else {
      const std::vector<std::string> cells = Split(line, delimiter);
      EXPECT_EQ(cells.size(), csv.header.size()) << line;
      for (std::size_t c = 0; c < cells.size() && c < csv.columns.size(); ++c) {
        std::string text = cells[c];
        if (decimal_comma) {
          for (char& ch : text) ch = ch == ',' ? '.' : ch;
        }
        std::size_t used = 0;
        csv.columns[c].push_back(std::stod(text, &used));
        EXPECT_EQ(used, text.size()) << "not a whole number cell: " << cells[c];
      }
    }
  }
  return csv;
}

std::string ReadText(const fs::path& path) {
  std::ifstream in(path);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

class BenchLogCsvTest : public ::testing::Test {
 protected:
  void SetUp() override {
    std::string pattern = (fs::temp_directory_path() / "coilspin-csv-XXXXXX").string();
    ASSERT_NE(::mkdtemp(pattern.data()), nullptr);
    dir_ = pattern;
  }
  void TearDown() override { fs::remove_all(dir_); }

  // Every entry of the folder, to check that no temporary file is left behind.
  std::vector<std::string> Entries() const {
    std::vector<std::string> names;
    for (const auto& entry : fs::directory_iterator(dir_)) {
      names.push_back(entry.path().filename().string());
    }
    return names;
  }

  fs::path dir_;
};

model::SampledLog SmallLog() {
  model::SampledLog log;
  log.time_s = {0.0, 0.0005, 0.0015, 0.0125};
  log.voltage_V = {0.0, 11.9876, -3.25, 0.000125};
  log.current_A = {0.0, 1.5, -0.0625, 2.345678912};
  log.temperature_degC = {25.0, 25.5, 26.0, 31.25};
  return log;
}

// SI prefixes by definition (NIST SP 811, 4.3): 1 ms = 1e-3 s, 1 mV = 1e-3 V, 1 mA = 1e-3 A.
constexpr double kMilli = 1e-3;
constexpr double kPi = 3.14159265358979323846;  // physics (mathematical constant)
// %.10g keeps ten significant digits: relative rounding below 5e-11.
constexpr double kTenDigitTolerance = 5e-11;

TEST_F(BenchLogCsvTest, RoundTripsMillisMilliVoltsSemicolonsAndDecimalCommas) {
  CsvStyle style;
  style.time_unit = "ms";
  style.voltage_unit = "mV";
  style.current_unit = "mA";
  style.delimiter = ';';
  style.decimal_comma = true;
  style.comment_lines = {"bench: simulated", "seed: 1"};
  const model::SampledLog log = SmallLog();
  const fs::path path = dir_ / "locked.csv";
  WriteBenchLogCsv(log, path.string(), style);

  const ParsedCsv csv = ReadCsv(path, ';', true);
  EXPECT_EQ(csv.comments, (std::vector<std::string>{"# bench: simulated", "# seed: 1"}));
  // bench-logs.md: header cells "quantity [unit]"; empty channels (speed, torque) are not written
  EXPECT_EQ(csv.header, (std::vector<std::string>{"time [ms]", "voltage [mV]", "current [mA]",
                                                   "temperature [degC]"}));
  const std::vector<const std::vector<double>*> si = {&log.time_s, &log.voltage_V, &log.current_A,
                                                       &log.temperature_degC};
  const std::vector<double> factor = {kMilli, kMilli, kMilli, 1.0};
  for (std::size_t c = 0; c < si.size(); ++c) {
    ASSERT_EQ(csv.columns[c].size(), si[c]->size());
    for (std::size_t k = 0; k < si[c]->size(); ++k) {
      const double expected = (*si[c])[k];
      EXPECT_NEAR(csv.columns[c][k] * factor[c], expected, kTenDigitTolerance * std::abs(expected))
          << csv.header[c] << " row " << k;
    }
  }
  // physics (definition of milli): 0.5e-3 s, 11.9876 V, 1.5 A are written "0,5" ms,
  // "11987,6" mV, "1500" mA with a decimal comma
  const std::string text = ReadText(path);
  EXPECT_NE(text.find("\n0,5;11987,6;1500;25,5\n"), std::string::npos) << text;
  EXPECT_EQ(Entries(), std::vector<std::string>{"locked.csv"});
}

TEST_F(BenchLogCsvTest, DefaultStyleIsCommaSeparatedSi) {
  const fs::path path = dir_ / "step.csv";
  model::SampledLog log = SmallLog();
  log.temperature_degC.clear();
  WriteBenchLogCsv(log, path.string(), CsvStyle{});
  const std::string text = ReadText(path);
  // bench-logs.md: ',' by default, "quantity [unit]" headers
  EXPECT_EQ(text.substr(0, text.find('\n')), "time [s],voltage [V],current [A]");
  EXPECT_NE(text.find("\n0.0005,11.9876,1.5\n"), std::string::npos) << text;
}

TEST_F(BenchLogCsvTest, SeventeenDigitsReproduceEveryDouble) {
  // IEEE 754: 17 significant decimal digits identify a binary64 value uniquely
  CsvStyle style;
  style.significant_digits = 17;
  model::SampledLog log;
  log.time_s = {0.0, 1e-5, 2e-5};
  log.voltage_V = {1.0 / 3.0, 2.0 / 7.0, -5.0 / 9.0};
  log.current_A = {std::sqrt(2.0), -std::exp(1.0), 1e-300};
  const fs::path path = dir_ / "exact.csv";
  WriteBenchLogCsv(log, path.string(), style);
  const ParsedCsv csv = ReadCsv(path, ',', false);
  EXPECT_EQ(csv.columns[0], log.time_s);
  EXPECT_EQ(csv.columns[1], log.voltage_V);
  EXPECT_EQ(csv.columns[2], log.current_A);
}

TEST_F(BenchLogCsvTest, ConvertsSpeedTorqueAndTemperatureUnitsAndRenamesHeaders) {
  CsvStyle style;
  style.speed_unit = "rpm";
  style.torque_unit = "mN*m";
  style.temperature_unit = "K";
  style.delimiter = '\t';
  style.header_for[units::Quantity::kSpeed] = "Tach (RPM)";
  model::SampledLog log;
  log.time_s = {0.0};
  // references.md: 1 rpm = 2π/60 rad/s (physics, definition), so 1000 rpm = 104.719755… rad/s
  log.speed_rad_s = {1000.0 * 2.0 * kPi / 60.0};
  log.torque_N_m = {0.0125};  // 12.5 mN·m (SI prefix)
  log.temperature_degC = {25.0};  // NIST SP 811: T/K = t/degC + 273.15
  const fs::path path = dir_ / "tab.csv";
  WriteBenchLogCsv(log, path.string(), style);
  const ParsedCsv csv = ReadCsv(path, '\t', false);
  EXPECT_EQ(csv.header,
            (std::vector<std::string>{"time [s]", "Tach (RPM)", "torque [mN*m]", "temperature [K]"}));
  EXPECT_NEAR(csv.columns[1][0], 1000.0, kTenDigitTolerance * 1000.0);
  EXPECT_NEAR(csv.columns[2][0], 12.5, kTenDigitTolerance * 12.5);
  EXPECT_NEAR(csv.columns[3][0], 298.15, kTenDigitTolerance * 298.15);
}

TEST_F(BenchLogCsvTest, RejectsStylesTheReaderCouldNotRead) {
  // bench-logs.md: a decimal comma only with ';'; units from the one table
  std::string error;
  CsvStyle comma_with_comma;
  comma_with_comma.decimal_comma = true;
  EXPECT_FALSE(comma_with_comma.IsValid(&error));
  EXPECT_NE(error.find("';'"), std::string::npos) << error;
  CsvStyle unknown_unit;
  unknown_unit.voltage_unit = "kV";
  EXPECT_FALSE(unknown_unit.IsValid(&error));
  EXPECT_NE(error.find("mV"), std::string::npos) << "lists the accepted units: " << error;
  CsvStyle pipe;
  pipe.delimiter = '|';
  EXPECT_FALSE(pipe.IsValid(&error));
  EXPECT_TRUE(CsvStyle{}.IsValid(&error));
  EXPECT_THROW(WriteBenchLogCsv(SmallLog(), (dir_ / "x.csv").string(), unknown_unit),
               std::invalid_argument);
}

TEST_F(BenchLogCsvTest, RejectsChannelsOfDifferentLengthsAndKeepsTheOldFile) {
  const fs::path path = dir_ / "keep.csv";
  WriteBenchLogCsv(SmallLog(), path.string(), CsvStyle{});
  const std::string before = ReadText(path);
  model::SampledLog ragged = SmallLog();
  ragged.current_A.pop_back();
  EXPECT_THROW(WriteBenchLogCsv(ragged, path.string(), CsvStyle{}), std::invalid_argument);
  EXPECT_EQ(ReadText(path), before);
  EXPECT_THROW(WriteBenchLogCsv(model::SampledLog{}, path.string(), CsvStyle{}),
               std::invalid_argument);
  EXPECT_EQ(Entries(), std::vector<std::string>{"keep.csv"});
}

TEST_F(BenchLogCsvTest, ReplacesAnExistingFileAndReportsAnUnwritableOne) {
  const fs::path path = dir_ / "log.csv";
  { std::ofstream(path) << "old contents\n"; }
  WriteBenchLogCsv(SmallLog(), path.string(), CsvStyle{});
  EXPECT_EQ(ReadText(path).rfind("time [s]", 0), 0u);
  EXPECT_EQ(Entries(), std::vector<std::string>{"log.csv"});
  const fs::path missing = dir_ / "no-such-folder" / "log.csv";
  EXPECT_THROW(WriteBenchLogCsv(SmallLog(), missing.string(), CsvStyle{}), std::runtime_error);
}

}  // namespace
}  // namespace coilspin::output
