// Every file a command writes, end to end (issue 12, defects 2, 3 and 4;
// issue 18, streams). Before these checks `plot -o y.png --script
// nodir/s.gp` exited 2 but had replaced y.png; `--spectrum s.json`
// overwrote the stage file it read; `-o x.png --script x.png` left a script
// in the PNG; `--spectrum ""` exited 0 writing nothing; `--spectrum -`
// wrote a file named "-"; a symbolic link was replaced by a regular file;
// and on a full disk `plot -o` replaced the old picture with a PNG missing
// its end, with exit 0. README, "Output files", states the rules tested
// here.
#include <doctest/doctest.h>
#include <sys/mount.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <string>
#include <thread>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

namespace fs = std::filesystem;
using test::ExamplePath;
using test::ReadAll;
using test::RunBinary;
using test::RunResult;
using test::TempFolder;

const std::string kExample = "load-cell-bridge";

RunResult Run(const std::vector<std::string>& args) {
  return RunBinary(HUSHGAIN_BINARY, args);
}

// A copy of the example in `dir`, as the stage file the command reads.
std::string CopyStage(const TempFolder& dir) {
  return dir.Write("s.json", ReadAll(ExamplePath(kExample))).string();
}

// No "<name>.tmp-<pid>" is left anywhere in `dir`.
void CheckNoTemporaries(const TempFolder& dir) {
  for (const auto& e : fs::recursive_directory_iterator(dir.path()))
    CHECK_MESSAGE(
        e.path().filename().string().find(".tmp-") == std::string::npos,
        e.path());
}

TEST_CASE("a failed plot keeps the old picture when the script has nowhere") {
  TempFolder dir("out-nodir");
  const std::string stage = CopyStage(dir);
  const std::string png = dir / "y.png";
  REQUIRE(Run({"plot", stage, "-o", png}).exit_code == 0);
  const std::string before = ReadAll(png);
  const std::string script = dir / "nodir/s.gp";
  const RunResult r = Run({"plot", stage, "-o", png, "--script", script});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + script + ": cannot write: no such folder\n");
  CHECK(ReadAll(png) == before);
  CHECK(dir.Files() == std::vector<std::string>{"s.json", "y.png"});
}

TEST_CASE("an output that is the stage file is refused and the file kept") {
  TempFolder dir("out-input");
  const std::string stage = CopyStage(dir);
  const std::string text = ReadAll(stage);
  // The same file under other names: a relative path through "..", a
  // symbolic link and a hard link (same device and inode).
  fs::create_symlink(stage, dir.path() / "link.json");
  fs::create_hard_link(stage, dir.path() / "hard.json");
  const std::string dotted =
      (dir.path() / ".." / dir.path().filename() / "s.json").string();
  struct Case {
    std::vector<std::string> args;
    std::string option, output;
  };
  const std::vector<Case> cases = {
      {{"budget", stage, "--spectrum", stage}, "--spectrum", stage},
      {{"budget", stage, "--spectrum", dotted}, "--spectrum", dotted},
      {{"budget", stage, "--spectrum", dir / "link.json"},
       "--spectrum",
       dir / "link.json"},
      {{"budget", stage, "--spectrum", dir / "hard.json"},
       "--spectrum",
       dir / "hard.json"},
      {{"spread", stage, "--samples", "10", "--csv", stage}, "--csv", stage},
      {{"plot", stage, "-o", dir / "p.png", "--script", stage},
       "--script",
       stage},
  };
  for (const Case& c : cases) {
    CAPTURE(c.output);
    const RunResult r = Run(c.args);
    CHECK(r.exit_code == 2);
    CHECK(r.err == "error: command line: " + c.option + ": \"" + c.output +
                       "\" is the same file as the stage file \"" + stage +
                       "\"\n");
    CHECK(r.out.empty());
    CHECK(ReadAll(stage) == text);
  }
  // A stage read from standard input is protected too.
  const RunResult piped = RunBinary(
      HUSHGAIN_BINARY, {"budget", "-", "--spectrum", stage}, "", stage);
  CHECK(piped.exit_code == 2);
  CHECK(piped.err == "error: command line: --spectrum: \"" + stage +
                         "\" is the same file as the stage file \"-\"\n");
  CHECK(ReadAll(stage) == text);
  CHECK(dir.Files() ==
        std::vector<std::string>{"hard.json", "link.json", "s.json"});
}

