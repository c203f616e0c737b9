// The layout rule of DEVELOPERS.md ("includes only point down"), checked on
// the source tree itself: every `#include "folder/file.h"` in src/ must name
// the including file's own folder or a folder below it.
//   cli -> report -> design / montecarlo -> review -> chain -> budget
//       -> noise / integrate -> analysis -> circuit -> base
// and io (files, JSON, units) is used by cli and report only; io itself
// builds circuit values and may use circuit and base.
// GCC 12 at -O1 with the sanitizers reports a false maybe-uninitialized
// inside std::regex's std::function; -Werror would turn it into a failure.
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <regex>
#include <string>
#include <vector>

namespace hushgain {
namespace {

// Height of each folder in the house; a folder may include lower ones.
// Folders of equal height are rooms side by side and do not include each
// other.
const std::map<std::string, int>& Heights() {
  static const std::map<std::string, int> heights = {
      {"base", 0},      {"circuit", 1},    {"analysis", 2}, {"noise", 3},
      {"integrate", 3}, {"budget", 4},     {"chain", 5},    {"review", 6},
      {"design", 7},    {"montecarlo", 7}, {"report", 8},   {"cli", 9},
  };
  return heights;
}

// Empty when `from` may include a header of `to`; otherwise why not.
std::string CheckArrow(const std::string& from, const std::string& to) {
  if (from == to) return "";
  if (to == "io") {
    if (from == "cli" || from == "report") return "";
    return "only cli and report use io";
  }
  if (from == "io") {
    if (to == "base" || to == "circuit") return "";
    return "io uses only circuit and base";
  }
  const auto& h = Heights();
  const auto f = h.find(from);
  const auto t = h.find(to);
  if (f == h.end()) return "folder " + from + " is not in the layout";
  if (t == h.end()) return "folder " + to + " is not in the layout";
  if (t->second < f->second) return "";
  return t->second == f->second ? "side-by-side folders" : "points up";
}

struct Violation {
  std::string file;
  std::string include;
  std::string why;
};

std::vector<Violation> ScanTree(const std::filesystem::path& src) {
  const std::regex include_line(R"re(^\s*#\s*include\s+"([a-z_]+)/[^"]+")re");
  std::vector<Violation> found;
  for (const auto& entry : std::filesystem::recursive_directory_iterator(src)) {
    if (!entry.is_regular_file()) continue;
    const std::string ext = entry.path().extension().string();
    if (ext != ".h" && ext != ".cpp") continue;
    const std::string from =
        std::filesystem::relative(entry.path(), src).begin()->string();
    std::ifstream in(entry.path());
    std::string line;
    std::smatch m;
    while (std::getline(in, line)) {
      if (!std::regex_search(line, m, include_line)) continue;
      const std::string why = CheckArrow(from, m[1].str());
      if (!why.empty())
        found.push_back(
            {std::filesystem::relative(entry.path(), src).string(), line, why});
    }
  }
  return found;
}

TEST_CASE("the layout rule accepts downward arrows and refuses upward ones") {
  // The rule itself on hand-made arrows, so a broken checker cannot pass
  // the tree vacuously.
  CHECK(CheckArrow("budget", "noise").empty());
  CHECK(CheckArrow("cli", "io").empty());
  CHECK(CheckArrow("report", "design").empty());
  CHECK(CheckArrow("io", "circuit").empty());
  CHECK(CheckArrow("design", "review").empty());
  CHECK(CheckArrow("noise", "budget") == "points up");
  CHECK(CheckArrow("analysis", "noise") == "points up");
  CHECK(CheckArrow("review", "design") == "points up");
  CHECK(CheckArrow("review", "chain").empty());
  CHECK(CheckArrow("chain", "budget").empty());
  CHECK(CheckArrow("chain", "review") == "points up");
  CHECK(CheckArrow("design", "montecarlo") == "side-by-side folders");
  CHECK(CheckArrow("budget", "io") == "only cli and report use io");
  CHECK(CheckArrow("io", "budget") == "io uses only circuit and base");
  CHECK(CheckArrow("gadgets", "base") == "folder gadgets is not in the layout");
}

TEST_CASE("every include in src points down the layout") {
  const std::filesystem::path src =
      std::filesystem::path(HUSHGAIN_SOURCE_DIR) / "src";
  REQUIRE(std::filesystem::is_directory(src));
  const std::vector<Violation> found = ScanTree(src);
  for (const Violation& v : found)
    FAIL_CHECK(v.file << ": " << v.include << " (" << v.why << ")");
  CHECK(found.empty());
}

TEST_CASE("the computing core includes no file or JSON header") {
  // DEVELOPERS.md: the core does no I/O; only io, report and cli touch
  // files, JSON or streams.
  const std::filesystem::path src =
      std::filesystem::path(HUSHGAIN_SOURCE_DIR) / "src";
  const std::regex banned(
      R"re(^\s*#\s*include\s+[<"](iostream|fstream|nlohmann/json\.hpp|nlohmann/json_fwd\.hpp)[>"])re");
  for (const char* room :
       {"base", "circuit", "analysis", "noise", "integrate", "budget", "chain",
        "review", "design", "montecarlo"}) {
    for (const auto& entry :
         std::filesystem::recursive_directory_iterator(src / room)) {
      std::ifstream in(entry.path());
      std::string line;
      while (std::getline(in, line))
        if (std::regex_search(line, banned))
          FAIL_CHECK(entry.path().filename().string() << ": " << line);
    }
  }
}

}  // namespace
}  // namespace hushgain
