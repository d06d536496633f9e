#pragma once
// Writing a file so that readers never see half of it and a failed run never
// replaces a good file: the text goes to a temporary file in the same folder,
// is flushed, and is renamed over the target only when complete.

#include <string>

namespace coilspin::output {

// Throws std::runtime_error naming the path when the file cannot be written.
void WriteFileAtomically(const std::string& path, const std::string& contents);

}  // namespace coilspin::output
