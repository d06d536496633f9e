#pragma once
// Opening a log for io::LineReader after checking that it is text (internal to ingest).
//
// The first block is read at once and checked: a file with no bytes is empty;
// a NUL byte or another control byte (below 0x20 other than tab, line feed and
// carriage return, or 0x7F) makes it binary. The block is then handed to the
// line reader with the rest of the file, so the file is opened and read once
// (pipes work too). Line ends reach the reader as LF, whether the file wrote
// LF, CR LF or a lone CR (classic Mac OS); each counts as one line.

#include <cstddef>
#include <memory>
#include <string>

#include "src/ingest/line_reader.h"

namespace coilspin::ingest {

inline constexpr std::size_t kFirstBlockBytes = 64 * 1024;

struct TextFile {
  std::unique_ptr<io::ByteSourceBase> source;  // for io::LineReader
  std::size_t file_bytes = 0;                  // 0 when the size is not known (a pipe)
  std::size_t first_block_bytes = 0;           // bytes in the checked block
  std::size_t first_block_lines = 0;           // line feeds in the checked block
};

// Throws InputError kCannotOpen, kEmptyFile or kBinaryFile.
TextFile OpenTextFile(const std::string& path);

}  // namespace coilspin::ingest
