// `hushgain note STAGE.json -o note.html [--format html|markdown]`: the
// design note of one stage (report/design_note.h). HTML is one
// self-contained file; Markdown writes the plot sheet as an SVG beside the
// note (NOTE-sheet.svg for NOTE.md), linked by its relative name. gnuplot
// draws the sheet; without it the command fails as `plot` does.
#ifndef HUSHGAIN_CLI_NOTE_COMMAND_H_
#define HUSHGAIN_CLI_NOTE_COMMAND_H_

#include <string>

namespace hushgain {

struct NoteCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;       // --device: replaces the stage's op-amp when set
  std::string output_path;  // required
  std::string format = "html";  // html or markdown
};

// Returns an exit code (cli/exit_codes.h); throws Error for bad input.
int RunNoteCommand(const NoteCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_NOTE_COMMAND_H_
