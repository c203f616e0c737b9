// A folder of its own under the system temporary folder, removed with the
// object: the one scratch folder of the end-to-end tests (stage and device
// files they write, outputs of the binary).
#ifndef HUSHGAIN_TESTS_CLI_TEMP_FOLDER_H_
#define HUSHGAIN_TESTS_CLI_TEMP_FOLDER_H_

#include <doctest/doctest.h>
#include <stdlib.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <map>
#include <string>
#include <vector>

#include "cli/run_binary.h"

namespace hushgain::test {

class TempFolder {
 public:
  // `tag` only names the folder ("hushgain-test-TAG-XXXXXX") for a reader
  // of /tmp after a crash.
  explicit TempFolder(const std::string& tag = "") {
    std::string pattern =
        (std::filesystem::temp_directory_path() /
         ("hushgain-test-" + (tag.empty() ? "" : tag + "-") + "XXXXXX"))
            .string();
    REQUIRE(::mkdtemp(pattern.data()) != nullptr);
    path_ = pattern;
  }
  ~TempFolder() {
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  TempFolder(const TempFolder&) = delete;
  TempFolder& operator=(const TempFolder&) = delete;

  const std::filesystem::path& path() const { return path_; }

  // The path of `name` in the folder, as text for an argument vector.
  std::string operator/(const std::string& name) const {
    return (path_ / name).string();
  }

  // Writes `text` to `name` (a relative path; its folders are created) and
  // returns its path.
  std::filesystem::path Write(const std::string& name,
                              const std::string& text) const {
    const std::filesystem::path target = path_ / name;
    std::filesystem::create_directories(target.parent_path());
    std::ofstream out(target, std::ios::binary);
    out << text;
    return target;
  }

  // The names of the files directly in the folder, sorted.
  std::vector<std::string> Files() const {
    std::vector<std::string> out;
    for (const auto& e : std::filesystem::directory_iterator(path_))
      out.push_back(e.path().filename().string());
    std::sort(out.begin(), out.end());
    return out;
  }

  // Every file below the folder (relative path) with its contents.
  std::map<std::string, std::string> Snapshot() const {
    std::map<std::string, std::string> files;
    for (const auto& e : std::filesystem::recursive_directory_iterator(path_)) {
      if (!e.is_regular_file()) continue;
      files[std::filesystem::relative(e.path(), path_).string()] =
          ReadAll(e.path());
    }
    return files;
  }

 private:
  std::filesystem::path path_;
};

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_TEMP_FOLDER_H_
