// `hushgain plot`, end to end: real PNG and SVG pictures of every example,
// names from the stage drawn as text and never run, clear errors and no
// partial files.
#include <doctest/doctest.h>

#include <cctype>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::ReadAll;
using test::RunHushgain;
using test::TempFolder;
using test::WellFormedXml;

// A sheet of three panels is far above this; an empty or truncated
// picture is far below.
constexpr std::size_t kMinPictureBytes = 20000;

std::vector<std::string> ContributorNames(const std::string& stage) {
  const auto r = RunHushgain({"budget", "--json", stage});
  REQUIRE(r.exit_code == 0);
  std::vector<std::string> names;
  const json budget = json::parse(r.out);
  for (const json& c : budget["noise"]["contributors"])
    names.push_back(c["name"]);
  return names;
}

bool HasPython() { return std::filesystem::exists("/usr/bin/python3"); }

TEST_CASE("plot writes a valid PNG for every example") {
  TempFolder dir("png");
  for (const std::string& example : test::ExamplePaths()) {
    INFO("example " << example);
    const std::string png = dir / (test::Stem(example) + ".png");
    const auto r = RunHushgain({"plot", example, "-o", png});
    INFO("stderr: " << r.err);
    REQUIRE(r.exit_code == 0);
    const std::string bytes = ReadAll(png);
    // PNG signature, ISO/IEC 15948 (PNG 2nd ed.) section 5.2.
    CHECK(bytes.compare(0, 8, "\x89PNG\r\n\x1a\n") == 0);
    CHECK(bytes.size() > kMinPictureBytes);
    // No temporary file is left beside it.
    for (const std::string& f : dir.Files())
      CHECK(f.find(".tmp-") == std::string::npos);
  }
}

// A whole PDF file: the header "%PDF-" (ISO 32000-1:2008 section 7.5.2) and
// the end-of-file marker "%%EOF" after the trailer (section 7.5.5), with at
// most a line end after it.
bool WholePdf(const std::string& bytes) {
  if (bytes.compare(0, 5, "%PDF-") != 0) return false;
  const std::size_t eof = bytes.rfind("%%EOF");
  return eof != std::string::npos && bytes.size() - eof <= 7 &&
         bytes.find("trailer") != std::string::npos;
}

TEST_CASE("plot tee sweep and spread write a whole PDF for a .pdf name") {
  TempFolder dir("pdf");
  const std::string tee = test::ExamplePath("geophone-preamp");
  const std::vector<std::vector<std::string>> runs = {
      {"plot", tee, "-o", dir / "sheet.pdf"},
      {"tee", "sweep", tee, "--points", "5", "--plot", dir / "sweep.pdf"},
      {"spread", tee, "--samples", "300", "--plot", dir / "spread.pdf"}};
  for (const auto& args : runs) {
    INFO(args[0] << " " << args.back());
    const auto r = RunHushgain(args);
    INFO("stderr: " << r.err);
    REQUIRE(r.exit_code == 0);
    const std::string bytes = ReadAll(args.back());
    CHECK(WholePdf(bytes));
    CHECK(bytes.size() > kMinPictureBytes / 2);
  }
  CHECK(dir.Files() ==
        std::vector<std::string>{"sheet.pdf", "spread.pdf", "sweep.pdf"});
}

TEST_CASE("plot writes a well-formed SVG naming every contributor") {
  TempFolder dir("svg");
  for (const std::string& stage : test::ExamplePaths()) {
    INFO("example " << stage);
    const std::string svg = dir / (test::Stem(stage) + ".svg");
    const auto r = RunHushgain({"plot", stage, "-o", svg});
    INFO("stderr: " << r.err);
    REQUIRE(r.exit_code == 0);
    const std::string text = ReadAll(svg);
    CHECK(text.size() > kMinPictureBytes);
    std::string why;
    CHECK_MESSAGE(WellFormedXml(text, &why), why);
    CHECK(text.find("<svg") != std::string::npos);
    if (HasPython())
      CHECK(test::RunBinary("/usr/bin/python3",
                            {"-c",
                             "import sys, xml.dom.minidom; "
                             "xml.dom.minidom.parse(sys.argv[1])",
                             svg})
                .exit_code == 0);
    for (const std::string& name : ContributorNames(stage)) {
      INFO("contributor " << name);
      CHECK(text.find(">" + name + "  ") != std::string::npos);
    }
  }
}

TEST_CASE("--only draws one panel in a smaller picture") {
  TempFolder dir("only");
  const std::string stage = test::ExamplePath("geophone-preamp");
  const auto full = RunHushgain({"plot", stage, "-o", dir / "full.svg"});
  REQUIRE(full.exit_code == 0);
  const std::string sheet = ReadAll(dir / "full.svg");
  for (const char* panel : {"spectrum", "cumulative", "gain"}) {
    INFO("panel " << panel);
    const std::string svg = dir / (std::string(panel) + ".svg");
    const auto r = RunHushgain({"plot", stage, "--only", panel, "-o", svg});
    REQUIRE(r.exit_code == 0);
    const std::string one = ReadAll(svg);
    CHECK(one.size() < sheet.size());
    const bool has_spectrum =
        one.find("Output noise density by contributor") != std::string::npos;
    const bool has_cumulative =
        one.find("Cumulative output noise") != std::string::npos;
    const bool has_gain =
        one.find("loop gain (magnitude)") != std::string::npos;
    CHECK(has_spectrum == (std::string(panel) == "spectrum"));
    CHECK(has_cumulative == (std::string(panel) == "cumulative"));
    CHECK(has_gain == (std::string(panel) == "gain"));
  }
}

