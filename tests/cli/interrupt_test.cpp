// Ctrl-C, any number of times (issue 12, defect 9). Before this check the
// first SIGINT set spread's stop flag and put back the default handling, so
// a second one while the workers wound down killed the program by the
// signal: no message, and no documented exit code. Now every further
// SIGINT only sets the flag again: the run ends with exit 130, its one
// line, and no file written (README, "Exit codes").
#include <doctest/doctest.h>
#include <signal.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

namespace fs = std::filesystem;
using test::RunningBinary;
using test::RunResult;
using test::TempFolder;

// Linux, man 5 proc: /proc/PID/stat's third field is the state ('Z' a
// zombie: it has exited and waits to be reaped).
bool Running(int pid) {
  std::ifstream in("/proc/" + std::to_string(pid) + "/stat");
  std::string text((std::istreambuf_iterator<char>(in)),
                   std::istreambuf_iterator<char>());
  const std::size_t close = text.rfind(')');
  return close != std::string::npos && close + 2 < text.size() &&
         text[close + 2] != 'Z' && text[close + 2] != 'X';
}

// Whether the program `binary` runs as `pid` (it has been exec'd) and has
// its own SIGINT handler installed: /proc/PID/status, "SigCgt:", a hex mask
// in which signal n is bit n - 1 (man 5 proc).
bool CatchesSigint(int pid, const std::string& binary) {
  const std::string proc = "/proc/" + std::to_string(pid);
  std::error_code ec;
  if (fs::read_symlink(proc + "/exe", ec) != fs::canonical(binary))
    return false;
  std::ifstream in(proc + "/status");
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("SigCgt:", 0) != 0) continue;
    const unsigned long long mask =
        std::stoull(line.substr(line.find_first_not_of(" \t", 7)), nullptr, 16);
    return (mask >> (SIGINT - 1)) & 1;
  }
  return false;
}

TEST_CASE(
    "any number of ctrl-c during spread ends with exit 130 and no files") {
  TempFolder dir("interrupt");
  const std::string stage =
      dir.Write("s.json", test::ReadAll(test::ExamplePath("load-cell-bridge")))
          .string();
  // Enough samples that the run is still going when the signals come.
  const RunningBinary child = test::StartBinary(
      HUSHGAIN_BINARY, {"spread", stage, "--samples", "400000", "--csv",
                        dir / "samples.csv", "--plot", dir / "h.png"});
  REQUIRE(child.pid > 0);
  // The first Ctrl-C must reach spread's handler, not the default handling
  // of a program still starting. (A generous bound, so a broken binary
  // cannot hang the suite; no speed is asserted.)
  const auto give_up =
      std::chrono::steady_clock::now() + std::chrono::minutes(2);
  while (Running(child.pid) && !CatchesSigint(child.pid, HUSHGAIN_BINARY) &&
         std::chrono::steady_clock::now() < give_up)
    std::this_thread::sleep_for(std::chrono::microseconds(200));
  REQUIRE(CatchesSigint(child.pid, HUSHGAIN_BINARY));

  // Ctrl-C, then again and again while it winds down, until it has ended.
  int while_running = 0;
  while (Running(child.pid)) {
    ::kill(child.pid, SIGINT);
    ++while_running;
    std::this_thread::sleep_for(std::chrono::microseconds(200));
  }
  const RunResult r = test::WaitBinary(child);
  CAPTURE(while_running);
  CAPTURE(r.err);
  // More than one SIGINT reached the running program.
  CHECK(while_running >= 2);
  CHECK(r.signal == 0);
  CHECK(r.exit_code == 130);
  CHECK(r.out.empty());
  const std::string message =
      "interrupted: no report, no CSV and no picture written\n";
  CHECK(r.err.ends_with(message));
  CHECK(r.err.find("interrupted:") == r.err.rfind("interrupted:"));
  CHECK(dir.Files() == std::vector<std::string>{"s.json"});
}

}  // namespace
}  // namespace hushgain
