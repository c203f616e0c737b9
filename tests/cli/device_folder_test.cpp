// Where the device folder is found (src/cli/device_folder.h): the rules in
// their order, checked on folders made for the test, and end to end through
// the built binary (--devices before or after the command, --version).
// GCC 12 at -O1 with the sanitizers reports a false maybe-uninitialized
// inside std::regex's std::function; -Werror would turn it into a failure.
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"

#include "cli/device_folder.h"

#include <doctest/doctest.h>
#include <stdlib.h>

#include <filesystem>
#include <fstream>
#include <regex>
#include <string>

#include "cli/run_binary.h"
#include "cli/temp_folder.h"
#include "io/error.h"

namespace hushgain::test {
namespace {

namespace fs = std::filesystem;

// An installed tree: <root>/bin (the program's folder) and
// <root>/share/hushgain/devices.
struct Tree {
  TempFolder root;
  std::string bin() const { return (root.path() / "bin").string(); }
  std::string installed() const {
    return (root.path() / "share/hushgain/devices").string();
  }
  std::string source() const { return (root.path() / "src/devices").string(); }
  Tree() { fs::create_directories(bin()); }
  void MakeInstalled() const { fs::create_directories(installed()); }
  void MakeSource() const { fs::create_directories(source()); }
  void PointAtSource() const {
    std::ofstream(fs::path(bin()) / kSourceDevicesFile) << source() << "\n";
  }
};

TEST_CASE("device folder: --devices wins over the environment and the tree") {
  Tree tree;
  tree.MakeInstalled();
  const std::string mine = (tree.root.path() / "mine").string();
  fs::create_directories(mine);
  DeviceFolderInputs in;
  in.option = mine;
  in.environment = tree.installed();
  in.program_folder = tree.bin();
  CHECK(LocateDeviceFolder(in) == mine);
}

TEST_CASE(
    "device folder: the environment wins over the folder beside the "
    "program") {
  Tree tree;
  tree.MakeInstalled();
  const std::string mine = (tree.root.path() / "mine").string();
  fs::create_directories(mine);
  DeviceFolderInputs in;
  in.environment = mine;
  in.program_folder = tree.bin();
  CHECK(LocateDeviceFolder(in) == mine);
}

TEST_CASE("device folder: an empty HUSHGAIN_DEVICES counts as unset") {
  Tree tree;
  tree.MakeInstalled();
  DeviceFolderInputs in;
  in.environment = "";
  in.program_folder = tree.bin();
  CHECK(LocateDeviceFolder(in) == tree.installed());
}

TEST_CASE("device folder: the installed folder wins over the source tree") {
  Tree tree;
  tree.MakeInstalled();
  tree.MakeSource();
  tree.PointAtSource();
  DeviceFolderInputs in;
  in.program_folder = tree.bin();
  CHECK(LocateDeviceFolder(in) == tree.installed());
}

TEST_CASE("device folder: an uninstalled build follows the file beside it") {
  Tree tree;
  tree.MakeSource();
  tree.PointAtSource();
  DeviceFolderInputs in;
  in.program_folder = tree.bin();
  CHECK(LocateDeviceFolder(in) == tree.source());
}

TEST_CASE(
    "device folder: a folder given but missing is named with its "
    "origin") {
  DeviceFolderInputs in;
  in.option = "no-such-folder";
  CHECK_THROWS_WITH_AS(LocateDeviceFolder(in),
                       "no-such-folder: device folder not found (given by "
                       "--devices)",
                       Error);
  DeviceFolderInputs env;
  env.environment = "no-such-folder";
  CHECK_THROWS_WITH_AS(LocateDeviceFolder(env),
                       "no-such-folder: device folder not found (given by "
                       "HUSHGAIN_DEVICES)",
                       Error);
}

TEST_CASE("device folder: none found names every place looked at") {
  Tree tree;
  tree.PointAtSource();  // names a source tree that is not there
  DeviceFolderInputs in;
  in.program_folder = tree.bin();
  const std::string expected =
      "command line: device folder not found; looked in " + tree.installed() +
      " (beside the program), " + tree.source() +
      " (the source tree named in " +
      (fs::path(tree.bin()) / kSourceDevicesFile).string() +
      "); give --devices DIR or set HUSHGAIN_DEVICES";
  CHECK_THROWS_WITH_AS(LocateDeviceFolder(in), expected.c_str(), Error);
}

TEST_CASE("--devices stands before or after the command") {
  const std::string stage =
      std::string(HUSHGAIN_SOURCE_DIR) + "/examples/geophone-preamp.json";
  const std::string devices = std::string(HUSHGAIN_SOURCE_DIR) + "/devices";
  const RunResult before =
      RunBinary(HUSHGAIN_BINARY, {"--devices", devices, "budget", stage});
  const RunResult after =
      RunBinary(HUSHGAIN_BINARY, {"budget", stage, "--devices", devices});
  const RunResult tee_after = RunBinary(
      HUSHGAIN_BINARY, {"tee", "sweep", stage, "--devices=no-such-folder"});
  CHECK(before.exit_code == 0);
  CHECK(after.exit_code == 0);
  CHECK(before.out == after.out);
  CHECK(tee_after.exit_code == 2);
  CHECK(tee_after.err ==
        "error: no-such-folder: device folder not found (given by "
        "--devices)\n");
}

TEST_CASE("--version prints the project version and exits 0") {
  const RunResult r = RunBinary(HUSHGAIN_BINARY, {"--version"});
  CHECK(r.exit_code == 0);
  CHECK(r.err.empty());
  // "hushgain 1.2.3" and, from a git checkout, " (git <hash>[-dirty])".
  CHECK(std::regex_match(r.out,
                         std::regex("hushgain [0-9]+\\.[0-9]+\\.[0-9]+"
                                    "( \\(git [0-9a-f]{7,}(-dirty)?\\))?\n")));
}

TEST_CASE("--help shows no folder of the build machine") {
  const RunResult r = RunBinary(HUSHGAIN_BINARY, {"--help"});
  CHECK(r.exit_code == 0);
  CHECK(r.out.find(HUSHGAIN_SOURCE_DIR) == std::string::npos);
  CHECK(r.out.rfind("hushgain: ", 0) == 0);
  CHECK(r.out.find("Usage: hushgain [OPTIONS]") != std::string::npos);
}

}  // namespace
}  // namespace hushgain::test
