#pragma once
// Test helpers for the core: a parameter to estimate, starting at `initial`
// with no bounds; the straight-line residual y = a + b·x.

#include <string>

#include "fitters/core/least_squares.h"

namespace coilspin::core::test_support {

inline ParameterSpec Start(const std::string& name, double initial) {
  ParameterSpec spec;
  spec.name = name;
  spec.initial = initial;
  return spec;
}

// y = a + b·x; r = y − (a + b·x)
struct LineResidual {
  double x;
  double y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    r[0] = y - (*p[0] + *p[1] * x);
    return true;
  }
};

}  // namespace coilspin::core::test_support
