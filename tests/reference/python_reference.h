#pragma once
// Test helpers for checks against SciPy (COILSPIN_PYTHON, Debian's python3-scipy):
// whether it is there, and the standard output of a command.

#include <cstdio>
#include <cstdlib>
#include <string>

namespace coilspin::test_support {

inline bool SciPyAvailable() {
  const std::string command = std::string(COILSPIN_PYTHON) + " -c 'import scipy' >/dev/null 2>&1";
  return std::string(COILSPIN_PYTHON).size() > 0 && std::system(command.c_str()) == 0;
}

inline std::string RunCapture(const std::string& command) {
  std::string text;
  FILE* pipe = popen(command.c_str(), "r");
  if (!pipe) return text;
  char buffer[4096];
  while (std::fgets(buffer, sizeof buffer, pipe)) text += buffer;
  pclose(pipe);
  return text;
}

}  // namespace coilspin::test_support
