#pragma once
// Test helper: a `coilspin simulate` command line that must be refused, and
// the check that it was: exit 2, the message holds the expected fragment,
// nothing written (common practice: an option that would be ignored is an
// error, so a typo cannot pass silently).

#include <gtest/gtest.h>

#include <filesystem>
#include <ostream>
#include <string>

#include "cli/run_coilspin.h"

namespace coilspin::testing {

struct Inapplicable {
  std::string name;
  std::string arguments;  // after "simulate"
  std::string expected;   // a fragment of the message
};

inline void PrintTo(const Inapplicable& c, std::ostream* os) { *os << c.name; }

inline void ExpectRefused(const Inapplicable& c, const RunResult& r, const std::filesystem::path& never_written) {
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find(c.expected), std::string::npos) << r.err;
  EXPECT_FALSE(std::filesystem::exists(never_written));
}

}  // namespace coilspin::testing
