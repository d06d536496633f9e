#include "src/output/atomic_file.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <stdexcept>
#include <vector>

namespace coilspin::output {
namespace {

namespace fs = std::filesystem;

// What an existing target must be; the reason it cannot be replaced otherwise.
std::optional<std::string> TypeProblem(const struct stat& target) {
  if (S_ISREG(target.st_mode)) return std::nullopt;
  const char* what = "not a regular file";
  if (S_ISDIR(target.st_mode)) what = "a folder";
  if (S_ISFIFO(target.st_mode)) what = "a FIFO (named pipe)";
  if (S_ISCHR(target.st_mode) || S_ISBLK(target.st_mode)) what = "a device";
  if (S_ISSOCK(target.st_mode)) what = "a socket";
  return std::string("it is ") + what +
         ", not a regular file; coilspin replaces only regular files (give a file name, or - for standard output)";
}

// The file a path names: a symbolic link's target, else the path itself.
struct Target {
  fs::path file;
  fs::path folder;
  bool exists = false;
  mode_t mode = 0;
};

// The target of `path`, or the reason it cannot take an output file (the folder not probed).
std::optional<std::string> Resolve(const std::string& path, Target* target) {
  if (path.empty()) return "the output path is empty; give a file name (or - for standard output)";
  struct stat seen {};
  if (::stat(path.c_str(), &seen) == 0) {
    if (auto problem = TypeProblem(seen)) return problem;
    std::error_code error;
    target->file = fs::canonical(path, error);
    if (error) return "cannot resolve the path: " + error.message();
    target->exists = true;
    target->mode = seen.st_mode & 07777;
  } else if (errno != ENOENT) {
    return std::string("cannot use the path: ") + std::strerror(errno);
  } else {
    struct stat link {};
    if (::lstat(path.c_str(), &link) == 0) return "it is a symbolic link to nothing; remove it or give another name";
    target->file = fs::path(path);
  }
  if (target->file.filename().empty()) return "the path names a folder, not a file";
  target->folder = target->file.parent_path();
  if (target->folder.empty()) target->folder = ".";
  struct stat folder {};
  if (::stat(target->folder.c_str(), &folder) != 0) {
    if (errno == ENOENT) return "the folder '" + target->folder.string() + "' does not exist";
    return "cannot use the folder '" + target->folder.string() + "': " + std::strerror(errno);
  }
  if (!S_ISDIR(folder.st_mode)) return "'" + target->folder.string() + "' is not a folder";
  return std::nullopt;
}

// A new hidden file beside the target, ".NAME.tmp-XXXXXX"; -1 with errno set when it cannot be made.
int MakeTemporary(const Target& target, std::string* name) {
  *name = (target.folder / ("." + target.file.filename().string() + ".tmp-XXXXXX")).string();
  std::vector<char> pattern(name->begin(), name->end());
  pattern.push_back('\0');
  const int fd = ::mkstemp(pattern.data());
  *name = pattern.data();
  return fd;
}

bool WriteAll(int fd, const std::string& contents, const WriteHooks& hooks) {
  std::size_t done = 0;
  while (done < contents.size()) {
    const std::size_t chunk = std::min(kWriteChunkBytes, contents.size() - done);
    std::size_t chunk_done = 0;
    while (chunk_done < chunk) {
      const ssize_t written = ::write(fd, contents.data() + done + chunk_done, chunk - chunk_done);
      if (written < 0) {
        if (errno == EINTR) continue;
        return false;
      }
      chunk_done += static_cast<std::size_t>(written);
    }
    done += chunk;
    if (hooks.after_chunk) hooks.after_chunk(done);
  }
  return true;
}

// Makes the rename durable. Some file systems cannot flush a folder; the file
// itself is flushed already, so that is not an error.
void FlushFolder(const fs::path& folder) {
  const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

[[noreturn]] void Fail(const std::string& path, const std::string& why) {
  throw std::runtime_error("cannot write " + path + ": " + why);
}

void WriteStandardOutput(const std::string& contents) {
  std::fflush(stdout);
  const bool ok = std::fwrite(contents.data(), 1, contents.size(), stdout) == contents.size() &&
                  std::fflush(stdout) == 0;
  if (!ok) throw std::runtime_error(std::string("cannot write to standard output: ") + std::strerror(errno));
}

}  // namespace

bool IsStandardOutput(const std::string& path) { return path == kStandardOutputPath; }

std::optional<std::string> OutputPathProblem(const std::string& path) {
  if (IsStandardOutput(path)) return std::nullopt;
  Target target;
  if (auto problem = Resolve(path, &target)) return problem;
  std::string probe;
  const int fd = MakeTemporary(target, &probe);
  if (fd < 0) return "cannot create a file in the folder '" + target.folder.string() + "': " + std::strerror(errno);
  ::close(fd);
  ::unlink(probe.c_str());
  return std::nullopt;
}

void WriteFileAtomically(const std::string& path, const std::string& contents, const WriteHooks& hooks) {
  if (IsStandardOutput(path)) return WriteStandardOutput(contents);
  Target target;
  if (auto problem = Resolve(path, &target)) Fail(path, *problem);
  std::string temporary;
  const int fd = MakeTemporary(target, &temporary);
  if (fd < 0) Fail(path, "cannot create a file in the folder '" + target.folder.string() + "': " + std::strerror(errno));
  // mkstemp creates the file 0600: keep the replaced file's mode, else what an
  // ordinary new file gets (0666 less the umask).
  mode_t mode = target.mode;
  if (!target.exists) {
    const mode_t mask = ::umask(0);
    ::umask(mask);
    mode = 0666 & ~mask;
  }
  ::fchmod(fd, mode);
  int error = 0;
  const auto failed = [&error](bool step_ok) {
    if (!step_ok && error == 0) error = errno;
    return !step_ok;
  };
  bool ok = !failed(WriteAll(fd, contents, hooks));
  ok = !failed(::fsync(fd) == 0) && ok;
  ok = !failed(::close(fd) == 0) && ok;
  if (ok && hooks.before_rename) hooks.before_rename();
  // The target may have changed since it was checked (another process made a FIFO there).
  Target now;
  const std::optional<std::string> problem = ok ? Resolve(path, &now) : std::nullopt;
  if (ok && !problem) ok = !failed(std::rename(temporary.c_str(), target.file.c_str()) == 0);
  if (problem || !ok) {
    ::unlink(temporary.c_str());
    Fail(path, problem ? *problem : std::string(std::strerror(error)));
  }
  FlushFolder(target.folder);
}

}  // namespace coilspin::output
