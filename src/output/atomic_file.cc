#include "src/output/atomic_file.h"

#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <stdexcept>
#include <vector>

namespace coilspin::output {

void WriteFileAtomically(const std::string& path, const std::string& contents) {
  std::string pattern = path + ".tmp-XXXXXX";
  std::vector<char> name(pattern.begin(), pattern.end());
  name.push_back('\0');
  const int fd = ::mkstemp(name.data());
  if (fd < 0) throw std::runtime_error("cannot write " + path + ": " + std::strerror(errno));
  // mkstemp creates the file 0600; give it what an ordinary new file gets (0666 less the umask).
  const mode_t mask = ::umask(0);
  ::umask(mask);
  ::fchmod(fd, 0666 & ~mask);
  const char* data = contents.data();
  std::size_t left = contents.size();
  bool ok = true;
  while (left > 0 && ok) {
    const ssize_t written = ::write(fd, data, left);
    if (written < 0) {
      if (errno == EINTR) continue;
      ok = false;
    } else {
      data += written;
      left -= static_cast<std::size_t>(written);
    }
  }
  const int saved_errno = errno;
  ok = ok && ::fsync(fd) == 0;
  ok = (::close(fd) == 0) && ok;
  if (!ok || std::rename(name.data(), path.c_str()) != 0) {
    const int error = ok ? errno : saved_errno;
    std::remove(name.data());
    throw std::runtime_error("cannot write " + path + ": " + std::strerror(error));
  }
}

}  // namespace coilspin::output
