// `hushgain spread` end to end: the built binary (HUSHGAIN_BINARY) on stage
// files written here; exit codes and whole error messages (README, "Exit
// codes"), the CSV and its independence from the thread count.
#include <doctest/doctest.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace hushgain {
namespace {

namespace fs = std::filesystem;

struct Result {
  int code = -1;
  std::string out;
  std::string err;
};

std::string Slurp(const fs::path& p) {
  std::ifstream in(p);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

class Scratch {
 public:
  Scratch()
      : dir_(fs::temp_directory_path() /
             ("hushgain-spread-cli-" + std::to_string(::getpid()))) {
    fs::create_directories(dir_);
  }
  ~Scratch() { fs::remove_all(dir_); }
  fs::path Write(const std::string& name, const std::string& text) const {
    std::ofstream(dir_ / name) << text;
    return dir_ / name;
  }
  Result Run(const std::string& args) const {
    const std::string command = std::string(HUSHGAIN_BINARY) + " --devices " +
                                HUSHGAIN_SOURCE_DIR + "/devices " + args +
                                " >" + (dir_ / "out").string() + " 2>" +
                                (dir_ / "err").string();
    const int status = std::system(command.c_str());
    Result r;
    r.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    r.out = Slurp(dir_ / "out");
    r.err = Slurp(dir_ / "err");
    return r;
  }
  const fs::path& dir() const { return dir_; }

 private:
  fs::path dir_;
};

std::string StageText(const std::string& temperature,
                      const std::string& tolerance) {
  return R"({
  "name": "cli spread stage",
  "temperature_C": )" +
         temperature + R"(,
  "band_Hz": {"low": "1", "high": "1k"},
  "opamp": {"device": "jfet-input"},
  "source": {"voltage": {"resistance": "100"}},
  "stage": {"topology": "inverting", "input_resistor": "10k", "feedback": {"resistor": "1M"}},
  "resistors": {"technology": "thin-film", "tolerance": ")" +
         tolerance + R"("}
})";
}

TEST_CASE("spread refuses zero samples with one line naming the option") {
  Scratch s;
  const fs::path stage = s.Write("stage.json", StageText("25", "0.1%"));
  const Result r = s.Run("spread " + stage.string() + " --samples 0");
  CHECK(r.code == 2);
  CHECK(r.err ==
        "error: command line: --samples: expected 1 to 100000000, got 0\n");
  CHECK(r.out.empty());
}

TEST_CASE("spread refuses a minimum temperature above the maximum") {
  Scratch s;
  const fs::path stage =
      s.Write("stage.json", StageText(R"({"min": 70, "max": -20})", "0.1%"));
  const Result r = s.Run("spread " + stage.string() + " --samples 10");
  CHECK(r.code == 2);
  CHECK(r.err == "error: " + stage.string() +
                     ": /temperature_C: expected min <= nominal <= max, got "
                     "min 70, nominal 25, max -20\n");
}

TEST_CASE(
    "spread refuses a negative tolerance and a limit that is not a voltage") {
  Scratch s;
  const fs::path bad = s.Write("bad.json", StageText("25", "-0.1%"));
  const Result r = s.Run("spread " + bad.string());
  CHECK(r.code == 2);
  CHECK(r.err == "error: " + bad.string() +
                     ": /resistors/tolerance: expected a tolerance from 0 to "
                     "below 100 %, got \"-0.1%\"\n");
  const fs::path good = s.Write("good.json", StageText("25", "0.1%"));
  const Result limit =
      s.Run("spread " + good.string() + " --samples 10 --offset-limit 5Hz");
  CHECK(limit.code == 2);
  CHECK(limit.err.rfind("error: command line: --offset-limit: expected a "
                        "voltage, got \"5Hz\"",
                        0) == 0);
}

TEST_CASE("spread refuses a CSV in a missing folder before running") {
  Scratch s;
  const fs::path stage = s.Write("stage.json", StageText("25", "0.1%"));
  const std::string csv = (s.dir() / "missing" / "x.csv").string();
  const Result r =
      s.Run("spread " + stage.string() + " --samples 10 --csv " + csv);
  CHECK(r.code == 2);
  CHECK(r.err == "error: " + csv + ": cannot write: no such folder\n");
}

TEST_CASE(
    "spread writes every sample to the CSV, the same for any thread count") {
  Scratch s;
  const fs::path stage =
      s.Write("stage.json", StageText(R"({"min": -20, "max": 70})", "1%"));
  const fs::path one = s.dir() / "one.csv", two = s.dir() / "two.csv";
  const Result a =
      s.Run("spread " + stage.string() +
            " --samples 2000 --seed 3 --threads 1 --csv " + one.string() +
            " --offset-limit 5m --gain-error-limit 1%");
  const Result b =
      s.Run("spread " + stage.string() +
            " --samples 2000 --seed 3 --threads 2 --csv " + two.string() +
            " --offset-limit 5m --gain-error-limit 1%");
  REQUIRE(a.code == 0);
  REQUIRE(b.code == 0);
  const std::string csv = Slurp(one);
  CHECK(csv == Slurp(two));
  CHECK(a.out == b.out);
  CHECK(csv.rfind("index,temperature_C,vos_V,ios_A,gain,gain_error,offset_V,"
                  "noise_rms_V,flags,R_source_ohm,"
                  "R_in_ohm,R_f_ohm\n",
                  0) == 0);
  long lines = 0;
  for (char c : csv) lines += c == '\n';
  CHECK(lines == 2001);
  CHECK(a.out.find("2000 samples, seed 3") != std::string::npos);
  CHECK(a.out.find("all limits") != std::string::npos);
  // No temporary file is left beside the CSV.
  int files = 0;
  for (const auto& e : fs::directory_iterator(s.dir()))
    files += e.path().extension() == ".csv";
  CHECK(files == 2);
}

}  // namespace

TEST_CASE("spread flags every sample whose offset leaves no room") {
  // A 20 V full scale on the jfet-input class's 36 V span (half 18 V):
  // every sample's swing leaves the rails, so the flags column of each
  // names it and the summary counts them all. Before, no column existed.
  Scratch s;
  std::string text = StageText("25", "1%");
  text.insert(text.rfind('}'), R"(, "full_scale_output_V": 20)");
  const fs::path stage = s.Write("flags.json", text);
  const fs::path csv = s.dir() / "flags.csv";
  const Result r =
      s.Run("spread " + stage.string() + " --samples 50 --csv " + csv.string());
  REQUIRE(r.code == 0);
  // The per-sample file is plain LF-ended lines of unquoted cells.
  std::vector<std::vector<std::string>> rows;
  std::istringstream lines(Slurp(csv));
  for (std::string line; std::getline(lines, line);) {
    rows.emplace_back();
    std::istringstream cells(line);
    for (std::string cell; std::getline(cells, cell, ',');)
      rows.back().push_back(cell);
  }
  REQUIRE(rows.size() == 51);
  const auto& header = rows[0];
  const auto flags = std::find(header.begin(), header.end(), "flags");
  REQUIRE(flags != header.end());
  const std::size_t col = flags - header.begin();
  for (std::size_t i = 1; i < rows.size(); ++i)
    CHECK(rows[i][col].find("FS>supply") != std::string::npos);
  CHECK(r.out.find("flagged: 50 of 50 samples cannot work as asked") !=
        std::string::npos);
}

}  // namespace hushgain
