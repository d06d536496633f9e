#pragma once
// Exit status of coilspin (docs/cli.md):
//   0  success
//   1  the fit ran but a requested quantity could not be determined (the result file says which)
//   2  bad input or usage: nothing was written

namespace coilspin::cli {

enum ExitCode : int { kSuccess = 0, kUndetermined = 1, kBadInput = 2 };

}  // namespace coilspin::cli
