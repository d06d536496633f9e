#pragma once
// Where `coilspin demo` finds the demo session (datasets-demo/ of the source
// tree, installed as <prefix>/share/coilspin/demo), in this order:
//   1. the folder named by the environment variable COILSPIN_DEMO_DIR;
//   2. the installed copy, found from the running executable
//      (/proc/self/exe): <folder of the executable>/COILSPIN_DEMO_INSTALL_RELATIVE,
//      "../share/coilspin/demo" for <prefix>/bin/coilspin — so an installed or
//      relocated tree finds its own logs, wherever it was built;
//   3. the source tree's datasets-demo (COILSPIN_DEMO_DIR compiled in), for a
//      binary run from its build folder.

#include <string>

namespace coilspin::cli {

// The session file's path, e.g. "/usr/share/coilspin/demo/session.toml".
std::string DemoSessionPath();

// The demo motor's datasheet, beside the session file ("…/demo/datasheet.toml").
std::string DemoDatasheetPath();

}  // namespace coilspin::cli
