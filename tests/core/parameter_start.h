#pragma once
// Test helper: a parameter to estimate, starting at `initial`, no bounds.

#include <string>

#include "fitters/core/least_squares.h"

namespace coilspin::core::test_support {

inline ParameterSpec Start(const std::string& name, double initial) {
  ParameterSpec spec;
  spec.name = name;
  spec.initial = initial;
  return spec;
}

}  // namespace coilspin::core::test_support
