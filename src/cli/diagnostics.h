// The one funnel for what a command says on stderr beside its report: an
// analysis refusal, a failed helper program, a warning, an interruption.
// Every message is one line (control characters escaped as Error::OneLine
// does), so a stage name or a key that holds a line break cannot split it.
//   error: stage.json: analysis refused: singular network at 1 kHz
//   warning: #2: bandwidth below the band's upper edge
#ifndef HUSHGAIN_CLI_DIAGNOSTICS_H_
#define HUSHGAIN_CLI_DIAGNOSTICS_H_

#include <string>
#include <string_view>
#include <vector>

namespace hushgain {

// "error: SOURCE: analysis refused: MESSAGE"; returns kExitAnalysisRefused.
int ReportRefusal(std::string_view source, std::string_view message);

// "error: SOURCE: MESSAGE" for an outcome the analysis itself reached (no
// network fits the search, ...); returns kExitAnalysisRefused.
int ReportNoResult(std::string_view source, std::string_view message);

// "error: TARGET: MESSAGE" when a program hushgain runs (gnuplot) is missing
// or failed; returns kExitToolFailed.
int ReportToolFailure(std::string_view target, std::string_view message);

// "error: PATH: cannot write: REASON" when an output could not be written
// whole (disk full, an incomplete picture, ...); returns kExitSystem.
int ReportWriteFailure(std::string_view path, std::string_view reason);

// "warning: MESSAGE", or "warning: ABOUT: MESSAGE" when `about` names which
// row or network the warning belongs to.
void ReportWarning(std::string_view message, std::string_view about = {});
void ReportWarnings(const std::vector<std::string>& messages,
                    std::string_view about = {});

// "interrupted: MESSAGE" (the exit code is the caller's: 130 or a partial
// report).
void ReportInterrupted(std::string_view message);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_DIAGNOSTICS_H_