TEST_CASE("names from the stage file reach gnuplot as text and never as code") {
  // Quotes of both kinds, semicolons, system(), backquotes and a macro:
  // each would run a command if it reached gnuplot unquoted.
  TempFolder dir("inject");
  const std::string pwned = dir / "pwned";
  const std::vector<std::string> names = {
      "\"; system(\"touch " + pwned + "\") ; \"",
      "'; system('touch " + pwned + "') ; '",
      "`touch " + pwned + "` @x & <b>",
  };
  for (const std::string& name : names) {
    INFO("name " << name);
    json stage = json::parse(ReadAll(test::ExamplePath("geophone-preamp")));
    stage["name"] = name;
    const std::string stage_path = dir / "stage.json";
    {
      std::ofstream out(stage_path);
      out << stage.dump(2);
    }
    const std::string svg = dir / "out.svg";
    const std::string script = dir / "out.gp";
    const auto r =
        RunHushgain({"plot", stage_path, "-o", svg, "--script", script});
    INFO("stderr: " << r.err);
    REQUIRE(r.exit_code == 0);
    CHECK_FALSE(std::filesystem::exists(pwned));
    // Drawn as text: the SVG holds the name once its XML entities (XML 1.0
    // section 4.6, the predefined ones) are read back.
    const std::string text = ReadAll(svg);
    std::string why;
    CHECK_MESSAGE(WellFormedXml(text, &why), why);
    const std::string decoded = test::DecodeXmlEntities(text);
    CHECK(decoded.find(">" + name + "<") != std::string::npos);
    // In the script the name appears once, as a double-quoted literal in
    // which every byte but letters and spaces is an octal escape
    // (report/text_escape.h); no raw quote or parenthesis of it is left.
    std::string literal = "\"";
    for (char c : name) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\%03o", static_cast<unsigned char>(c));
      literal += std::isalpha(static_cast<unsigned char>(c)) || c == ' '
                     ? std::string(1, c)
                     : std::string(buf);
    }
    literal += "\"";
    const std::string gp = ReadAll(script);
    const std::size_t at = gp.find(literal);
    REQUIRE(at != std::string::npos);
    CHECK(gp.find(literal, at + 1) == std::string::npos);
    CHECK(gp.substr(at - 8, 8) == "label 1 ");
    CHECK(gp.find("system(") == std::string::npos);
    CHECK(gp.find('`') == std::string::npos);
    // Running the saved script again does not run the name either.
    CHECK(test::RunBinary("/usr/bin/gnuplot", {script}).exit_code == 0);
    CHECK_FALSE(std::filesystem::exists(pwned));
  }
}

TEST_CASE(
    "without gnuplot the plot command names the package and writes nothing") {
  TempFolder dir("nognuplot");
  const std::string png = dir / "out.png";
  const auto r =
      RunHushgain({"plot", test::ExamplePath("load-cell-bridge"), "-o", png},
                  {"PATH=" + dir / "empty-path"});
  CHECK(r.exit_code == 3);
  CHECK(r.err ==
        "error: plot needs gnuplot, which is not on PATH; install the Debian "
        "package gnuplot-nox (apt-get install gnuplot-nox)\n");
  CHECK(dir.Files().empty());
}

TEST_CASE("plot refuses an unknown picture type or panel with exit code 2") {
  TempFolder dir("plotusage");
  const std::string stage = test::ExamplePath("load-cell-bridge");
  auto r = RunHushgain({"plot", stage, "-o", dir / "out.gif"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: command line: -o: expected a file name ending in "
        ".png, .svg or .pdf, got \"" +
            dir / "out.gif" + "\"\n");
  r = RunHushgain({"plot", stage, "--only", "gian", "-o", dir / "out.png"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: command line: --only: expected spectrum, cumulative, "
        "gain or chain, got \"gian\" (did you mean \"gain\"?)\n");
  r = RunHushgain({"plot", stage, "--only", "chain", "-o", dir / "out.png"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: command line: --only chain: the stage has no \"chain\" "
        "block\n");
  CHECK(dir.Files().empty());
}

TEST_CASE("plot into a missing folder is a write error naming the file") {
  TempFolder dir("plotfolder");
  const std::string png = dir / "missing/out.png";
  const auto r =
      RunHushgain({"plot", test::ExamplePath("load-cell-bridge"), "-o", png});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + png + ": cannot write: no such folder\n");
  CHECK(dir.Files().empty());
}

}  // namespace
}  // namespace hushgain