TEST_CASE("an output that is a device file is refused") {
  TempFolder dir("out-device");
  fs::copy(fs::path(HUSHGAIN_SOURCE_DIR) / "devices", dir.path() / "devices",
           fs::copy_options::recursive);
  const std::string device = dir / "devices/opamps/zero-drift.json";
  const std::string text = ReadAll(device);
  const RunResult r = Run({"budget", ExamplePath(kExample), "--devices",
                           dir / "devices", "--spectrum", device});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: command line: --spectrum: \"" + device +
                     "\" is the same file as the device file \"" + device +
                     "\"\n");
  CHECK(ReadAll(device) == text);
}

TEST_CASE(
    "two outputs that are one file are refused before anything is "
    "written") {
  TempFolder dir("out-twice");
  const std::string stage = CopyStage(dir);
  const std::string png = dir / "x.png";
  RunResult r = Run({"plot", stage, "-o", png, "--script", png});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: command line: --script: \"" + png +
                     "\" is the same file as -o \"" + png + "\"\n");
  // Not there yet, named two ways: the same folder and name.
  fs::create_directory(dir.path() / "sub");
  const std::string other = dir / "sub/../x.png";
  r = Run({"plot", stage, "-o", png, "--script", other});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: command line: --script: \"" + other +
                     "\" is the same file as -o \"" + png + "\"\n");
  // Standard output taken twice.
  r = Run({"budget", stage, "--spectrum", "-", "--chain-csv", "-"});
  CHECK(r.exit_code == 2);
  CHECK(r.out.empty());
  CHECK(dir.Files() == std::vector<std::string>{"s.json", "sub"});
}

TEST_CASE("an empty output name is refused by every option") {
  TempFolder dir("out-empty");
  const std::string stage = CopyStage(dir);
  struct Case {
    std::vector<std::string> args;
    std::string option;
  };
  const std::vector<Case> cases = {
      {{"budget", stage, "--spectrum", ""}, "--spectrum"},
      {{"budget", stage, "--chain-csv", ""}, "--chain-csv"},
      {{"spread", stage, "--samples", "10", "--csv", ""}, "--csv"},
      {{"spread", stage, "--samples", "10", "--plot", ""}, "--plot"},
      {{"plot", stage, "-o", ""}, "-o"},
      {{"plot", stage, "-o", dir / "p.png", "--script", ""}, "--script"},
      {{"tee", "sweep", ExamplePath("geophone-preamp"), "--plot", ""},
       "--plot"},
      {{"note", stage, "-o", ""}, "-o"},
      {{"compare", stage, "--plot", ""}, "--plot"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.option);
    const RunResult r = Run(c.args);
    CHECK(r.exit_code == 2);
    // CLI11 names an option by its long name when it has one.
    const std::string shown = c.option == "-o" ? "--output" : c.option;
    CHECK(r.err == "error: command line: " + shown +
                       ": expected a file name, got \"\"\n");
    CHECK(r.out.empty());
  }
  CHECK(dir.Files() == std::vector<std::string>{"s.json"});
}

// Found by the command-line fuzzer: "--spectrum=" took the next word as its
// value and wrote the spectrum to a file named "--json". An empty value
// after "=" is the empty value, refused in the same words.
TEST_CASE("an empty value after an equals sign is refused as an empty value") {
  TempFolder dir("out-equals");
  const std::string stage = CopyStage(dir);
  struct Case {
    std::vector<std::string> args;
    std::string line;
  };
  const std::vector<Case> cases = {
      {{"budget", stage, "--spectrum=", "--json"},
       "error: command line: --spectrum: expected a file name, got \"\""},
      {{"spread", stage, "--samples", "10", "--csv=", "--json"},
       "error: command line: --csv: expected a file name, got \"\""},
      {{"spread", stage, "--samples=", "10"},
       "error: command line: --samples: expected a whole number, got \"\""},
      {{"budget", stage, "--spectrum="},
       "error: command line: --spectrum: expected a file name, got \"\""},
  };
  for (const Case& c : cases) {
    CAPTURE(c.line);
    const RunResult r = RunBinary(HUSHGAIN_BINARY, c.args, dir.path().string());
    CHECK(r.exit_code == 2);
    CHECK(r.err == c.line + "\n");
    CHECK(r.out.empty());
  }
  CHECK(dir.Files() == std::vector<std::string>{"s.json"});
  // A value after the "=" is still the value.
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY, {"budget", stage, "--spectrum=x.csv"},
                dir.path().string());
  CHECK(r.exit_code == 0);
  CHECK(dir.Files() == std::vector<std::string>{"s.json", "x.csv"});
}

