#pragma once
// The report file of `fit --report` and `demo --report`: its target checked
// before any fitting (so a wrong path costs no fit and writes nothing), then
// the page written through the project's atomic write (temp file in the same
// folder, renamed over the target). Both in one place so that the shared
// safe-output helper can take over with one edit.

#include <string>

namespace coilspin::cli {

// Throws InputError (exit status 2) when the folder of `path` does not exist, is
// not a folder or cannot be written, or when `path` exists and is not a regular
// file (a folder, a device, a pipe, a symbolic link).
void CheckReportTarget(const std::string& path);

// Writes `html` to `path` atomically; throws std::runtime_error naming the path.
void WriteReport(const std::string& path, const std::string& html);

}  // namespace coilspin::cli
