// Helpers for the end-to-end tests of `budget` formats and `plot`: every
// example stage in examples/, a scratch folder per test, and the built
// binary run through RunBinary (cli/run_binary.h: fork and exec, no shell).
#ifndef HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_
#define HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_

#include <unistd.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "cli/run_binary.h"

namespace hushgain::test {

// Every stage file in examples/, by path, sorted.
inline std::vector<std::string> ExamplePaths() {
  std::vector<std::string> out;
  for (const auto& e : std::filesystem::directory_iterator(
           std::filesystem::path(HUSHGAIN_SOURCE_DIR) / "examples"))
    if (e.path().extension() == ".json") out.push_back(e.path().string());
  std::sort(out.begin(), out.end());
  return out;
}

inline std::string ExamplePath(const std::string& name) {
  return std::string(HUSHGAIN_SOURCE_DIR) + "/examples/" + name + ".json";
}

inline std::string Stem(const std::string& path) {
  return std::filesystem::path(path).stem().string();
}

inline std::string ReadAll(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
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
  ScratchDir(const ScratchDir&) = delete;
  ScratchDir& operator=(const ScratchDir&) = delete;

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

// The built binary with `args`; `env` entries ("PATH=...") go through
// /usr/bin/env when given.
inline RunResult RunHushgain(const std::vector<std::string>& args,
                             const std::vector<std::string>& env = {}) {
  if (env.empty()) return RunBinary(HUSHGAIN_BINARY, args);
  std::vector<std::string> all = env;
  all.push_back(HUSHGAIN_BINARY);
  all.insert(all.end(), args.begin(), args.end());
  return RunBinary("/usr/bin/env", all);
}

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_
