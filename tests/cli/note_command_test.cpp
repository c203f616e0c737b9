// `hushgain note`, end to end: the HTML note holds the budget's own figures,
// the plot sheet inline and nothing to load; Markdown writes the sheet
// beside it; bad options are one line and exit 2. The rendering in a real
// browser is tests/note/render_note.py (CTest: design_note_renders).
#include <doctest/doctest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/cli_support.h"
#include "cli/temp_folder.h"
#include "io/units.h"

namespace hushgain {
namespace {

namespace fs = std::filesystem;
using json = nlohmann::json;
using test::ExamplePath;
using test::ReadAll;
using test::RunBinary;
using test::RunResult;

TEST_CASE("the HTML note holds the budget's figures and an inline sheet") {
  test::TempFolder folder;
  const std::string note = (folder.path() / "note.html").string();
  const std::string stage = ExamplePath("geophone-preamp");
  const RunResult r = RunBinary(HUSHGAIN_BINARY, {"note", stage, "-o", note});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.empty());
  const std::string html = ReadAll(note);
  CHECK(html.rfind("<!DOCTYPE html>", 0) == 0);
  CHECK(html.find("<svg") != std::string::npos);
  CHECK(html.find("<?xml") == std::string::npos);
  CHECK(html.find("@media print") != std::string::npos);
  CHECK(html.find("does not certify") != std::string::npos);
  // The figures are the budget's: its output rms as the text report prints it.
  const RunResult budget =
      RunBinary(HUSHGAIN_BINARY, {"budget", stage, "--format", "json"});
  REQUIRE(budget.exit_code == 0);
  const json b = json::parse(budget.out);
  const std::string rms =
      FormatEng(b["noise"]["output_rms_V"].get<double>(), "V");
  CHECK(html.find(rms) != std::string::npos);
  CHECK(html.find("T network against one resistor") != std::string::npos);
}

TEST_CASE("the Markdown note writes its sheet beside it and links it") {
  test::TempFolder folder;
  const std::string note = (folder.path() / "design.md").string();
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY, {"note", ExamplePath("smoke-chamber-receiver"),
                                  "-o", note, "--format", "markdown"});
  REQUIRE(r.exit_code == 0);
  const std::string md = ReadAll(note);
  CHECK(md.find("](design-sheet.svg)") != std::string::npos);
  const std::string svg =
      ReadAll((folder.path() / "design-sheet.svg").string());
  CHECK(svg.find("</svg>") != std::string::npos);
}

TEST_CASE("a stage name cannot inject markup into the note") {
  test::TempFolder folder;
  json stage = json::parse(ReadAll(ExamplePath("geophone-preamp")));
  stage["name"] = "<script>alert(1)</script>";
  folder.Write("stage.json", stage.dump());
  const std::string note = (folder.path() / "note.html").string();
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY,
                {"note", (folder.path() / "stage.json").string(), "-o", note});
  REQUIRE(r.exit_code == 0);
  const std::string html = ReadAll(note);
  CHECK(html.find("<script>") == std::string::npos);
  CHECK(html.find("&lt;script&gt;alert(1)&lt;/script&gt;") !=
        std::string::npos);
}

TEST_CASE("note refuses a bad format and an empty output with one line") {
  test::TempFolder folder;
  const std::string stage = ExamplePath("geophone-preamp");
  const RunResult format =
      RunBinary(HUSHGAIN_BINARY,
                {"note", stage, "-o", (folder.path() / "n.html").string(),
                 "--format", "htm"});
  CHECK(format.exit_code == 2);
  CHECK(format.err ==
        "error: command line: --format: expected html or markdown, got \"htm\" "
        "(did you mean \"html\"?)\n");
  const RunResult empty = RunBinary(HUSHGAIN_BINARY, {"note", stage, "-o", ""});
  CHECK(empty.exit_code == 2);
  CHECK(folder.Snapshot().empty());
}

}  // namespace
}  // namespace hushgain
