#include "io/read_file.h"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "io/error.h"

namespace hushgain {
namespace {

// Reads `fd` to its end, refusing more than kMaxInputBytes.
std::string ReadBounded(int fd, const std::string& source) {
  std::string text;
  char buffer[65536];
  for (;;) {
    const ssize_t n = ::read(fd, buffer, sizeof buffer);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0)
      throw Error(source, "", "cannot read: " + LowercaseReason(errno));
    if (n == 0) return text;
    if (text.size() + static_cast<std::size_t>(n) > kMaxInputBytes)
      throw Error(source, "",
                  "larger than " + std::to_string(kMaxInputBytes >> 20) +
                      " MiB, the limit of an input file");
    text.append(buffer, static_cast<std::size_t>(n));
  }
}

}  // namespace

std::string LowercaseReason(int error_number) {
  std::string why = std::strerror(error_number);
  if (!why.empty() && why[0] >= 'A' && why[0] <= 'Z') why[0] += 'a' - 'A';
  return why;
}

std::string ReadTextFile(const std::string& path) {
  // A folder opens without complaint on some systems; say what it is.
  std::error_code ignored;
  if (std::filesystem::is_directory(path, ignored))
    throw Error(path, "", "cannot read: " + LowercaseReason(EISDIR));
  const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) throw Error(path, "", "cannot read: " + LowercaseReason(errno));
  try {
    std::string text = ReadBounded(fd, path);
    ::close(fd);
    return text;
  } catch (...) {
    ::close(fd);
    throw;
  }
}

std::string ReadStandardInput(const std::string& source) {
  return ReadBounded(STDIN_FILENO, source);
}

void WriteFileAtomically(const std::string& path, const std::string& contents) {
  const std::string temporary = path + ".tmp-" + std::to_string(::getpid());
  {
    std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
    if (!out) throw Error(path, "", "cannot write: " + LowercaseReason(errno));
    out << contents;
    out.flush();
    if (!out) {
      std::remove(temporary.c_str());
      throw Error(path, "", "cannot write");
    }
  }
  if (std::rename(temporary.c_str(), path.c_str()) != 0) {
    std::string why = LowercaseReason(errno);
    std::remove(temporary.c_str());
    throw Error(path, "", "cannot write: " + why);
  }
}

}  // namespace hushgain
