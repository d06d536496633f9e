#pragma once
// Output options (--json, --out): checked before any work, so that a long fit
// never ends in "cannot write" and nothing but a regular file is replaced
// (src/output/atomic_file.h says what is refused, and why).

#include <string>

namespace coilspin::cli {

// Throws InputError (kBadOutputPath) naming the option and the path when
// `path` cannot take the option's output file; "-" (standard output) passes.
void RequireOutputPath(const std::string& option, const std::string& path);

}  // namespace coilspin::cli