TEST_CASE("a dash writes the spectrum samples and script to standard output") {
  TempFolder dir("out-stdout");
  const std::string stage = CopyStage(dir);
  const RunResult file =
      Run({"budget", stage, "--spectrum", dir / "spectrum.csv"});
  REQUIRE(file.exit_code == 0);
  const std::string csv = ReadAll(dir / "spectrum.csv");
  REQUIRE(csv.rfind("f_Hz,", 0) == 0);
  // The output takes standard output: the report is not mixed in.
  RunResult r = Run({"budget", stage, "--spectrum", "-"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == csv);
  // /dev/stdout is standard output too (here a regular file of the test):
  // written directly, not replaced.
  r = Run({"budget", stage, "--spectrum", "/dev/stdout"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == csv);

  const RunResult samples =
      Run({"spread", stage, "--samples", "20", "--csv", dir / "samples.csv"});
  REQUIRE(samples.exit_code == 0);
  r = Run({"spread", stage, "--samples", "20", "--csv", "-"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == ReadAll(dir / "samples.csv"));

  const std::string svg = dir / "p.svg";
  REQUIRE(Run({"plot", stage, "-o", svg, "--script", dir / "p.gp"}).exit_code ==
          0);
  r = Run({"plot", stage, "-o", svg, "--script", "-"});
  CHECK(r.exit_code == 0);
  CHECK(r.out == ReadAll(dir / "p.gp"));
  CHECK(dir.Files() == std::vector<std::string>{"p.gp", "p.svg", "s.json",
                                                "samples.csv", "spectrum.csv"});
}

TEST_CASE("a dash is refused where standard output is not taken") {
  TempFolder dir("out-nodash");
  const RunResult r = Run({"note", CopyStage(dir), "-o", "-"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: command line: -o: expected a file name (\"-\", standard "
        "output, is taken by --spectrum, --chain-csv, --csv and --script)\n");
}

TEST_CASE("a symbolic link output keeps the link and replaces its target") {
  TempFolder dir("out-link");
  const std::string stage = CopyStage(dir);
  REQUIRE(Run({"budget", stage, "--spectrum", dir / "direct.csv"}).exit_code ==
          0);
  dir.Write("data/target.csv", "old\n");
  fs::create_symlink("data/target.csv", dir.path() / "link.csv");
  // A link whose target is not there yet: the target is made.
  fs::create_symlink("data/new.csv", dir.path() / "dangling.csv");
  for (const std::string link : {"link.csv", "dangling.csv"}) {
    CAPTURE(link);
    const RunResult r = Run({"budget", stage, "--spectrum", dir / link});
    CHECK(r.exit_code == 0);
    CHECK(fs::is_symlink(dir.path() / link));
    CHECK(ReadAll(dir / link) == ReadAll(dir / "direct.csv"));
  }
  CHECK(fs::read_symlink(dir.path() / "link.csv") == "data/target.csv");
  CHECK(fs::read_symlink(dir.path() / "dangling.csv") == "data/new.csv");
  // A picture through a link.
  fs::create_symlink("data/sheet.png", dir.path() / "sheet.png");
  CHECK(Run({"plot", stage, "-o", dir / "sheet.png"}).exit_code == 0);
  CHECK(fs::is_symlink(dir.path() / "sheet.png"));
  CHECK(ReadAll(dir / "data/sheet.png").compare(0, 4, "\x89PNG") == 0);
  CheckNoTemporaries(dir);
}

TEST_CASE("a fifo output is written directly and stays a fifo") {
  TempFolder dir("out-fifo");
  const std::string stage = CopyStage(dir);
  REQUIRE(Run({"budget", stage, "--spectrum", dir / "direct.csv"}).exit_code ==
          0);
  const std::string fifo = dir / "pipe";
  REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
  std::string received;
  std::thread reader([&] { received = ReadAll(fifo); });
  const RunResult r = Run({"budget", stage, "--spectrum", fifo});
  reader.join();
  CHECK(r.exit_code == 0);
  CHECK(received == ReadAll(dir / "direct.csv"));
  struct stat st;
  REQUIRE(::lstat(fifo.c_str(), &st) == 0);
  CHECK(S_ISFIFO(st.st_mode));
  CheckNoTemporaries(dir);
}

TEST_CASE("a device that cannot take the data fails and replaces nothing") {
  // /dev/full answers every write with ENOSPC (Linux, man 4 full).
  TempFolder dir("out-devfull");
  const std::string stage = CopyStage(dir);
  const std::string png = dir / "y.png";
  REQUIRE(Run({"plot", stage, "-o", png}).exit_code == 0);
  const std::string before = ReadAll(png);
  const RunResult r = Run({"plot", stage, "-o", png, "--script", "/dev/full"});
  CHECK(r.exit_code == 4);
  CHECK(test::Lines(r.err).back() ==
        "error: /dev/full: cannot write: no space left on device");
  CHECK(ReadAll(png) == before);
  CHECK(dir.Files() == std::vector<std::string>{"s.json", "y.png"});
}

// A small tmpfs of its own, mounted for the test (needs root: CI runs as
// root; skipped with a message otherwise).
class SmallDisk {
 public:
  explicit SmallDisk(const TempFolder& dir) : path_(dir / "disk") {
    fs::create_directory(path_);
    mounted_ = ::mount("tmpfs", path_.c_str(), "tmpfs", 0, "size=1m") == 0;
    if (!mounted_) why_ = std::strerror(errno);
  }
  ~SmallDisk() {
    if (mounted_) ::umount2(path_.c_str(), MNT_DETACH);
  }
  bool mounted() const { return mounted_; }
  const std::string& why() const { return why_; }
  std::string operator/(const std::string& name) const {
    return path_ + "/" + name;
  }
  // Fills the disk up to `leave` bytes (rounded to its pages).
  void Fill(std::size_t leave) const {
    const fs::space_info space = fs::space(path_);
    std::ofstream fill(path_ + "/fill", std::ios::binary | std::ios::app);
    if (space.available > leave)
      fill << std::string(space.available - leave, '\0');
    fill.flush();
  }

 private:
  std::string path_;
  bool mounted_ = false;
  std::string why_;
};

bool UnderCi() {
  const char* ci = std::getenv("CI");
  return ci != nullptr && ci[0] != '\0';
}

TEST_CASE("on a full disk the old files are kept and no temporary is left") {
  if (::geteuid() != 0) {
    MESSAGE("skipped: mounting a small tmpfs needs root (CI runs as root)");
    return;
  }
  TempFolder dir("out-fulldisk");
  const SmallDisk disk(dir);
  if (!disk.mounted()) {
    // Root without the right to mount (a container): say so; under CI it
    // is a failure.
    CHECK_MESSAGE(!UnderCi(), "cannot mount a tmpfs: " << disk.why());
    MESSAGE("skipped: cannot mount a tmpfs: " << disk.why());
    return;
  }
  const std::string stage = CopyStage(dir);
  const std::string png = disk / "y.png";
  const std::string csv = disk / "spectrum.csv";
  REQUIRE(Run({"plot", stage, "-o", png}).exit_code == 0);
  REQUIRE(Run({"budget", stage, "--spectrum", csv}).exit_code == 0);
  const std::string old_png = ReadAll(png);
  const std::string old_csv = ReadAll(csv);
  const auto files = [&] {
    std::vector<std::string> names;
    for (const auto& e : fs::directory_iterator(disk / ""))
      names.push_back(e.path().filename().string());
    std::sort(names.begin(), names.end());
    return names;
  };
  const std::vector<std::string> expected = {"fill", "spectrum.csv", "y.png"};

  // Room for part of a picture: gnuplot writes what fits, exits 0, and the
  // PNG lacks its IEND chunk.
  disk.Fill(old_png.size() / 3);
  RunResult r = Run({"plot", stage, "-o", png});
  CHECK(r.exit_code == 4);
  CHECK(test::Lines(r.err).back() ==
        "error: " + png +
            ": cannot write: the picture gnuplot drew is incomplete (no IEND "
            "chunk at its end); is the disk full?");
  CHECK(ReadAll(png) == old_png);
  CHECK(files() == expected);

  // No room at all.
  disk.Fill(0);
  r = Run({"plot", stage, "-o", png});
  CHECK(r.exit_code == 4);
  CHECK(ReadAll(png) == old_png);
  r = Run({"budget", stage, "--spectrum", csv});
  CHECK(r.exit_code == 4);
  CHECK(test::Lines(r.err).back() ==
        "error: " + csv + ": cannot write: no space left on device");
  CHECK(r.out.empty());
  CHECK(ReadAll(csv) == old_csv);
  CHECK(files() == expected);
}

}  // namespace
}  // namespace hushgain
