// The output-file helper (src/output/atomic_file.h): what it refuses, and that a
// writer killed at any point leaves the old file intact. The kill tests fork a
// child that writes through the helper and stops at a known point (a hook), so
// the parent can SIGKILL it there: deterministic, no timing involved.
// Source for the promise itself: POSIX rename(2) replaces the target atomically
// within one file system (IEEE Std 1003.1, rename); fsync(2) flushes the file.

#include "src/output/atomic_file.h"

#include <gtest/gtest.h>
#include <signal.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace coilspin::output {
namespace {

namespace fs = std::filesystem;

std::string Slurp(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

class AtomicFile : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::temp_directory_path() / ("coilspin_atomic_" + std::to_string(::getpid()) + "_" +
                                           ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(folder_);
    fs::create_directories(folder_);
  }
  void TearDown() override { fs::remove_all(folder_); }

  // Every entry of the folder, by name.
  std::vector<std::string> Entries() const {
    std::vector<std::string> names;
    for (const auto& entry : fs::directory_iterator(folder_)) names.push_back(entry.path().filename().string());
    std::sort(names.begin(), names.end());
    return names;
  }

  // Forks a child that writes `contents` to `target` and stops where `stop_at` says
  // (it writes a byte to a pipe there and waits); the parent SIGKILLs it at that point.
  void KillWriterAt(const fs::path& target, const std::string& contents, bool mid_write) {
    int ready[2];
    ASSERT_EQ(::pipe(ready), 0);
    const pid_t child = ::fork();
    ASSERT_GE(child, 0);
    if (child == 0) {
      ::close(ready[0]);
      const auto stop = [&] {
        const char byte = 1;
        if (::write(ready[1], &byte, 1) != 1) ::_exit(3);
        for (;;) ::pause();
      };
      WriteHooks hooks;
      if (mid_write) hooks.after_chunk = [&](std::size_t) { stop(); };
      else hooks.before_rename = stop;
      try {
        WriteFileAtomically(target.string(), contents, hooks);
      } catch (...) {
        ::_exit(4);
      }
      ::_exit(5);  // not reached: the hook never returns
    }
    ::close(ready[1]);
    char byte = 0;
    ASSERT_EQ(::read(ready[0], &byte, 1), 1) << "the writer did not reach the stopping point";
    ::close(ready[0]);
    ASSERT_EQ(::kill(child, SIGKILL), 0);
    int status = 0;
    ASSERT_EQ(::waitpid(child, &status, 0), child);
    ASSERT_TRUE(WIFSIGNALED(status) && WTERMSIG(status) == SIGKILL);
  }

  fs::path folder_;
};

TEST_F(AtomicFile, WritesTheContentsAndLeavesNoTemporaryFile) {
  const fs::path target = folder_ / "result.json";
  WriteFileAtomically(target.string(), "{\"a\": 1}\n");
  EXPECT_EQ(Slurp(target), "{\"a\": 1}\n");
  EXPECT_EQ(Entries(), std::vector<std::string>{"result.json"});
}

TEST_F(AtomicFile, ReplacesARegularFileAndKeepsItsMode) {
  const fs::path target = folder_ / "result.json";
  std::ofstream(target) << "old";
  ASSERT_EQ(::chmod(target.c_str(), 0640), 0);
  WriteFileAtomically(target.string(), "new");
  EXPECT_EQ(Slurp(target), "new");
  struct stat seen {};
  ASSERT_EQ(::stat(target.c_str(), &seen), 0);
  EXPECT_EQ(seen.st_mode & 0777, 0640u);
}

TEST_F(AtomicFile, FollowsASymbolicLinkAndKeepsTheLink) {
  const fs::path file = folder_ / "real.json";
  const fs::path link = folder_ / "link.json";
  std::ofstream(file) << "old";
  fs::create_symlink(file, link);
  WriteFileAtomically(link.string(), "new");
  EXPECT_TRUE(fs::is_symlink(link));
  EXPECT_EQ(Slurp(file), "new");
}

TEST_F(AtomicFile, RefusesAFifoAndLeavesIt) {
  const fs::path fifo = folder_ / "pipe.json";
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0644), 0);
  const auto problem = OutputPathProblem(fifo.string());
  ASSERT_TRUE(problem.has_value());
  EXPECT_NE(problem->find("FIFO"), std::string::npos) << *problem;
  EXPECT_THROW(WriteFileAtomically(fifo.string(), "x"), std::runtime_error);
  EXPECT_TRUE(fs::is_fifo(fifo));
  EXPECT_EQ(Entries(), std::vector<std::string>{"pipe.json"});
}

