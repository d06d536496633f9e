#include "src/cli/demo_session.h"

#include <cstdlib>
#include <filesystem>
#include <system_error>

namespace coilspin::cli {

std::string DemoSessionPath() {
  namespace fs = std::filesystem;
  const char* const kSession = "session.toml";
  if (const char* folder = std::getenv("COILSPIN_DEMO_DIR")) return (fs::path(folder) / kSession).string();
  std::error_code error;
  const fs::path executable = fs::read_symlink("/proc/self/exe", error);
  if (!error) {
    const fs::path installed = executable.parent_path() / COILSPIN_DEMO_INSTALL_RELATIVE / kSession;
    if (fs::is_regular_file(installed, error)) return installed.lexically_normal().string();
  }
  return (fs::path(COILSPIN_DEMO_DIR) / kSession).string();
}

std::string DemoDatasheetPath() {
  return (std::filesystem::path(DemoSessionPath()).parent_path() / "datasheet.toml").string();
}

}  // namespace coilspin::cli
