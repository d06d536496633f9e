#include "src/cli/memory_check.h"

#include <sys/resource.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "src/ingest/input_error.h"

namespace coilspin::cli {
namespace {

constexpr double kBytesPerMegabyte = 1e6;  // SI prefix (NIST SP 811, 4.3); as `ls -l --si` and df -H show
constexpr std::uint64_t kBytesPerKibibyte = 1024;  // /proc/meminfo counts in kB = 1024 bytes (proc(5))

// "185 MB", "7.6 GB".
std::string Size(double bytes) {
  char text[32];
  if (bytes >= 1e3 * kBytesPerMegabyte) {
    std::snprintf(text, sizeof text, "%.1f GB", bytes / (1e3 * kBytesPerMegabyte));
  } else {
    std::snprintf(text, sizeof text, "%.0f MB", bytes / kBytesPerMegabyte);
  }
  return text;
}

// MemAvailable of /proc/meminfo (Linux 3.14+): what can be allocated without swapping.
std::optional<std::uint64_t> SystemAvailable() {
  std::ifstream meminfo("/proc/meminfo");
  std::string key;
  std::uint64_t kibibytes = 0;
  std::string unit;
  while (meminfo >> key >> kibibytes >> unit) {
    if (key == "MemAvailable:") return kibibytes * kBytesPerKibibyte;
  }
  return std::nullopt;
}

std::optional<std::uint64_t> NumberIn(const std::string& path) {
  std::ifstream in(path);
  std::string text;
  if (!(in >> text) || text == "max") return std::nullopt;
  std::istringstream number(text);
  std::uint64_t value = 0;
  if (!(number >> value)) return std::nullopt;
  return value;
}

// A cgroup's memory limit less its use: v2 (memory.max, memory.current), else v1.
std::optional<std::uint64_t> CgroupAvailable() {
  for (const auto& [limit, usage] : {std::pair<const char*, const char*>{"/sys/fs/cgroup/memory.max",
                                                                         "/sys/fs/cgroup/memory.current"},
                                     {"/sys/fs/cgroup/memory/memory.limit_in_bytes",
                                      "/sys/fs/cgroup/memory/memory.usage_in_bytes"}}) {
    const auto max = NumberIn(limit);
    const auto used = NumberIn(usage);
    if (max && used) return *max > *used ? *max - *used : 0;
  }
  return std::nullopt;
}

// The address-space limit (ulimit -v) less this process's size now.
std::optional<std::uint64_t> AddressSpaceAvailable() {
  struct rlimit limit {};
  if (::getrlimit(RLIMIT_AS, &limit) != 0 || limit.rlim_cur == RLIM_INFINITY) return std::nullopt;
  std::ifstream status("/proc/self/status");
  std::string key;
  std::uint64_t kibibytes = 0;
  std::string unit;
  std::uint64_t size = 0;
  while (status >> key) {
    if (key == "VmSize:" && status >> kibibytes >> unit) size = kibibytes * kBytesPerKibibyte;
    status.ignore(1 << 10, '\n');
  }
  const auto cap = static_cast<std::uint64_t>(limit.rlim_cur);
  return cap > size ? cap - size : 0;
}

}  // namespace

double FitBytesPerLogByte(TestKind kind) {
  switch (kind) {
    case TestKind::kStep: return kStepFitBytesPerLogByte;
    case TestKind::kLockedRotor: return kLockedRotorFitBytesPerLogByte;
    case TestKind::kSpinDown: return kSpinDownFitBytesPerLogByte;
    case TestKind::kNoLoad: return kNoLoadFitBytesPerLogByte;
  }
  return kStepFitBytesPerLogByte;  // unreachable: every kind is listed
}

std::optional<std::uint64_t> AvailableMemoryBytes() {
  std::optional<std::uint64_t> least;
  for (const auto& available : {SystemAvailable(), CgroupAvailable(), AddressSpaceAvailable()})
    if (available) least = least ? std::min(*least, *available) : *available;
  return least;
}

void RequireMemoryForLogs(const std::vector<PlannedLog>& logs, std::optional<std::uint64_t> available_bytes) {
  if (!available_bytes || logs.empty()) return;
  double log_bytes = 0.0;
  double needed_bytes = 0.0;
  double largest_bytes = -1.0;
  std::string largest;
  for (const PlannedLog& log : logs) {
    std::error_code error;
    const auto size = static_cast<double>(std::filesystem::file_size(log.path, error));
    if (error) continue;  // a missing log is reported when it is read
    log_bytes += size;
    needed_bytes += size * FitBytesPerLogByte(log.kind);
    if (size > largest_bytes) {
      largest_bytes = size;
      largest = log.path;
    }
  }
  if (needed_bytes <= static_cast<double>(*available_bytes)) return;
  const std::string which = logs.size() == 1 ? "the log holds "
                                             : "the largest of " + std::to_string(logs.size()) + " logs (" +
                                                   Size(largest_bytes) + "); together they hold ";
  throw InputError(InputErrorKind::kTooLarge, largest, 0, 0,
                   which + Size(log_bytes) + "; fitting needs about " + Size(needed_bytes) + " of memory and " +
                       Size(static_cast<double>(*available_bytes)) +
                       " are available: fit a shorter span, or a log with fewer samples (every n-th row)");
}

}  // namespace coilspin::cli
