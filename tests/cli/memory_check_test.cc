// Refusing a fit the memory cannot hold (src/cli/memory_check.h): the logs'
// sizes times the measured peak per byte of each kind against what is available,
// before any log is read; the message names the largest log and both figures.

#include "src/cli/memory_check.h"

#include <gtest/gtest.h>
#include <sys/resource.h>

#include "cli/run_coilspin.h"
#include "src/ingest/input_error.h"

namespace coilspin::cli {
namespace {

class MemoryCheck : public ::testing::Test {
 protected:
  MemoryCheck() : folder_("memory_check") {}
  std::string Log(const std::string& name, std::size_t bytes) {
    return folder_.Write(name, std::string(bytes, '0')).string();
  }
  testing::ScratchFolder folder_;
};

TEST_F(MemoryCheck, EnoughMemoryPasses) {
  const std::string step = Log("step.csv", 1000000);  // 1 MB: a step fit needs 42 MB
  EXPECT_NO_THROW(RequireMemoryForLogs({{step, TestKind::kStep}}, 42000000));
  EXPECT_NO_THROW(RequireMemoryForLogs({{step, TestKind::kStep}}, std::nullopt));  // unknown: no refusal
}

TEST_F(MemoryCheck, TooLittleNamesTheLargestLogAndBothFigures) {
  const std::string step = Log("step.csv", 2000000);      // 2 MB · 42 = 84 MB
  const std::string no_load = Log("no-load.csv", 500000);  // 0.5 MB · 3 = 1.5 MB
  try {
    RequireMemoryForLogs({{no_load, TestKind::kNoLoad}, {step, TestKind::kStep}}, 50000000);
    FAIL() << "no refusal";
  } catch (const InputError& error) {
    EXPECT_EQ(error.kind(), InputErrorKind::kTooLarge);
    EXPECT_EQ(error.file(), step);
    EXPECT_EQ(error.message(),
              "the largest of 2 logs (2 MB); together they hold 2 MB; fitting needs about 86 MB of memory and 50 MB "
              "are available: fit a shorter span, or a log with fewer samples (every n-th row)");
  }
}

TEST_F(MemoryCheck, AvailableMemoryIsKnownOnLinux) {
  const auto available = AvailableMemoryBytes();  // /proc/meminfo, proc(5)
  ASSERT_TRUE(available.has_value());
  EXPECT_GT(*available, 0u);
}

#if defined(__SANITIZE_ADDRESS__)
#define COILSPIN_ASAN 1
#elif defined(__has_feature)
#if __has_feature(address_sanitizer)
#define COILSPIN_ASAN 1
#endif
#endif

TEST_F(MemoryCheck, AnAddressSpaceLimitIsHonouredEndToEnd) {
#ifdef COILSPIN_ASAN
  GTEST_SKIP() << "AddressSanitizer reserves terabytes of address space and cannot run under ulimit -v";
#endif
  // A 12 MB step log against a 400 MB address space (ulimit -v): refused before it is read,
  // exit 2, the log named; the rows need not even be valid.
  Log("big.csv", 12000000);
  const testing::RunResult r = testing::RunCoilspin("fit --step big.csv", folder_.path());
  ASSERT_EQ(r.status, 2) << r.err;  // without the limit the file is read and refused as not a log
  const testing::RunResult limited =
      testing::RunCoilspin("fit --step big.csv", folder_.path(), /*address_space_kib=*/400000);
  EXPECT_EQ(limited.status, 2);
  EXPECT_NE(limited.err.find("big.csv: the log holds 12 MB; fitting needs about 504 MB of memory and "),
            std::string::npos)
      << limited.err;
}

}  // namespace
}  // namespace coilspin::cli