TEST_F(AtomicFile, RefusesADeviceAFolderAndAnEmptyPath) {
  const auto device = OutputPathProblem("/dev/null");
  ASSERT_TRUE(device.has_value());
  EXPECT_NE(device->find("a device"), std::string::npos) << *device;
  const auto folder = OutputPathProblem(folder_.string());
  ASSERT_TRUE(folder.has_value());
  EXPECT_NE(folder->find("a folder"), std::string::npos) << *folder;
  const auto empty = OutputPathProblem("");
  ASSERT_TRUE(empty.has_value());
  EXPECT_NE(empty->find("empty"), std::string::npos) << *empty;
  EXPECT_THROW(WriteFileAtomically("/dev/null", "x"), std::runtime_error);
  EXPECT_THROW(WriteFileAtomically("", "x"), std::runtime_error);
}

TEST_F(AtomicFile, RefusesAMissingFolder) {
  const auto problem = OutputPathProblem((folder_ / "missing" / "result.json").string());
  ASSERT_TRUE(problem.has_value());
  EXPECT_NE(problem->find("does not exist"), std::string::npos) << *problem;
}

TEST_F(AtomicFile, RefusesAFolderItCannotWriteIn) {
  if (::geteuid() == 0) GTEST_SKIP() << "root writes in any folder whatever its mode";
  const fs::path locked = folder_ / "locked";
  fs::create_directories(locked);
  ASSERT_EQ(::chmod(locked.c_str(), 0555), 0);
  const auto problem = OutputPathProblem((locked / "result.json").string());
  ::chmod(locked.c_str(), 0755);
  ASSERT_TRUE(problem.has_value());
  EXPECT_NE(problem->find("cannot create a file"), std::string::npos) << *problem;
}

TEST_F(AtomicFile, StandardOutputTakesTheTextAndNoFile) {
  EXPECT_TRUE(IsStandardOutput("-"));
  EXPECT_FALSE(OutputPathProblem("-").has_value());
  ::testing::internal::CaptureStdout();
  WriteFileAtomically("-", "on stdout\n");
  EXPECT_EQ(::testing::internal::GetCapturedStdout(), "on stdout\n");
}

TEST_F(AtomicFile, AWriterKilledBeforeTheRenameLeavesTheOldFile) {
  const fs::path target = folder_ / "result.json";
  std::ofstream(target) << "old result";
  KillWriterAt(target, std::string(3 * kWriteChunkBytes, 'n'), /*mid_write=*/false);
  EXPECT_EQ(Slurp(target), "old result");
  // What the killed writer leaves is hidden (".result.json.tmp-…"), never the target's name.
  for (const std::string& name : Entries()) {
    if (name == "result.json") continue;
    EXPECT_EQ(name.rfind(".result.json.tmp-", 0), 0u) << name;
  }
}

TEST_F(AtomicFile, AWriterKilledMidWriteLeavesTheOldFile) {
  const fs::path target = folder_ / "result.json";
  std::ofstream(target) << "old result";
  KillWriterAt(target, std::string(3 * kWriteChunkBytes, 'n'), /*mid_write=*/true);
  EXPECT_EQ(Slurp(target), "old result");
  std::size_t hidden = 0;
  for (const std::string& name : Entries()) {
    if (name == "result.json") continue;
    EXPECT_EQ(name.rfind(".result.json.tmp-", 0), 0u) << name;
    EXPECT_EQ(fs::file_size(folder_ / name), kWriteChunkBytes);  // stopped after the first chunk
    ++hidden;
  }
  EXPECT_EQ(hidden, 1u);
}

}  // namespace
}  // namespace coilspin::output
