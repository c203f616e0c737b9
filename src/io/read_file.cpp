#include "io/read_file.h"

#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "io/error.h"

namespace hushgain {
namespace {

// strerror's text with a lowercase first letter, as every hushgain message:
// "no such file or directory".
std::string LowercaseReason(int error_number) {
  std::string why = std::strerror(error_number);
  if (!why.empty() && why[0] >= 'A' && why[0] <= 'Z') why[0] += 'a' - 'A';
  return why;
}

}  // namespace

std::string ReadTextFile(const std::string& path) {
  // An ifstream opens a folder without complaint and reads nothing from
  // it, which would pass for an empty (malformed) file.
  std::error_code ignored;
  if (std::filesystem::is_directory(path, ignored))
    throw Error(path, "", "cannot read: " + LowercaseReason(EISDIR));
  std::ifstream in(path, std::ios::binary);
  if (!in) throw Error(path, "", "cannot read: " + LowercaseReason(errno));
  std::ostringstream out;
  out << in.rdbuf();
  if (in.bad()) throw Error(path, "", "cannot read");
  return out.str();
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
