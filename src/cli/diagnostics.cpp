#include "cli/diagnostics.h"

#include <iostream>

#include "cli/exit_codes.h"
#include "io/error.h"

namespace hushgain {
namespace {

void Line(std::string_view head, std::string_view about,
          std::string_view message) {
  std::string text(about);
  if (!text.empty()) text += ": ";
  text += message;
  std::cerr << head << Error::OneLine(text) << "\n";
}

}  // namespace

int ReportRefusal(std::string_view source, std::string_view message) {
  Line("error: ", source, "analysis refused: " + std::string(message));
  return kExitAnalysisRefused;
}

int ReportNoResult(std::string_view source, std::string_view message) {
  Line("error: ", source, message);
  return kExitAnalysisRefused;
}

int ReportToolFailure(std::string_view target, std::string_view message) {
  Line("error: ", target, message);
  return kExitToolFailed;
}

int ReportWriteFailure(std::string_view path, std::string_view reason) {
  Line("error: ", path, "cannot write: " + std::string(reason));
  return kExitSystem;
}

void ReportWarning(std::string_view message, std::string_view about) {
  Line("warning: ", about, message);
}

void ReportWarnings(const std::vector<std::string>& messages,
                    std::string_view about) {
  for (const std::string& m : messages) ReportWarning(m, about);
}

void ReportInterrupted(std::string_view message) {
  Line("interrupted: ", {}, message);
}

}  // namespace hushgain
