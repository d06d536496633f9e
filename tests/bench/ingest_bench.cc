// Ingest throughput: writes a bench log of 10^7 rows (time, voltage, current,
// speed) into a temporary folder, reads it with ReadBenchLog, prints rows/s,
// MB/s and the peak resident memory (VmHWM of /proc/self/status), then deletes
// the file. An optional argument gives another row count.

#include <unistd.h>

#include <charconv>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <string>
#include <system_error>
#include <vector>

#include "src/ingest/input_error.h"
#include "src/ingest/read_bench_log.h"

namespace {

constexpr long kDefaultRows = 10'000'000;
constexpr std::size_t kWriteChunkBytes = 1 << 20;
constexpr double kBytesPerMegabyte = 1e6;
constexpr double kSampleInterval_s = 1e-4;  // a 10 kHz logger

void Append(std::string& out, double value, int decimals) {
  char text[32];
  const auto result = std::to_chars(text, text + sizeof text, value, std::chars_format::fixed, decimals);
  out.append(text, result.ptr);
}

// Deterministic, varied values in the ranges a small motor's log holds.
void WriteLog(const std::filesystem::path& path, long rows) {
  std::FILE* file = std::fopen(path.c_str(), "wb");
  if (file == nullptr) throw std::runtime_error("cannot write " + path.string());
  std::string chunk = "# motor: benchmark\ntime [s],voltage [V],current [mA],speed [rpm]\n";
  for (long i = 0; i < rows; ++i) {
    const double wobble = static_cast<double>((i * 7919) % 201 - 100) / 100.0;
    Append(chunk, static_cast<double>(i) * kSampleInterval_s, 4);
    chunk += ',';
    Append(chunk, 12.0 + 0.005 * wobble, 4);
    chunk += ',';
    Append(chunk, 1234.5 + 20.0 * wobble, 2);
    chunk += ',';
    Append(chunk, 3000.0 + 15.0 * wobble, 2);
    chunk += '\n';
    if (chunk.size() >= kWriteChunkBytes) {
      std::fwrite(chunk.data(), 1, chunk.size(), file);
      chunk.clear();
    }
  }
  std::fwrite(chunk.data(), 1, chunk.size(), file);
  if (std::fclose(file) != 0) throw std::runtime_error("cannot finish writing " + path.string());
}

std::string PeakResidentMemory() {
  std::ifstream status("/proc/self/status");
  std::string line;
  while (std::getline(status, line)) {
    if (line.rfind("VmHWM:", 0) == 0) return line.substr(line.find_first_not_of(" \t", 6));
  }
  return "unknown";
}

}  // namespace

int main(int argc, char** argv) {
  const long rows = argc > 1 ? std::atol(argv[1]) : kDefaultRows;
  const std::filesystem::path folder =
      std::filesystem::temp_directory_path() / ("coilspin-ingest-bench-" + std::to_string(getpid()));
  std::filesystem::create_directories(folder);
  const std::filesystem::path path = folder / "bench.csv";
  int status = 0;
  try {
    WriteLog(path, rows);
    const double megabytes = static_cast<double>(std::filesystem::file_size(path)) / kBytesPerMegabyte;
    const auto start = std::chrono::steady_clock::now();
    const coilspin::BenchLog log = coilspin::ReadBenchLog(path.string(), {});
    const std::chrono::duration<double> elapsed = std::chrono::steady_clock::now() - start;
    const double seconds = elapsed.count();
    std::printf("ingest_bench: %zu rows, %.1f MB in %.3f s\n", log.size(), megabytes, seconds);
    std::printf("  %.3g rows/s, %.1f MB/s\n", static_cast<double>(log.size()) / seconds, megabytes / seconds);
    std::printf("  peak resident memory (VmHWM): %s\n", PeakResidentMemory().c_str());
    std::printf("  last speed sample: %.6f rad/s\n", log.speed_rad_s.back());
  } catch (const std::exception& error) {
    std::fprintf(stderr, "ingest_bench: %s\n", error.what());
    status = 1;
  }
  std::error_code ignored;
  std::filesystem::remove_all(folder, ignored);
  return status;
}
