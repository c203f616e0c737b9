// Running the built hushgain binary from tests: a scratch folder per test,
// the command's exit code, stdout and stderr as text.
#ifndef HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_
#define HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_

#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace hushgain::test {

inline const std::vector<std::string>& ExampleNames() {
  static const std::vector<std::string> names = {
      "hydrophone-preamp", "load-cell-bridge", "thermopile-stage"};
  return names;
}

inline std::string ExamplePath(const std::string& name) {
  return std::string(HUSHGAIN_SOURCE_DIR) + "/examples/" + name + ".json";
}

inline std::string ReadAll(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
}

inline std::string ShellQuote(const std::string& s) {
  std::string out = "'";
  for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

// A fresh empty folder under the system temporary folder, removed on
// destruction.
class ScratchDir {
 public:
  explicit ScratchDir(const std::string& tag) {
    static int counter = 0;
    path_ = std::filesystem::temp_directory_path() /
            ("hushgain-test-" + tag + "-" + std::to_string(::getpid()) + "-" +
             std::to_string(counter++));
    std::filesystem::remove_all(path_);
    std::filesystem::create_directories(path_);
  }
  ~ScratchDir() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  const std::filesystem::path& path() const { return path_; }
  std::string operator/(const std::string& name) const {
    return (path_ / name).string();
  }
  // The names of the files in the folder, sorted.
  std::vector<std::string> Files() const {
    std::vector<std::string> out;
    for (const auto& e : std::filesystem::directory_iterator(path_))
      out.push_back(e.path().filename().string());
    std::sort(out.begin(), out.end());
    return out;
  }

 private:
  std::filesystem::path path_;
};

struct RunResult {
  int exit_code = -1;
  std::string out;
  std::string err;
};

// Runs `HUSHGAIN_BINARY args` through /bin/sh with `env_prefix` (such as
// "PATH=/nowhere") before it; args are already shell-quoted.
inline RunResult RunHushgain(const ScratchDir& dir, const std::string& args,
                             const std::string& env_prefix = "") {
  const std::string out = dir / ".stdout", err = dir / ".stderr";
  const std::string command = env_prefix + " " + ShellQuote(HUSHGAIN_BINARY) +
                              " " + args + " >" + ShellQuote(out) + " 2>" +
                              ShellQuote(err);
  const int status = std::system(command.c_str());
  RunResult r;
  r.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  r.out = ReadAll(out);
  r.err = ReadAll(err);
  std::filesystem::remove(out);
  std::filesystem::remove(err);
  return r;
}

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_
