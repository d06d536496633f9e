#include "src/cli/output_path.h"

#include "src/ingest/input_error.h"
#include "src/output/atomic_file.h"

namespace coilspin::cli {

void RequireOutputPath(const std::string& option, const std::string& path) {
  if (const auto problem = output::OutputPathProblem(path))
    throw InputError(InputErrorKind::kBadOutputPath, path, 0, 0,
                     option + ": " + *problem);
}

}  // namespace coilspin::cli
