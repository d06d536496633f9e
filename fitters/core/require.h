#pragma once
// Contract checks for the fitting core. A broken precondition is a programming
// error in the caller (an unknown parameter name, a residual block over more
// parameters than a block can hold), not a property of the data: like Ceres'
// CHECK, it aborts with a message, also in release builds. Data-dependent
// failures never come here; they are reported in FitResult.

#include <string_view>

namespace coilspin::core {

// Aborts the program after writing `what` to standard error unless `condition` holds.
void Require(bool condition, std::string_view what);

}  // namespace coilspin::core
