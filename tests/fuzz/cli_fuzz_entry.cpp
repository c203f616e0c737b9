// FuzzCli (tests/fuzz/fuzz_entry_points.h): the whole command line run
// in-process through RunCli, on argument vectors built from the fuzzer's
// bytes, inside a scratch folder that holds copies of the examples and the
// device folder.
#include <fcntl.h>
#include <unistd.h>

#include <charconv>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <iterator>
#include <map>
#include <optional>
#include <set>
#include <sstream>
#include <string>
#include <string_view>
#include <system_error>
#include <vector>

#include "cli/run_cli.h"
#include "fuzz/fuzz_entry_points.h"

namespace hushgain::fuzz {
namespace {

namespace fs = std::filesystem;

// ---------------------------------------------------------------------------
// The argument vector.

// What a value of an option (or a positional) is, each with its own
// dictionary of good and bad spellings.
enum class Kind {
  kFlag,
  kStage,
  kDevice,
  kDevicesList,
  kDevicesFolder,
  kDeviceName,
  kOutput,
  kPicture,
  kNoteOutput,
  kFormat,
  kNoteFormat,
  kQuantity,
  kNumber,
  kPercent,
  kSeries,
  kRank,
  kRatio,
  kOnly,
  kRange,
  kSeed,
  kCount,
  kThreads,
};

struct OptionSpec {
  const char* name;
  Kind kind;
};

struct CommandSpec {
  std::vector<const char*> words;  // "tee", "search"
  std::vector<OptionSpec> options;
  Kind positional = Kind::kStage;
};

const std::vector<CommandSpec>& Commands() {
  static const std::vector<CommandSpec> commands = {
      {{"budget"},
       {{"--device", Kind::kDevice},
        {"--json", Kind::kFlag},
        {"--format", Kind::kFormat},
        {"--spectrum", Kind::kOutput},
        {"--chain-csv", Kind::kOutput},
        {"--tolerance", Kind::kNumber},
        {"--sensitivity", Kind::kFlag}}},
      {{"tee", "sweep"},
       {{"--device", Kind::kDevice},
        {"--min", Kind::kQuantity},
        {"--points", Kind::kCount},
        {"--ratio", Kind::kRatio},
        {"--format", Kind::kFormat},
        {"--csv", Kind::kFlag},
        {"--json", Kind::kFlag},
        {"--plot", Kind::kPicture},
        {"--tolerance", Kind::kNumber}}},
      {{"tee", "search"},
       {{"--device", Kind::kDevice},
        {"--series", Kind::kSeries},
        {"--max", Kind::kQuantity},
        {"--min", Kind::kQuantity},
        {"--gain", Kind::kNumber},
        {"--gain-tol", Kind::kPercent},
        {"--free-input", Kind::kFlag},
        {"--input-min", Kind::kQuantity},
        {"--input-max", Kind::kQuantity},
        {"--rank", Kind::kRank},
        {"--offset-weight", Kind::kNumber},
        {"--top", Kind::kCount},
        {"--threads", Kind::kThreads},
        {"--format", Kind::kFormat},
        {"--csv", Kind::kFlag},
        {"--json", Kind::kFlag},
        {"--plot", Kind::kPicture},
        {"--tolerance", Kind::kNumber}}},
      {{"tia", "suggest"},
       {{"--device", Kind::kDevice},
        {"--bandwidth", Kind::kQuantity},
        {"--series", Kind::kSeries},
        {"--min", Kind::kQuantity},
        {"--max", Kind::kQuantity},
        {"--rows", Kind::kCount},
        {"--background", Kind::kQuantity},
        {"--full-scale", Kind::kQuantity},
        {"--cap-series", Kind::kSeries},
        {"--format", Kind::kFormat},
        {"--csv", Kind::kFlag},
        {"--json", Kind::kFlag}}},
      {{"tia", "snr"},
       {{"--device", Kind::kDevice},
        {"--power-range", Kind::kRange},
        {"--points", Kind::kCount},
        {"--format", Kind::kFormat},
        {"--csv", Kind::kFlag},
        {"--json", Kind::kFlag},
        {"--plot", Kind::kPicture}}},
      {{"plot"},
       {{"--device", Kind::kDevice},
        {"-o", Kind::kPicture},
        {"--output", Kind::kPicture},
        {"--only", Kind::kOnly},
        {"--script", Kind::kOutput}}},
      {{"spread"},
       {{"--device", Kind::kDevice},
        {"--samples", Kind::kCount},
        {"--seed", Kind::kSeed},
        {"--threads", Kind::kThreads},
        {"--csv", Kind::kOutput},
        {"--format", Kind::kFormat},
        {"--json", Kind::kFlag},
        {"--plot", Kind::kPicture},
        {"--gain-error-limit", Kind::kPercent},
        {"--offset-limit", Kind::kQuantity},
        {"--noise-limit", Kind::kQuantity}}},
      {{"compare"},
       {{"--devices-list", Kind::kDevicesList},
        {"--rank", Kind::kRank},
        {"--format", Kind::kFormat},
        {"--csv", Kind::kFlag},
        {"--json", Kind::kFlag},
        {"--tolerance", Kind::kNumber},
        {"--plot", Kind::kPicture}}},
      {{"devices"},
       {{"--format", Kind::kFormat}, {"--json", Kind::kFlag}},
       Kind::kDeviceName},
      {{"note"},
       {{"-o", Kind::kNoteOutput},
        {"--output", Kind::kNoteOutput},
        {"--format", Kind::kNoteFormat},
        {"--device", Kind::kDevice}}},
  };
  return commands;
}

// The spellings of each kind of value: good ones first, then bad ones.
// Paths are relative to the scratch folder (the working folder of a run).
const std::vector<std::string>& Values(Kind kind) {
  static const std::map<Kind, std::vector<std::string>> values = {
      {Kind::kFlag, {}},
      {Kind::kStage,
       {"tee.json", "tia.json", "chain.json", "plain.json", "bad.json",
        "missing.json", "-", "devices", "part.json", ""}},
      {Kind::kDevice,
       {"jfet-input", "zero-drift", "part.json", "low-noise-bipolar",
        "missing.json", "jfet", "", "tee.json",
        "devices/opamps/cmos-general.json",
        "devices/resistors/thin-film.json"}},
      {Kind::kDevicesList,
       {"jfet-input,zero-drift", "part.json", "low-noise-bipolar,part.json", "",
        ",", "jfet-input,jfet-input", "nope", "tee.json", "thin-film"}},
      {Kind::kDevicesFolder, {"devices", "missing", "tee.json", "", "bin"}},
      {Kind::kDeviceName,
       {"jfet-input", "thin-film", "zero-drift", "nope", "", "part.json"}},
      {Kind::kOutput,
       {"out.csv", "out.txt", "-", "", "missing/out.csv", "bin", "tee.json",
        "plain.json", "part.json", "out.json", "/dev/null"}},
      {Kind::kPicture,
       {"out.png", "out.svg", "out.pdf", "out.gif", "-", "", "missing/p.png",
        "tee.json", "bin", "out.csv"}},
      {Kind::kNoteOutput,
       {"note.html", "note.md", "note.txt", "-", "", "missing/n.html",
        "tee.json", "bin"}},
      {Kind::kFormat,
       {"text", "json", "markdown", "csv", "html", "", "TEXT", "md"}},
      {Kind::kNoteFormat, {"html", "markdown", "text", "", "json"}},
      {Kind::kQuantity,
       {"1k",  "10k",   "100k",   "1M",   "10M", "1G",  "10G",     "1T",
        "50k", "1m",    "2n",     "400n", "4",   "100", "4.7 kHz", "0",
        "-1",  "1e308", "1e-300", "inf",  "nan", "x",   "",        "1e6"}},
      {Kind::kNumber,
       {"1e-4", "1e-3", "0.5", "1", "2", "100", "1000", "1e-9", "0", "-1",
        "nan", "inf", "x", "", "1e308"}},
      {Kind::kPercent,
       {"1%", "0.5%", "0.005", "5%", "0", "-1%", "200%", "x", ""}},
      {Kind::kSeries,
       {"E6", "E12", "E24", "E48", "E96", "E192", "E3", "e24", "", "E1"}},
      {Kind::kRank,
       {"input-noise", "noise", "offset", "weighted", "x", "", "Noise"}},
      {Kind::kRatio, {"stage", "1", "0.5", "10", "0", "-1", "x", ""}},
      {Kind::kOnly,
       {"spectrum", "cumulative", "gain", "chain", "x", "", "Gain"}},
      {Kind::kRange,
       {"1n..1m", "1p..1", "10n..10u", "1m..1n", "1..1", "0..1", "x", "1n..",
        "..1m", "1n...1m", "1e-30..1e30", "-1..1", ""}},
      {Kind::kSeed,
       {"1", "0", "42", "18446744073709551615", "-1", "18446744073709551616",
        "1e3", "x", ""}},
      {Kind::kCount,
       {"1", "2", "3", "5", "13", "0", "-1", "+3", "1e3", "2147483648",
        "99999999999999999999", "100000000000", "x", "", "007"}},
      {Kind::kThreads, {"1", "2", "0", "-1", "100000", "2147483648", "x", ""}},
  };
  return values.at(kind);
}

// The largest count a run may ask for, so that an execution stays short:
// bigger values in the documented range become this (values beyond the
// range stay, to be refused).
struct CountCap {
  const char* option;
  long cap;
  long documented_max;
};
constexpr CountCap kCountCaps[] = {
    {"--samples", 200, 100'000'000}, {"--points", 64, 10'000},
    {"--top", 50, 10'000},           {"--rows", 30, 1'000},
    {"--threads", 2, 1'000'000},
};

// Reads the fuzzer's bytes front to back; 0 once they are used up.
class Bytes {
 public:
  Bytes(const std::uint8_t* data, std::size_t size)
      : data_(data), size_(size) {}
  bool more() const { return at_ < size_; }
  unsigned Next() { return at_ < size_ ? data_[at_++] : 0; }
  // A token of the fuzzer's own: up to 31 bytes, "/" made "_" so that no
  // raw path leaves the scratch folder, and NUL made "_" as a command line
  // cannot hold it.
  std::string Raw() {
    const std::size_t length = Next() % 32;
    std::string text;
    for (std::size_t i = 0; i < length && more(); ++i) {
      const char c = static_cast<char>(Next());
      text += c == '/' || c == '\0' ? '_' : c;
    }
    return text;
  }

 private:
  const std::uint8_t* data_;
  std::size_t size_;
  std::size_t at_ = 0;
};

struct Argv {
  std::vector<std::string> words;
  // Values given to output options and raw tokens: the names a successful
  // run may write.
  std::set<std::string> may_write;
  // Values given as the stage or a device file: never written.
  std::set<std::string> inputs;
};

std::string PickValue(Bytes& bytes, Kind kind, Argv* argv) {
  const std::vector<std::string>& values = Values(kind);
  const unsigned pick = bytes.Next();
  std::string value;
  if (pick >= 232 || values.empty()) {
    value = bytes.Raw();
    argv->may_write.insert(value);
  } else {
    value = values[pick % values.size()];
  }
  switch (kind) {
    case Kind::kOutput:
    case Kind::kPicture:
    case Kind::kNoteOutput:
      argv->may_write.insert(value);
      break;
    case Kind::kStage:
    case Kind::kDevice:
      argv->inputs.insert(value);
      break;
    case Kind::kDevicesList: {
      std::stringstream list(value);
      std::string name;
      while (std::getline(list, name, ',')) argv->inputs.insert(name);
      break;
    }
    default:
      break;
  }
  return value;
}

// Replaces a whole-number count above its cap (and within the documented
// range) with the cap, in "--name VALUE" and "--name=VALUE" alike.
void CapCounts(std::vector<std::string>* words) {
  const auto capped = [](const CountCap& c, const std::string& text) {
    long long value = 0;
    const char* end = text.data() + text.size();
    const auto [ptr, ec] = std::from_chars(text.data(), end, value);
    if (ec == std::errc() && ptr == end && value > c.cap &&
        value <= c.documented_max)
      return std::to_string(c.cap);
    return text;
  };
  std::vector<std::string>& w = *words;
  for (std::size_t i = 0; i < w.size(); ++i) {
    for (const CountCap& c : kCountCaps) {
      const std::string name = c.option;
      if (w[i] == name && i + 1 < w.size()) w[i + 1] = capped(c, w[i + 1]);
      if (w[i].rfind(name + "=", 0) == 0)
        w[i] = name + "=" + capped(c, w[i].substr(name.size() + 1));
    }
  }
}

bool Mentions(const std::vector<std::string>& words, const std::string& name) {
  for (const std::string& w : words)
    if (w == name || w.rfind(name + "=", 0) == 0) return true;
  return false;
}

Argv BuildArgv(const std::uint8_t* data, std::size_t size) {
  Bytes bytes(data, size);
  Argv argv;
  std::vector<std::string>& w = argv.words;
  w.push_back("hushgain");
  const unsigned head = bytes.Next();
  // Options before the command, now and then.
  if (head & 0x80) w.push_back("--ascii");
  if ((head & 0x60) == 0x60) {
    w.push_back("--devices");
    w.push_back(PickValue(bytes, Kind::kDevicesFolder, &argv));
  }
  const std::vector<CommandSpec>& commands = Commands();
  const unsigned which = head & 0x1f;
  const CommandSpec* command = nullptr;
  if (which < 2 * commands.size()) {
    command = &commands[which % commands.size()];
    for (const char* word : command->words) w.push_back(word);
  } else if (which == 30) {
    w.push_back(bytes.Raw());  // an unknown command, or none
  }
  if (command == nullptr) return argv;
  // Most runs name a good stage (or device) first.
  if (bytes.Next() % 4 != 0)
    w.push_back(PickValue(bytes, command->positional, &argv));
  for (int token = 0; token < 14 && bytes.more(); ++token) {
    const unsigned action = bytes.Next() % 16;
    if (action < 11) {
      const OptionSpec& o =
          command->options[bytes.Next() % command->options.size()];
      if (o.kind == Kind::kFlag) {
        w.push_back(o.name);
      } else if (action == 10) {
        w.push_back(std::string(o.name) + "=" +
                    PickValue(bytes, o.kind, &argv));
      } else {
        w.push_back(o.name);
        w.push_back(PickValue(bytes, o.kind, &argv));
      }
    } else if (action == 11) {
      w.push_back(PickValue(bytes, command->positional, &argv));
    } else if (action == 12) {
      const std::string raw = bytes.Raw();
      argv.may_write.insert(raw);
      w.push_back(raw);
    } else if (action == 13) {
      w.push_back("--devices");
      w.push_back(PickValue(bytes, Kind::kDevicesFolder, &argv));
    } else if (action == 14) {
      w.push_back("--ascii");
    } else {
      static const char* const rare[] = {"--help", "--", "--version", "-h"};
      w.push_back(rare[bytes.Next() % 4]);
    }
  }
  // Bounded work: small counts, one worker thread unless asked, a small
  // series for a search that also draws the input resistor, and for tia
  // suggest unless asked (a budget per value of the series).
  const std::string first = command->words.front();
  if (first == "spread" && !Mentions(w, "--samples")) {
    w.push_back("--samples");
    w.push_back("20");
  }
  if ((first == "spread" || std::string(command->words.back()) == "search") &&
      !Mentions(w, "--threads")) {
    w.push_back("--threads");
    w.push_back("1");
  }
  if (command->words.back() == std::string("suggest") &&
      !Mentions(w, "--series")) {
    w.push_back("--series");
    w.push_back("E6");
  }
  if (Mentions(w, "--free-input")) {
    bool series = false;
    for (std::size_t i = 0; i < w.size(); ++i) {
      if (w[i] == "--series" && i + 1 < w.size()) {
        w[i + 1] = "E6";
        series = true;
      } else if (w[i].rfind("--series=", 0) == 0) {
        w[i] = "--series=E6";
        series = true;
      }
    }
    if (!series) {
      w.push_back("--series");
      w.push_back("E6");
    }
  }
  CapCounts(&w);
  return argv;
}

// ---------------------------------------------------------------------------
// The scratch folder.

std::string ReadAll(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return std::string((std::istreambuf_iterator<char>(in)),
                     std::istreambuf_iterator<char>());
}

void WriteAll(const fs::path& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out << text;
}

// Every regular file under `root` (relative path -> contents) and every
// folder (contents "/").
std::map<std::string, std::string> Snapshot(const fs::path& root) {
  std::map<std::string, std::string> files;
  std::error_code ec;
  for (fs::recursive_directory_iterator it(root, ec), end; it != end;
       it.increment(ec)) {
    if (ec) break;
    const std::string rel = fs::relative(it->path(), root).string();
    if (it->is_directory())
      files[rel] = "/";
    else
      files[rel] = ReadAll(it->path());
  }
  return files;
}

class Scratch {
 public:
  Scratch() {
    std::string pattern =
        (fs::temp_directory_path() / "hushgain-cli-fuzz-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr) std::abort();
    root_ = pattern;
    const fs::path source(HUSHGAIN_SOURCE_DIR);
    const std::pair<const char*, const char*> copies[] = {
        {"examples/hydrophone-preamp.json", "tee.json"},
        {"examples/smoke-chamber-receiver.json", "tia.json"},
        {"examples/turbidity-receiver.json", "chain.json"},
        {"examples/load-cell-bridge.json", "plain.json"},
        {"examples/hydrophone-preamp.json", "stdin.json"},
        {"devices/opamps/jfet-input.json", "part.json"},
    };
    for (const auto& [from, to] : copies)
      fs::copy_file(source / from, root_ / to);
    WriteAll(root_ / "bad.json", "{\"name\": 1, \"band_Hz\": [}");
    fs::copy(source / "devices", root_ / "devices",
             fs::copy_options::recursive);
    fs::remove(root_ / "devices" / "opamps" / "TEMPLATE.json.example");
    fs::create_directory(root_ / "bin");  // PATH: no gnuplot
    fs::create_directory(root_ / "tmp");  // TMPDIR
    baseline_ = Snapshot(root_);
  }
  ~Scratch() {
    std::error_code ec;
    fs::remove_all(root_, ec);
  }
  Scratch(const Scratch&) = delete;
  Scratch& operator=(const Scratch&) = delete;

  const fs::path& root() const { return root_; }
  const std::map<std::string, std::string>& baseline() const {
    return baseline_;
  }

  // Puts the folder back as it was made.
  void Restore(const std::map<std::string, std::string>& now) {
    std::error_code ec;
    for (const auto& [rel, contents] : now)
      if (!baseline_.count(rel)) fs::remove_all(root_ / rel, ec);
    for (const auto& [rel, contents] : baseline_) {
      const auto it = now.find(rel);
      if (it != now.end() && it->second == contents) continue;
      if (contents == "/") {
        fs::remove(root_ / rel, ec);
        fs::create_directories(root_ / rel, ec);
      } else {
        fs::remove_all(root_ / rel, ec);
        WriteAll(root_ / rel, contents);
      }
    }
  }

 private:
  fs::path root_;
  std::map<std::string, std::string> baseline_;
};

Scratch& TheScratch() {
  static Scratch scratch;  // removed when the process ends
  return scratch;
}

// Sets environment variables for its lifetime.
class Environment {
 public:
  void Set(const char* name, const std::string& value) {
    const char* old = std::getenv(name);
    saved_.push_back({name, old ? std::optional<std::string>(old)
                                : std::optional<std::string>()});
    ::setenv(name, value.c_str(), 1);
  }
  void Unset(const char* name) {
    const char* old = std::getenv(name);
    saved_.push_back({name, old ? std::optional<std::string>(old)
                                : std::optional<std::string>()});
    ::unsetenv(name);
  }
  ~Environment() {
    for (auto it = saved_.rbegin(); it != saved_.rend(); ++it) {
      if (it->second)
        ::setenv(it->first, it->second->c_str(), 1);
      else
        ::unsetenv(it->first);
    }
  }

 private:
  std::vector<std::pair<const char*, std::optional<std::string>>> saved_;
};

// Points file descriptor `fd` at `path` for its lifetime.
class DescriptorRedirect {
 public:
  DescriptorRedirect(int fd, const std::string& path, int flags)
      : fd_(fd), saved_(::dup(fd)) {
    const int target = ::open(path.c_str(), flags | O_CLOEXEC);
    if (target < 0 || ::dup2(target, fd) < 0) std::abort();
    ::close(target);
  }
  ~DescriptorRedirect() {
    if (saved_ >= 0) {
      ::dup2(saved_, fd_);
      ::close(saved_);
    } else {
      ::close(fd_);
    }
  }
  DescriptorRedirect(const DescriptorRedirect&) = delete;
  DescriptorRedirect& operator=(const DescriptorRedirect&) = delete;

 private:
  int fd_;
  int saved_;
};

// Changes the working folder for its lifetime.
class WorkingFolder {
 public:
  explicit WorkingFolder(const fs::path& folder)
      : previous_(fs::current_path()) {
    fs::current_path(folder);
  }
  ~WorkingFolder() {
    std::error_code ec;
    fs::current_path(previous_, ec);
  }
  WorkingFolder(const WorkingFolder&) = delete;
  WorkingFolder& operator=(const WorkingFolder&) = delete;

 private:
  fs::path previous_;
};

// ---------------------------------------------------------------------------
// The contract.

std::string Quote(const std::vector<std::string>& words) {
  std::string out;
  for (const std::string& w : words) {
    std::string q;
    for (char c : w) {
      const auto u = static_cast<unsigned char>(c);
      if (u < 0x20 || u == 0x7f) {
        char buf[8];
        std::snprintf(buf, sizeof buf, "\\x%02x", u);
        q += buf;
      } else {
        q += c;
      }
    }
    out += (out.empty() ? "" : " ") + ("'" + q + "'");
  }
  return out;
}

// "" when stderr keeps the rules for `code`: every line a "warning: ",
// "interrupted: " or "error: " line, no error with exit 0, exactly one with
// a failure.
std::string CheckMessages(int code, const std::string& err) {
  if (code != 0 && code != 1 && code != 2 && code != 3 && code != 4)
    return "undocumented exit code " + std::to_string(code);
  int errors = 0;
  std::size_t start = 0;
  while (start < err.size()) {
    std::size_t end = err.find('\n', start);
    if (end == std::string::npos)
      return "stderr does not end with a line break: " + err.substr(start);
    const std::string line = err.substr(start, end - start);
    start = end + 1;
    if (line.rfind("error: ", 0) == 0)
      ++errors;
    else if (line.rfind("warning: ", 0) != 0)
      return "a stderr line that is no error or warning: \"" + line + "\"";
  }
  if (code == 0 && errors != 0) return "an error message with exit 0";
  if (code != 0 && errors != 1)
    return "exit " + std::to_string(code) + " with " + std::to_string(errors) +
           " error lines";
  return "";
}

// "" when the files agree with the outcome: a failed run changed nothing, a
// run that succeeded changed only files named as outputs, never an input;
// no temporary is left anywhere.
std::string CheckFiles(int code, const Argv& argv,
                       const std::map<std::string, std::string>& before,
                       const std::map<std::string, std::string>& after) {
  for (const auto& [rel, contents] : after) {
    const auto it = before.find(rel);
    const bool changed = it == before.end() || it->second != contents;
    if (!changed) continue;
    if (rel.rfind("tmp/", 0) == 0) return "a temporary left in TMPDIR: " + rel;
    if (rel.find(".tmp-") != std::string::npos)
      return "a temporary left behind: " + rel;
    if (code != 0) return "a failed run changed " + rel;
    if (argv.inputs.count(rel) && !argv.may_write.count(rel))
      return "an input changed: " + rel;
    if (!argv.may_write.count(rel) && !argv.may_write.count("./" + rel))
      return "a file no option named changed: " + rel;
    if (argv.inputs.count(rel))
      return "an output overwrote the run's input: " + rel;
  }
  for (const auto& [rel, contents] : before)
    if (!after.count(rel)) return "a file was removed: " + rel;
  return "";
}

}  // namespace

std::string FuzzCli(const std::uint8_t* data, std::size_t size) {
  Scratch& scratch = TheScratch();
  const Argv argv = BuildArgv(data, size);
  std::vector<std::string> words = argv.words;
  std::vector<char*> pointers;
  for (std::string& w : words) pointers.push_back(w.data());
  pointers.push_back(nullptr);

  std::ostringstream out;
  std::ostringstream err;
  int code = 0;
  std::string thrown;
  {
    Environment env;
    env.Set("PATH", (scratch.root() / "bin").string());
    env.Set("TMPDIR", (scratch.root() / "tmp").string());
    env.Set("HUSHGAIN_DEVICES", (scratch.root() / "devices").string());
    const WorkingFolder here(scratch.root());
    std::cout.flush();
    const DescriptorRedirect in(STDIN_FILENO, "stdin.json", O_RDONLY);
    const DescriptorRedirect to_null(STDOUT_FILENO, "/dev/null", O_WRONLY);
    try {
      code = RunCli(static_cast<int>(words.size()), pointers.data(), out, err);
    } catch (const std::exception& e) {
      thrown = e.what();
    } catch (...) {
      thrown = "(not a std::exception)";
    }
  }
  const std::map<std::string, std::string> after = Snapshot(scratch.root());
  std::string finding;
  if (!thrown.empty()) finding = "an exception escaped RunCli: " + thrown;
  if (finding.empty()) finding = CheckMessages(code, err.str());
  if (finding.empty() && code == 2 && !out.str().empty())
    finding = "exit 2 with a report on stdout";
  if (finding.empty())
    finding = CheckFiles(code, argv, scratch.baseline(), after);
  scratch.Restore(after);
  // HUSHGAIN_FUZZ_VERBOSE=1: each run's command line, exit code and stderr
  // (to see what a corpus exercises).
  if (const char* verbose = std::getenv("HUSHGAIN_FUZZ_VERBOSE");
      verbose != nullptr && verbose[0] == '1')
    std::fprintf(stderr, "exit %d: %s\n%s", code, Quote(argv.words).c_str(),
                 err.str().c_str());
  if (finding.empty()) return "";
  return finding + " (exit " + std::to_string(code) + ", argv " +
         Quote(argv.words) + ", stderr \"" + err.str() + "\")";
}

}  // namespace hushgain::fuzz
