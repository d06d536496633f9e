#pragma once
// A ready-made BootstrapOptions::progress for a terminal: nothing for the first
// kBootstrapProgressDelaySeconds, then "bootstrap: 120/200 replicates" on
// stderr, rewritten in place with '\r', and a newline once all are done (only
// if anything was written). For the CLI; the core itself never prints.

#include <functional>

namespace coilspin::core {

// A run shorter than this stays silent: a progress line that flashes for a
// fraction of a second is noise (common practice).
inline constexpr double kBootstrapProgressDelaySeconds = 1.0;

std::function<void(int done, int total, double elapsed_seconds)> StderrBootstrapProgress();

}  // namespace coilspin::core
