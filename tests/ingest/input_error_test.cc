// The location prefix of InputError (style.md habit 7: "file:line: message").

#include "src/ingest/input_error.h"

#include <gtest/gtest.h>

#include <set>
#include <string>

namespace coilspin {
namespace {

TEST(InputError, WhatCarriesFileLineAndColumn) {
  const InputError error(InputErrorKind::kNonNumericCell, "log.csv", 12, 3, "cell 'x' is not a number");
  EXPECT_STREQ(error.what(), "log.csv:12:3: cell 'x' is not a number");  // style.md habit 7
  EXPECT_EQ(error.message(), "cell 'x' is not a number");
  EXPECT_EQ(error.kind(), InputErrorKind::kNonNumericCell);
  EXPECT_EQ(error.file(), "log.csv");
  EXPECT_EQ(error.line(), 12);
  EXPECT_EQ(error.column(), 3);
}

TEST(InputError, ZeroLineOrColumnIsLeftOut) {
  // style.md habit 7: "spin_down.csv:412: time is not increasing ..." (no column)
  EXPECT_STREQ(InputError(InputErrorKind::kTimeNotIncreasing, "spin_down.csv", 412, 0, "m").what(),
               "spin_down.csv:412: m");
  EXPECT_STREQ(InputError(InputErrorKind::kCannotOpen, "gone.csv", 0, 0, "m").what(), "gone.csv: m");
  EXPECT_STREQ(InputError(InputErrorKind::kConstantSignal, "a.csv", 0, 4, "m").what(), "a.csv: m");
  EXPECT_STREQ(InputError(InputErrorKind::kBadOption, "", 0, 0, "m").what(), "m");
}

TEST(InputError, EveryKindHasItsOwnName) {
  std::set<std::string> names;
  const int kinds = static_cast<int>(InputErrorKind::kOutOfRange) + 1;  // the last enumerator
  for (int i = 0; i < kinds; ++i) {
    const std::string_view name = InputErrorKindName(static_cast<InputErrorKind>(i));
    EXPECT_FALSE(name.empty()) << i;
    names.emplace(name);
  }
  EXPECT_EQ(static_cast<int>(names.size()), kinds);  // common practice: distinct names per kind
  EXPECT_EQ(InputErrorKindName(InputErrorKind::kTimeNotIncreasing), "time-not-increasing");
}

}  // namespace
}  // namespace coilspin
