#pragma once
// Result files of real fits for the tests that start from one (reader, exports,
// tuning). Each is made by the built coilspin binary into COILSPIN_HANDOFF_DIR
// when it is missing or older than the binary, so ctest fits each once per
// build; run_coilspin.h checks each against the format-2 schema as it is written.

#include <filesystem>
#include <string>

#include "cli/run_coilspin.h"

namespace coilspin::testing {

// The demo session (invented motor, datasets-demo/README.md): every parameter,
// Kt taken equal to Ke, derived figures at the highest logged level.
inline const char* const kDemoResult = "demo.json";
// The demo session with the inertia given and the operating voltage given as 12 V.
inline const char* const kGivenInertiaResult = "given-inertia.json";
// Locked-rotor plateaus only, bootstrap intervals (null degrees of freedom).
inline const char* const kBootstrapResult = "bootstrap.json";

inline std::filesystem::path FittedResult(const std::string& name) {
  namespace fs = std::filesystem;
  const fs::path folder = COILSPIN_HANDOFF_DIR;
  const fs::path path = folder / name;
  std::error_code ignored;
  if (fs::exists(path) && fs::last_write_time(path) >= fs::last_write_time(COILSPIN_BINARY)) return path;
  fs::create_directories(folder);
  const std::string demo = COILSPIN_DEMO_DIR;
  std::string arguments;
  if (name == kDemoResult) arguments = "demo --json " + name;
  if (name == kGivenInertiaResult)
    arguments = "fit --json " + name + " '" + demo + "/session.toml' --known-inertia 3.2e-5 --at-voltage 12 --quiet";
  if (name == kBootstrapResult)
    arguments = "fit --json " + name + " --locked-rotor '" + demo +
                "/locked-rotor-plateaus.csv' --intervals bootstrap --replicates 20 --quiet";
  const RunResult r = RunCoilspin(arguments, folder);
  EXPECT_EQ(r.status, 0) << arguments << "\n" << r.err;
  return path;
}

}  // namespace coilspin::testing
