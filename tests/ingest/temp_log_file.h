#pragma once
// A temporary folder for the bench logs a test writes; removed with the test.

#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <string>

namespace coilspin::testing {

class TempLogFolder {
 public:
  TempLogFolder() {
    const ::testing::TestInfo* test = ::testing::UnitTest::GetInstance()->current_test_info();
    std::string name = "coilspin-" + std::to_string(getpid());
    if (test != nullptr) name += std::string("-") + test->test_suite_name() + "-" + test->name();
    for (char& c : name) {
      if (c == '/') c = '_';
    }
    folder_ = std::filesystem::temp_directory_path() / name;
    std::filesystem::create_directories(folder_);
  }
  ~TempLogFolder() {
    std::error_code ignored;
    std::filesystem::remove_all(folder_, ignored);
  }
  TempLogFolder(const TempLogFolder&) = delete;
  TempLogFolder& operator=(const TempLogFolder&) = delete;

  // Writes `content` byte for byte and returns the file's path.
  std::string Write(const std::string& file_name, const std::string& content) const {
    const std::filesystem::path path = folder_ / file_name;
    std::ofstream out(path, std::ios::binary);
    out << content;
    return path.string();
  }

  std::string PathOf(const std::string& file_name) const { return (folder_ / file_name).string(); }

 private:
  std::filesystem::path folder_;
};

}  // namespace coilspin::testing
