// The fuzz corpus as regression tests: every file under
// tests/fuzz/corpus/<target>/ goes through the same entry point its fuzzer
// runs (tests/fuzz/fuzz_entry_points.h), so a fixed finding stays fixed in
// every build, with or without clang and the sanitizers.
#include <doctest/doctest.h>

#include <algorithm>
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include "fuzz/fuzz_entry_points.h"

namespace hushgain::test {
namespace {

namespace fs = std::filesystem;

using EntryPoint = std::string (*)(const std::uint8_t*, std::size_t);

std::vector<fs::path> CorpusFiles(const std::string& target) {
  std::vector<fs::path> files;
  const fs::path dir =
      fs::path(HUSHGAIN_SOURCE_DIR) / "tests" / "fuzz" / "corpus" / target;
  for (const fs::directory_entry& e : fs::directory_iterator(dir))
    if (e.is_regular_file()) files.push_back(e.path());
  std::sort(files.begin(), files.end());
  return files;
}

// Returns how many files ran; each must keep the contract.
std::size_t RunCorpus(const std::string& target, EntryPoint entry) {
  const std::vector<fs::path> files = CorpusFiles(target);
  for (const fs::path& file : files) {
    CAPTURE(file);
    std::ifstream in(file, std::ios::binary);
    const std::vector<char> bytes((std::istreambuf_iterator<char>(in)),
                                  std::istreambuf_iterator<char>());
    const std::string finding = entry(
        reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size());
    CHECK_MESSAGE(finding.empty(), finding);
  }
  return files.size();
}

}  // namespace

TEST_CASE("every quantity corpus file keeps the ParseQuantity contract") {
  CHECK(RunCorpus("quantity", hushgain::fuzz::FuzzQuantity) >= 10);
}

TEST_CASE("every stage corpus file keeps the ParseStage contract") {
  CHECK(RunCorpus("stage", hushgain::fuzz::FuzzStage) >= 10);
}

TEST_CASE("every device corpus file keeps the device parsers' contract") {
  CHECK(RunCorpus("device", hushgain::fuzz::FuzzDevice) >= 10);
}

TEST_CASE("every command-line corpus file keeps the command line's contract") {
  CHECK(RunCorpus("cli", hushgain::fuzz::FuzzCli) >= 10);
}

TEST_CASE("a good quantity and empty input pass the fuzz entry points") {
  const std::string good(
      "\x00"
      "4k7",
      4);  // kind 0: a resistance
  CHECK(hushgain::fuzz::FuzzQuantity(
            reinterpret_cast<const std::uint8_t*>(good.data()), good.size()) ==
        "");
  CHECK(hushgain::fuzz::FuzzStage(nullptr, 0) == "");
  CHECK(hushgain::fuzz::FuzzDevice(nullptr, 0) == "");
  CHECK(hushgain::fuzz::FuzzCli(nullptr, 0) == "");
}

}  // namespace hushgain::test
