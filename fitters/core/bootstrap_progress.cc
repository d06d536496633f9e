#include "fitters/core/bootstrap_progress.h"

#include <cstdio>

namespace coilspin::core {

std::function<void(int, int, double)> StderrBootstrapProgress() {
  // The final call (done == total) comes after every other one, so once a line
  // has been written the final call is past the delay too and ends it.
  return [](int done, int total, double elapsed_seconds) {
    if (elapsed_seconds <= kBootstrapProgressDelaySeconds) return;
    std::fprintf(stderr, "\rbootstrap: %d/%d replicates", done, total);
    if (done == total) std::fputc('\n', stderr);
    std::fflush(stderr);
  };
}

}  // namespace coilspin::core
