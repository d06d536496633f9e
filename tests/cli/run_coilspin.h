#pragma once
// Test helper: runs the built coilspin binary and captures its exit status,
// stdout and stderr. Every result file a `fit` or `demo` run writes with
// --json is checked against docs/result-format-2.schema.json
// (tests/tools/validate_result.py, python3-jsonschema); a file that does not
// conform fails the test that wrote it.

#include <gtest/gtest.h>
#include <sys/wait.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace coilspin::testing {

struct RunResult {
  int status = -1;
  std::string out;
  std::string err;
};

inline std::string Slurp(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

// The path after " --json " in `arguments` when the command is fit or demo; empty otherwise.
inline std::string ResultFileArgument(const std::string& arguments) {
  if (arguments.rfind("fit", 0) != 0 && arguments.rfind("demo", 0) != 0) return "";
  const std::string flag = " --json ";
  const std::size_t at = arguments.find(flag);
  if (at == std::string::npos) return "";
  const std::size_t start = at + flag.size();
  return arguments.substr(start, arguments.find(' ', start) - start);
}

// Fails the current test when `path` is not a valid format-2 result file.
inline void ExpectValidResultFile(const std::filesystem::path& path) {
  const std::string command = std::string(COILSPIN_PYTHON) + " '" + COILSPIN_TEST_SOURCE_DIR +
                              "/tools/validate_result.py' '" + COILSPIN_TEST_SOURCE_DIR +
                              "/../docs/result-format-2.schema.json' '" + path.string() + "' 2>&1";
  std::string report;
  if (FILE* pipe = popen(command.c_str(), "r")) {
    char buffer[4096];
    while (std::fgets(buffer, sizeof buffer, pipe)) report += buffer;
    const int status = pclose(pipe);
    EXPECT_EQ(status, 0) << "result file does not conform to docs/result-format-2.schema.json:\n" << report;
  } else {
    ADD_FAILURE() << "cannot run " << command;
  }
}

// Runs coilspin in `folder`; `address_space_kib` > 0 limits its address space (ulimit -v).
// status is -1 when coilspin did not exit (a signal).
inline RunResult RunCoilspin(const std::string& arguments, const std::filesystem::path& folder,
                             long address_space_kib = 0) {
  const auto out = folder / "stdout.txt";
  const auto err = folder / "stderr.txt";
  const std::string limit = address_space_kib > 0 ? "ulimit -v " + std::to_string(address_space_kib) + " && " : "";
  const std::string command = "cd '" + folder.string() + "' && " + limit + "exec '" + std::string(COILSPIN_BINARY) +
                              "' " + arguments + " >'" + out.string() + "' 2>'" + err.string() + "' </dev/null";
  const int raw = std::system(command.c_str());
  RunResult r;
  // exec: the shell becomes coilspin, so a signal that ends coilspin ends the shell and shows here.
  r.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  r.out = Slurp(out);
  r.err = Slurp(err);
  const std::string result = ResultFileArgument(arguments);
  if (!result.empty() && (r.status == 0 || r.status == 1) && std::filesystem::exists(folder / result))
    ExpectValidResultFile(folder / result);
  return r;
}

// A fresh folder under the system temp directory, removed with the object.
class ScratchFolder {
 public:
  explicit ScratchFolder(const std::string& name)
      : path_(std::filesystem::temp_directory_path() /
              ("coilspin_cli_" + name + "_" + std::to_string(::getpid()))) {
    std::filesystem::remove_all(path_);
    std::filesystem::create_directories(path_);
  }
  ~ScratchFolder() { std::filesystem::remove_all(path_); }
  const std::filesystem::path& path() const { return path_; }
  std::filesystem::path Write(const std::string& name, const std::string& contents) const {
    std::ofstream(path_ / name, std::ios::binary) << contents;
    return path_ / name;
  }

 private:
  std::filesystem::path path_;
};

}  // namespace coilspin::testing
