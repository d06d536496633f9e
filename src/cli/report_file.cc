#include "src/cli/report_file.h"

#include <unistd.h>

#include <filesystem>
#include <system_error>

#include "src/ingest/input_error.h"
#include "src/output/atomic_file.h"

namespace coilspin::cli {

void CheckReportTarget(const std::string& path) {
  namespace fs = std::filesystem;
  const auto refuse = [&](const std::string& why) {
    throw InputError(InputErrorKind::kBadOption, path, 0, 0, "--report: " + why);
  };
  if (path.empty()) refuse("needs a file name");
  const fs::path target(path);
  const fs::path folder = target.has_parent_path() ? target.parent_path() : fs::path(".");
  std::error_code error;
  if (!fs::is_directory(folder, error)) refuse("the folder " + folder.string() + " does not exist");
  if (::access(folder.c_str(), W_OK | X_OK) != 0) refuse("the folder " + folder.string() + " cannot be written");
  const fs::file_status status = fs::symlink_status(target, error);
  if (fs::exists(status) && !fs::is_regular_file(status))
    refuse("exists and is not a regular file (a folder, link, device or pipe): nothing is written over it");
}

void WriteReport(const std::string& path, const std::string& html) { output::WriteFileAtomically(path, html); }

}  // namespace coilspin::cli
