// The checks on ReadOptions.

#include "src/ingest/read_options.h"

#include <gtest/gtest.h>

#include <cmath>

#include "src/ingest/input_error.h"

namespace coilspin {
namespace {

using units::Quantity;

InputErrorKind KindOfOptions(const ReadOptions& options) {
  try {
    ValidateReadOptions(options);
  } catch (const InputError& error) {
    return error.kind();
  }
  ADD_FAILURE() << "accepted the options";
  return InputErrorKind::kBadSession;
}

TEST(ValidateReadOptions, GearRatioCountsPerRevolutionAndUnits) {
  EXPECT_NO_THROW(ValidateReadOptions({}));
  ReadOptions options;
  options.gear_ratio = -2.0;
  EXPECT_EQ(KindOfOptions(options), InputErrorKind::kBadOption);  // physics: turns per turn > 0
  options.gear_ratio = std::nan("");
  EXPECT_EQ(KindOfOptions(options), InputErrorKind::kBadOption);
  options = {};
  options.counts_per_rev = 0.0;
  EXPECT_EQ(KindOfOptions(options), InputErrorKind::kBadOption);
  options = {};
  options.unit_for[Quantity::kSpeed] = "rad/min";
  EXPECT_EQ(KindOfOptions(options), InputErrorKind::kUnknownUnit);
  options = {};
  options.column_for[Quantity::kSpeed] = "";
  EXPECT_EQ(KindOfOptions(options), InputErrorKind::kBadOption);
}

}  // namespace
}  // namespace coilspin
