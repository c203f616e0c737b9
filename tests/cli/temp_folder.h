// A folder of its own under the system temporary folder, removed with the
// object, for end-to-end tests that write stage and device files.
#ifndef HUSHGAIN_TESTS_CLI_TEMP_FOLDER_H_
#define HUSHGAIN_TESTS_CLI_TEMP_FOLDER_H_

#include <doctest/doctest.h>
#include <stdlib.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>

namespace hushgain::test {

class TempFolder {
 public:
  TempFolder() {
    std::string pattern =
        (std::filesystem::temp_directory_path() / "hushgain-test-XXXXXX")
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

  // Writes `text` to `name` (a relative path; its folders are created).
  void Write(const std::string& name, const std::string& text) const {
    const std::filesystem::path target = path_ / name;
    std::filesystem::create_directories(target.parent_path());
    std::ofstream out(target, std::ios::binary);
    out << text;
  }

  // Every file below the folder (relative path) with its contents.
  std::map<std::string, std::string> Snapshot() const {
    std::map<std::string, std::string> files;
    for (const auto& e : std::filesystem::recursive_directory_iterator(path_)) {
      if (!e.is_regular_file()) continue;
      std::ifstream in(e.path(), std::ios::binary);
      std::ostringstream text;
      text << in.rdbuf();
      files[std::filesystem::relative(e.path(), path_).string()] = text.str();
    }
    return files;
  }

 private:
  std::filesystem::path path_;
};

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_TEMP_FOLDER_H_
