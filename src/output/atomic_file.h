#pragma once
// Every output file coilspin writes (result JSON, simulated logs, exports) goes
// through here, so that a file can never be damaged:
//
// - Checked before the work: OutputPathProblem says why a path cannot take an
//   output file (an empty path; an existing target that is not a regular file —
//   a folder, a FIFO, a device, a socket; a folder that does not exist or cannot
//   be written in), so a long fit never ends in "cannot write", and a FIFO or a
//   device node is never replaced by a regular file.
// - Written whole or not at all: the text goes to a hidden temporary file in the
//   same folder (".NAME.tmp-XXXXXX", so it is never taken for the target), is
//   flushed to disk (fsync), renamed over the target (rename is atomic within a
//   folder) and the folder is flushed, so that after a crash or a power cut the
//   target holds the old contents or the new, never a part. A writer killed
//   before the rename leaves the old file untouched (and at most a hidden
//   temporary file).
// - "-" names standard output: the text is written there instead (for
//   `--json -`); nothing is renamed then.
//
// A symbolic link is followed: the file it points to is replaced, the link kept.

#include <cstddef>
#include <functional>
#include <optional>
#include <string>

namespace coilspin::output {

// The path that names standard output.
inline constexpr const char* kStandardOutputPath = "-";

bool IsStandardOutput(const std::string& path);

// Why `path` cannot take an output file (a sentence without the path), or
// nothing when it can. "-" can. Probes the folder by creating and removing a
// hidden temporary file there.
std::optional<std::string> OutputPathProblem(const std::string& path);

// For tests: called by the writer so that a test can stop it at a known point
// (e.g. SIGKILL a child process between writing and renaming).
struct WriteHooks {
  std::function<void(std::size_t bytes_written)> after_chunk;  // after each chunk of kWriteChunkBytes
  std::function<void()> before_rename;                         // written and flushed, not yet renamed
};

// Chunk size of the writer's write(2) calls: large enough to cost nothing,
// small enough that a large file is written in several (common practice).
inline constexpr std::size_t kWriteChunkBytes = 1 << 20;

// Writes `contents` to `path` as described above. Throws std::runtime_error
// naming the path when the file cannot be written (OutputPathProblem's reasons
// included); an existing target is then untouched and no temporary file is left.
void WriteFileAtomically(const std::string& path, const std::string& contents, const WriteHooks& hooks = {});

}  // namespace coilspin::output
