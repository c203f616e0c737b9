// `hushgain spread --plot` end to end on the outdoor pressure-bridge
// example: a valid PNG and a well-formed SVG holding the stage name and the
// three panel titles, a hostile stage name drawn as text and never run,
// gnuplot's absence explained with exit 3 and nothing written, and a
// wrong picture name refused before any sampling.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::HostileStageNames;
using test::ReadAll;
using test::RunHushgain;
using test::RunResult;
using test::TempFolder;

// Three histogram panels are far above this; an empty or cut picture below.
constexpr std::size_t kMinPictureBytes = 20000;

std::string Example() { return test::ExamplePath("pressure-bridge-outdoor"); }

RunResult Spread(const std::string& stage, const std::string& picture,
                 const std::vector<std::string>& env = {}) {
  return RunHushgain({"spread", stage, "--samples", "3000", "--seed", "7",
                      "--offset-limit", "30m", "--gain-error-limit", "1%",
                      "--noise-limit", "160u", "--plot", picture},
                     env);
}

TEST_CASE("spread --plot writes a valid PNG and a well-formed SVG") {
  TempFolder dir("spreadplot");
  const std::string png = dir / "hist.png";
  const auto p = Spread(Example(), png);
  INFO("stderr: " << p.err);
  REQUIRE(p.exit_code == 0);
  CHECK(p.out.find("Monte Carlo: 3000 samples, seed 7") != std::string::npos);
  const std::string bytes = ReadAll(png);
  // PNG signature, ISO/IEC 15948 (PNG 2nd ed.) section 5.2.
  CHECK(bytes.compare(0, 8, "\x89PNG\r\n\x1a\n") == 0);
  CHECK(bytes.size() > kMinPictureBytes);

  const std::string svg = dir / "hist.SVG";
  const auto s = Spread(Example(), svg);
  INFO("stderr: " << s.err);
  REQUIRE(s.exit_code == 0);
  const std::string text = ReadAll(svg);
  CHECK(text.size() > kMinPictureBytes);
  std::string why;
  CHECK_MESSAGE(test::WellFormedXml(text, &why), why);
  const std::string decoded = test::DecodeXmlEntities(text);
  const std::string name = json::parse(ReadAll(Example()))["name"];
  CHECK(decoded.find(">" + name + "<") != std::string::npos);
  for (const char* title :
       {">Closed-loop gain error<", ">Output offset at DC<",
        ">Total output noise rms over the band<", ">gain error (%)<",
        ">output offset (mV)<", ">output noise rms (µV)<"})
    CHECK_MESSAGE(decoded.find(title) != std::string::npos, title);
  for (const std::string& f : dir.Files())
    CHECK(f.find(".tmp-") == std::string::npos);
  CHECK(dir.Files().size() == 2);
}

TEST_CASE("spread --plot draws a hostile stage name as text and runs nothing") {
  TempFolder dir("spreadinject");
  const std::string pwned = dir / "pwned";
  const std::vector<std::string> names = HostileStageNames(pwned);

  for (const std::string& name : names) {
    INFO("name " << name);
    json stage = json::parse(ReadAll(Example()));
    stage["name"] = name;
    const std::string stage_path = dir / "stage.json";
    {
      std::ofstream out(stage_path);
      out << stage.dump(2);
    }
    const std::string svg = dir / "out.svg";
    const auto r = Spread(stage_path, svg);
    INFO("stderr: " << r.err);
    REQUIRE(r.exit_code == 0);
    CHECK_FALSE(std::filesystem::exists(pwned));
    const std::string text = ReadAll(svg);
    std::string why;
    CHECK_MESSAGE(test::WellFormedXml(text, &why), why);
    CHECK(test::DecodeXmlEntities(text).find(">" + name + "<") !=
          std::string::npos);
  }
}

TEST_CASE(
    "spread --plot without gnuplot names the package and writes nothing") {
  TempFolder dir("spreadnognuplot");
  const auto r = RunHushgain({"spread", Example(), "--samples", "100", "--csv",
                              dir / "s.csv", "--plot", dir / "out.png"},
                             {"PATH=" + dir / "empty-path"});
  CHECK(r.exit_code == 3);
  CHECK(r.err ==
        "error: spread --plot needs gnuplot, which is not on PATH; install "
        "the Debian package gnuplot-nox (apt-get install gnuplot-nox)\n");
  CHECK(r.out.empty());
  CHECK(dir.Files().empty());
}

TEST_CASE(
    "spread --plot refuses a picture name that is not .png .svg or .pdf") {
  TempFolder dir("spreadbadname");
  const auto r = RunHushgain(
      {"spread", Example(), "--samples", "100", "--plot", dir / "out.gif"});
  CHECK(r.exit_code == 2);
  CHECK(r.err.find("--plot: expected a file name ending in .png, .svg or "
                   ".pdf, got \"" +
                   dir / "out.gif" + "\"") != std::string::npos);
  CHECK(r.out.empty());
  CHECK(dir.Files().empty());
}

}  // namespace
}  // namespace hushgain
