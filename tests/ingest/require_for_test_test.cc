// What each test kind needs from a log (docs/file-formats.md, "Test kinds and what each needs").

#include <gtest/gtest.h>

#include <string>

#include "ingest/temp_log_file.h"
#include "src/ingest/input_error.h"
#include "src/ingest/read_bench_log.h"

namespace coilspin {
namespace {

using units::Quantity;

// A log of `samples` rows in memory with the given channels; voltage, current
// and speed ramp so that none is constant.
BenchLog MakeLog(std::size_t samples, const std::vector<Quantity>& quantities) {
  BenchLog log;
  log.path = "made.csv";
  log.header_line = 1;
  long column = 0;
  for (Quantity quantity : quantities) {
    std::vector<double>& channel = log.Channel(quantity);
    for (std::size_t i = 0; i < samples; ++i) channel.push_back(0.01 * static_cast<double>(i) + 1.0);
    log.columns.push_back({quantity, std::string(units::QuantityName(quantity)), "SI", ++column});
    log.header_cells.emplace_back(units::QuantityName(quantity));
  }
  return log;
}

InputErrorKind KindOf(const BenchLog& log, TestKind kind) {
  try {
    RequireForTest(log, kind);
  } catch (const InputError& error) {
    return error.kind();
  }
  ADD_FAILURE() << "no InputError for " << TestKindToString(kind);
  return InputErrorKind::kBadSession;
}

const std::vector<Quantity> kElectrical = {Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent};

TEST(RequireForTest, RequiredColumnsOfEachKind) {
  // docs/file-formats.md, table "Test kinds and what each needs"
  EXPECT_NO_THROW(RequireForTest(MakeLog(100, kElectrical), TestKind::kLockedRotor));
  EXPECT_EQ(KindOf(MakeLog(100, {Quantity::kTime, Quantity::kVoltage}), TestKind::kLockedRotor),
            InputErrorKind::kMissingColumn);
  EXPECT_EQ(KindOf(MakeLog(100, kElectrical), TestKind::kNoLoad), InputErrorKind::kMissingColumn);
  EXPECT_NO_THROW(RequireForTest(
      MakeLog(100, {Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent, Quantity::kPosition}),
      TestKind::kNoLoad));
  EXPECT_NO_THROW(RequireForTest(MakeLog(100, {Quantity::kTime, Quantity::kSpeed}), TestKind::kSpinDown));
  EXPECT_NO_THROW(RequireForTest(MakeLog(100, {Quantity::kTime, Quantity::kPosition}), TestKind::kSpinDown));
  EXPECT_EQ(KindOf(MakeLog(100, kElectrical), TestKind::kSpinDown), InputErrorKind::kMissingColumn);
  EXPECT_EQ(KindOf(MakeLog(100, kElectrical), TestKind::kStep), InputErrorKind::kMissingColumn);
  EXPECT_NO_THROW(RequireForTest(
      MakeLog(100, {Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent, Quantity::kSpeed}),
      TestKind::kStep));
}

TEST(RequireForTest, MissingColumnNamesTheKindAndTheFilesColumns) {
  testing::TempLogFolder folder;
  const BenchLog log =
      ReadBenchLog(folder.Write("log.csv", "# rig: 2\ntime [s],voltage [V],Amps\n0,1,2\n1,2,3\n"), {});
  try {
    RequireForTest(log, TestKind::kLockedRotor);
    FAIL() << "locked-rotor accepted a log without current";
  } catch (const InputError& error) {
    EXPECT_EQ(error.kind(), InputErrorKind::kMissingColumn);
    EXPECT_EQ(error.line(), 2);  // the header row
    EXPECT_NE(error.message().find("locked-rotor needs time, voltage, current"), std::string::npos);
    EXPECT_NE(error.message().find("'Amps'"), std::string::npos);
  }
}

TEST(RequireForTest, TooFewSamples) {
  // Plateau tests: 2 levels × ⌈8 / 0.75⌉ samples = 22 (segmentation.h PlateauOptions defaults).
  EXPECT_EQ(KindOf(MakeLog(21, kElectrical), TestKind::kLockedRotor), InputErrorKind::kTooFewSamples);
  EXPECT_NO_THROW(RequireForTest(MakeLog(22, kElectrical), TestKind::kLockedRotor));
  // Spin-down: 20 samples (common practice, see require_for_test.cc).
  const std::vector<Quantity> coast = {Quantity::kTime, Quantity::kSpeed};
  EXPECT_EQ(KindOf(MakeLog(19, coast), TestKind::kSpinDown), InputErrorKind::kTooFewSamples);
  EXPECT_NO_THROW(RequireForTest(MakeLog(20, coast), TestKind::kSpinDown));
}

TEST(RequireForTest, ConstantSignals) {
  BenchLog held = MakeLog(100, kElectrical);
  held.voltage_V.assign(100, 12.0);  // the supply was never stepped
  try {
    RequireForTest(held, TestKind::kLockedRotor);
    FAIL() << "accepted a constant voltage";
  } catch (const InputError& error) {
    EXPECT_EQ(error.kind(), InputErrorKind::kConstantSignal);
    EXPECT_EQ(error.line(), 1);    // the header row ...
    EXPECT_EQ(error.column(), 2);  // ... and the voltage column
    EXPECT_NE(error.message().find("are 12 V"), std::string::npos);
  }
  BenchLog no_current =
      MakeLog(100, {Quantity::kTime, Quantity::kVoltage, Quantity::kCurrent, Quantity::kSpeed});
  no_current.current_A.assign(100, 0.0);  // a disconnected current probe
  EXPECT_EQ(KindOf(no_current, TestKind::kNoLoad), InputErrorKind::kConstantSignal);
  EXPECT_EQ(KindOf(no_current, TestKind::kStep), InputErrorKind::kConstantSignal);

  BenchLog resting = MakeLog(100, {Quantity::kTime, Quantity::kSpeed});
  resting.speed_rad_s.assign(100, 0.0);  // the rotor never turned
  EXPECT_EQ(KindOf(resting, TestKind::kSpinDown), InputErrorKind::kConstantSignal);
  BenchLog parked = MakeLog(100, {Quantity::kTime, Quantity::kPosition});
  parked.position_rad.assign(100, 1.0);
  EXPECT_EQ(KindOf(parked, TestKind::kSpinDown), InputErrorKind::kConstantSignal);
}

}  // namespace
}  // namespace coilspin
