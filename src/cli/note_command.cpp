#include "cli/note_command.h"

#include <stdlib.h>
#include <unistd.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <optional>
#include <vector>

#include "cli/diagnostics.h"
#include "cli/draw_picture.h"
#include "cli/exit_codes.h"
#include "cli/option_values.h"
#include "cli/output_files.h"
#include "cli/plot_command.h"
#include "cli/stage_input.h"
#include "cli/version.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/read_file.h"
#include "io/suggest.h"
#include "report/design_note.h"
#include "report/plot_script.h"
#include "review/review.h"

namespace hushgain {
namespace {

namespace fs = std::filesystem;

// Where the op-amp's values come from, in words: the device file's label or
// source, or the stage's inline parameters.
std::string OpAmpData(const std::string& stage_path,
                      const DeviceLibrary& library,
                      const std::string& device_override) {
  std::string device = device_override;
  bool inline_set = false;
  if (device.empty()) {
    const nlohmann::json stage = nlohmann::json::parse(
        ReadTextFile(stage_path), nullptr, false, /*ignore_comments=*/true);
    if (stage.is_object() && stage.contains("opamp") &&
        stage["opamp"].is_object()) {
      const nlohmann::json& opamp = stage["opamp"];
      if (opamp.contains("device") && opamp["device"].is_string())
        device = opamp["device"].get<std::string>();
      inline_set = opamp.contains("set");
    }
  }
  if (device.empty()) return "inline parameters in the stage file";
  DeviceFileInfo info;
  if (auto it = library.opamp_files.find(device);
      it != library.opamp_files.end()) {
    info = it->second;
  } else {
    fs::path path(device);
    if (device_override.empty() && path.is_relative())
      path = fs::path(stage_path).parent_path() / path;
    ParseOpAmpDevice(ReadTextFile(path.string()), path.string(), &info);
  }
  std::string data =
      info.illustrative.empty()
          ? "a user's part (" + info.path + ")" +
                (info.source.empty() ? "" : "; source: " + info.source)
          : "a shipped class: " + info.illustrative;
  if (inline_set && device_override.empty())
    data += "; with the stage file's \"set\" overrides";
  return data;
}

}  // namespace

int RunNoteCommand(const NoteCommandOptions& options) {
  if (options.format != "html" && options.format != "markdown")
    throw OptionError("--format",
                      "expected html or markdown, got \"" + options.format +
                          "\"" +
                          DidYouMean(options.format, {"html", "markdown"}));
  if (options.output_path.empty())
    throw OptionError("-o", "expected the note's file name, got \"\"");

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  OutputFiles outputs;
  const OutputFiles::Id note_file =
      outputs.AddText("-o", options.output_path, /*stdout_ok=*/false);
  // A Markdown note has its sheet beside it: "<note>-sheet.svg".
  const fs::path note(options.output_path);
  const std::string svg_name = note.stem().string() + "-sheet.svg";
  std::optional<OutputFiles::Id> sheet_file;
  if (options.format == "markdown")
    sheet_file = outputs.AddPicture("the sheet",
                                    (note.parent_path() / svg_name).string(),
                                    PlotFormat::kSvg);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));
  const std::string gnuplot = GnuplotOrExplain("note");
  if (gnuplot.empty()) return kExitToolFailed;

  const BudgetOutcome outcome =
      ReviewStage(stage, FullReviewOptions(library, 1e-4));
  if (!outcome.status.ok)
    return ReportRefusal(options.stage_path, outcome.status.message);
  const Budget& budget = outcome.budget;
  SheetData sheet = SampleSheet(stage, budget);
  if (!sheet.status.ok)
    return ReportRefusal(options.stage_path, sheet.status.message);

  DesignNoteInput input;
  input.budget = &budget;
  input.opamp = &stage.opamp;
  input.opamp_data = OpAmpData(options.stage_path, library, options.device);
  input.stage_file = options.stage_path;
  input.version = VersionLine();

  PlotScriptOptions script;
  script.format = PlotFormat::kSvg;
  script.panels = DefaultPlotPanels(budget);
  const auto draw = [&](OutputFiles& files, OutputFiles::Id id) {
    return DrawPicture(gnuplot, files, id, [&](const std::string& temporary) {
      PlotScriptOptions drawing = script;
      drawing.output_path = temporary;
      return BuildPlotScript(budget, sheet.data, drawing);
    });
  };
  if (sheet_file) {
    // The note and its sheet, written together.
    const int drawn = draw(outputs, *sheet_file);
    if (drawn != kExitOk) return drawn;
    input.sheet = svg_name;
    outputs.SetText(note_file, DesignNoteMarkdown(input));
  } else {
    // The sheet is drawn into a scratch folder, checked whole like any
    // picture, and read into the note.
    std::string folder =
        (fs::temp_directory_path() / "hushgain-note-XXXXXX").string();
    if (::mkdtemp(folder.data()) == nullptr)
      throw Error(folder, "", "cannot make a scratch folder");
    const std::string svg = (fs::path(folder) / "sheet.svg").string();
    int drawn = kExitOk;
    {
      OutputFiles scratch;
      const OutputFiles::Id id =
          scratch.AddPicture("the sheet", svg, PlotFormat::kSvg);
      scratch.Check({});
      drawn = draw(scratch, id);
      if (drawn == kExitOk) drawn = scratch.Commit();
    }
    if (drawn == kExitOk) input.sheet = ReadTextFile(svg);
    std::error_code ignored;
    fs::remove_all(folder, ignored);
    if (drawn != kExitOk) return drawn;
    outputs.SetText(note_file, DesignNoteHtml(input));
  }
  if (const int written = outputs.Commit(); written != kExitOk) return written;
  ReportWarnings(budget.warnings);
  return kExitOk;
}

}  // namespace hushgain
