#include "src/ingest/text_file.h"

#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <utility>
#include <vector>

#include "src/ingest/input_error.h"

namespace coilspin::ingest {
namespace {

struct FileCloser {
  void operator()(std::FILE* file) const { std::fclose(file); }
};
using FileHandle = std::unique_ptr<std::FILE, FileCloser>;

// Serves the checked first block, then the rest of the file, with every line
// end made a line feed: CR LF (Windows) and a lone CR (classic Mac OS) become LF,
// so that io::LineReader, which splits at LF only, sees every line.
class CheckedFileSource : public io::ByteSourceBase {
 public:
  CheckedFileSource(std::string path, FileHandle file, std::vector<char> first_block)
      : path_(std::move(path)), file_(std::move(file)), first_block_(std::move(first_block)) {}

  // io::LineReader takes a short read for the end of the file, so the buffer is
  // filled unless the file ends, however many line feeds of CR LF pairs were dropped.
  // At the end the byte after the data is made NUL: when the last line has no line
  // end, the line reader looks one byte past the data, and a stale '\n' there (its
  // buffer is not cleared) made it take the rest of the buffer for a line and read
  // past its end (found by fuzzing, docs/fuzzing.md).
  int read(char* buffer, int size) override {
    const std::size_t wanted = static_cast<std::size_t>(size);
    std::size_t produced = 0;
    while (produced < wanted) {
      const std::size_t asked = wanted - produced;
      const std::size_t got = ReadRaw(buffer + produced, asked);
      produced += NormaliseLineEnds(buffer + produced, got);
      if (got < asked) break;  // the end of the file
    }
    if (produced < wanted) buffer[produced] = '\0';
    return static_cast<int>(produced);
  }

 private:
  std::size_t ReadRaw(char* buffer, std::size_t wanted) {
    std::size_t copied = 0;
    if (served_ < first_block_.size()) {
      copied = std::min(wanted, first_block_.size() - served_);
      std::memcpy(buffer, first_block_.data() + served_, copied);
      served_ += copied;
    }
    if (copied < wanted) copied += ReadFile(buffer + copied, wanted - copied);
    return copied;
  }

  // CR → LF, and the LF of a CR LF pair dropped (it may come in the next chunk); in place, returns the new length.
  std::size_t NormaliseLineEnds(char* bytes, std::size_t count) {
    if (!after_cr_ && std::memchr(bytes, '\r', count) == nullptr) return count;
    std::size_t kept = 0;
    for (std::size_t i = 0; i < count; ++i) {
      const char byte = bytes[i];
      if (byte == '\n' && after_cr_) {
        after_cr_ = false;
        continue;
      }
      after_cr_ = byte == '\r';
      bytes[kept++] = after_cr_ ? '\n' : byte;
    }
    return kept;
  }

  std::size_t ReadFile(char* buffer, std::size_t size) {
    const std::size_t got = std::fread(buffer, 1, size, file_.get());
    if (got < size && std::ferror(file_.get())) {
      throw InputError(InputErrorKind::kCannotOpen, path_, 0, 0,
                       std::string("read error: ") + std::strerror(errno));
    }
    return got;
  }

  std::string path_;
  FileHandle file_;
  std::vector<char> first_block_;
  std::size_t served_ = 0;
  bool after_cr_ = false;  // the last byte served was a CR turned into LF
};

// Line ends in a block: LF, CR LF and a lone CR each count once.
std::size_t CountLineEnds(const std::vector<char>& block) {
  std::size_t ends = 0;
  for (std::size_t i = 0; i < block.size(); ++i) {
    if (block[i] == '\n' && (i == 0 || block[i - 1] != '\r')) ++ends;
    if (block[i] == '\r') ++ends;
  }
  return ends;
}

bool IsTextByte(unsigned char byte) {
  constexpr unsigned char kDelete = 0x7F;
  constexpr unsigned char kFirstPrintable = 0x20;
  if (byte == '\t' || byte == '\n' || byte == '\r') return true;
  return byte >= kFirstPrintable && byte != kDelete;
}

bool StartsWithUtf16Mark(const std::vector<char>& block) {
  if (block.size() < 2) return false;
  const auto first = static_cast<unsigned char>(block[0]);
  const auto second = static_cast<unsigned char>(block[1]);
  return (first == 0xFF && second == 0xFE) || (first == 0xFE && second == 0xFF);
}

void CheckIsText(const std::string& path, const std::vector<char>& block) {
  long line = 1;
  for (std::size_t i = 0; i < block.size(); ++i) {
    const auto byte = static_cast<unsigned char>(block[i]);
    if ((byte == '\n' && (i == 0 || block[i - 1] != '\r')) || byte == '\r') ++line;
    if (IsTextByte(byte)) continue;
    char code[8];
    std::snprintf(code, sizeof code, "0x%02X", static_cast<unsigned>(byte));
    std::string message = std::string("not a text file: byte ") + code + " at offset " + std::to_string(i) +
                          "; expected a CSV bench log";
    if (StartsWithUtf16Mark(block)) message += " (this looks like UTF-16; save it as UTF-8)";
    throw InputError(InputErrorKind::kBinaryFile, path, line, 0, message);
  }
}

}  // namespace

TextFile OpenTextFile(const std::string& path) {
  FileHandle file(std::fopen(path.c_str(), "rb"));
  if (!file) {
    throw InputError(InputErrorKind::kCannotOpen, path, 0, 0,
                     std::string("cannot open: ") + std::strerror(errno));
  }
  // The first block, or the whole file when it is shorter (no 64 KiB cleared for a short log).
  std::error_code size_error;
  const auto size = std::filesystem::file_size(path, size_error);
  const std::size_t file_bytes = size_error ? 0 : static_cast<std::size_t>(size);
  std::vector<char> block(file_bytes > 0 ? std::min(kFirstBlockBytes, file_bytes + 1) : kFirstBlockBytes);
  const std::size_t got = std::fread(block.data(), 1, block.size(), file.get());
  if (got < block.size() && std::ferror(file.get())) {
    throw InputError(InputErrorKind::kCannotOpen, path, 0, 0,
                     std::string("cannot read: ") + std::strerror(errno));
  }
  block.resize(got);
  if (block.empty()) {
    throw InputError(InputErrorKind::kEmptyFile, path, 0, 0,
                     "the file is empty; expected a header row and data rows");
  }
  CheckIsText(path, block);

  TextFile text;
  text.file_bytes = file_bytes;
  text.first_block_bytes = block.size();
  text.first_block_lines = CountLineEnds(block);
  text.source = std::make_unique<CheckedFileSource>(path, std::move(file), std::move(block));
  return text;
}

}  // namespace coilspin::ingest
