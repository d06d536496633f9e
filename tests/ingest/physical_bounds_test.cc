// Values the reader refuses because no bench reading can have them
// (docs/file-formats.md, "Values"): a temperature at or below copper's −234.5 °C
// (IEC 60028; the copper law R(θ) = R_ref·(k + θ)/(k + θ_ref) reaches zero
// there), a magnitude beyond 1e100 in SI (whose square, summed, could overflow
// a fit's sums; IEEE 754 double range), a time step shorter than 1e-12 s. Each
// is an InputError (out-of-range) at the cell's line and column, counted by hand.

#include <gtest/gtest.h>

#include <string>

#include "ingest/temp_log_file.h"
#include "src/ingest/input_error.h"
#include "src/ingest/read_bench_log.h"

namespace coilspin {
namespace {

InputError ErrorOf(const std::string& content, const ReadOptions& options = {}) {
  testing::TempLogFolder folder;
  try {
    ReadBenchLog(folder.Write("log.csv", content), options);
  } catch (const InputError& error) {
    return error;
  }
  ADD_FAILURE() << "no InputError for:\n" << content;
  return InputError(InputErrorKind::kBadSession, "", 0, 0, "none");
}

TEST(PhysicalBounds, AThermocoupleFaultCodeIsBelowCopperLimit) {
  // -999 from the 3rd row on, as some loggers write when a thermocouple opens.
  const InputError error = ErrorOf("time [s],voltage [V],temperature [degC]\n0,1,23\n0.1,1,23\n0.2,1,-999\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kOutOfRange);
  EXPECT_EQ(error.line(), 4);
  EXPECT_EQ(error.column(), 3);
  EXPECT_EQ(error.message(),
            "temperature -999 degC in column 3 'temperature [degC]' is at or below -234.5 degC where copper's "
            "resistance would reach zero: no winding is that cold (a sensor's fault code, or degC values under a "
            "[K] header?)");
}

TEST(PhysicalBounds, CelsiusValuesUnderAKelvinHeader) {
  // 23 K = -250.15 degC (NIST SP 811, 4.2.1.1): below the copper limit.
  const InputError error = ErrorOf("time [s],temperature [K]\n0,23\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kOutOfRange);
  EXPECT_EQ(error.line(), 2);
  EXPECT_EQ(error.column(), 2);
  EXPECT_NE(error.message().find("temperature 23 K (-250.15 degC)"), std::string::npos) << error.message();
  // Exactly at the limit is refused too (the law divides by k + θ_ref there); just above is read.
  EXPECT_EQ(ErrorOf("time [s],temperature [degC]\n0,-234.5\n").kind(), InputErrorKind::kOutOfRange);
  testing::TempLogFolder folder;
  const BenchLog log = ReadBenchLog(folder.Write("ok.csv", "time [s],temperature [degC]\n0,-234.4\n"), {});
  EXPECT_EQ(log.temperature_degC.front(), -234.4);
}

TEST(PhysicalBounds, AValueBeyondTheLargestReading) {
  const InputError error = ErrorOf("time [s],voltage [V]\n0,1\n0.1,1e308\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kOutOfRange);
  EXPECT_EQ(error.line(), 3);
  EXPECT_EQ(error.column(), 2);
  EXPECT_EQ(error.message(),
            "value 1e+308 V in column 2 'voltage [V]' is larger than any reading (the limit is 1e+100 in SI "
            "units); a logger's error code or a wrong unit?");
  // Judged in SI: 1e102 mV is 1e99 V, read; -9e307 anywhere is not.
  testing::TempLogFolder folder;
  EXPECT_EQ(ReadBenchLog(folder.Write("mv.csv", "time [s],voltage [mV]\n0,1e102\n"), {}).voltage_V.front(), 1e99);
  EXPECT_EQ(ErrorOf("time [s],current [A]\n0,-9e307\n").line(), 2);
  // Beyond the range of a double once converted stays not-finite: 1e308 rev = 6.3e308 rad.
  EXPECT_EQ(ErrorOf("time [s],position [rev]\n0,1e308\n").kind(), InputErrorKind::kNotFinite);
}

TEST(PhysicalBounds, ATimeStepShorterThanAnyLogger) {
  // 1e-300 s apart: a time column scaled by mistake (the fit would divide by it).
  const InputError error = ErrorOf("time [s],voltage [V]\n0,1\n1e-300,2\n");
  EXPECT_EQ(error.kind(), InputErrorKind::kOutOfRange);
  EXPECT_EQ(error.line(), 3);
  EXPECT_EQ(error.column(), 1);
  EXPECT_NE(error.message().find("time step of 1e-300 s (1e-300 s after 0 s) is shorter than any logger samples"),
            std::string::npos)
      << error.message();
  // A picosecond step is the shortest allowed; in ns the same step is read.
  testing::TempLogFolder folder;
  EXPECT_EQ(ReadBenchLog(folder.Write("ps.csv", "time [us],voltage [V]\n0,1\n1e-6,2\n"), {}).size(), 2u);
}

}  // namespace
}  // namespace coilspin
