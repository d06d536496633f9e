#pragma once
// Test helper: counts, per parameter, the fits whose interval holds the truth
// (the tally of the fast coverage checks; the benchmark has its own, with bias
// and spread, in tests/bench/coverage_tally.h).

#include <gtest/gtest.h>

#include <map>
#include <string>
#include <utility>
#include <vector>

#include "fitters/core/motor_estimate.h"

namespace coilspin::testing {

using Truths = std::vector<std::pair<const char*, double>>;

// Adds one to covered[key] for every parameter whose interval in `e` holds its truth;
// a parameter missing from `e` is a test failure.
inline void CountCovered(const MotorEstimate& e, const Truths& truths, std::map<std::string, int>* covered) {
  for (const auto& [key, truth] : truths) {
    const QuantityEstimate* q = e.Find(key);
    if (q == nullptr) {
      ADD_FAILURE() << key << " not determined";
      continue;
    }
    if (q->ci_low <= truth && truth <= q->ci_high) ++(*covered)[key];
  }
}

}  // namespace coilspin::testing
