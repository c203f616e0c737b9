// Stage files (JSON) -> Stage. Units are resolved here; every value is
// checked against its rule, and an unknown key is an error with "did you
// mean". Reading files is not this module's business: a stage names its
// op-amp by device name (looked up in the library) or by a path, which is
// read through `read_file` so tests can feed JSON literals.
#ifndef HUSHGAIN_IO_STAGE_PARSER_H_
#define HUSHGAIN_IO_STAGE_PARSER_H_

#include <functional>
#include <string>
#include <string_view>

#include "circuit/stage.h"
#include "io/device_library.h"

namespace hushgain {

struct StageContext {
  const DeviceLibrary* library = nullptr;
  // Reads a file the stage file names by path: a device file or a second
  // stage file (chain.second_stage.stage). It receives the path resolved
  // against `folder`; the errors it throws are reported at the JSON path
  // that named the file, with the path it looked for.
  std::function<std::string(const std::string& path)> read_file;
  // The folder relative paths are taken from: the stage file's; empty for
  // standard input and text (the working directory).
  std::string folder;
  // The stage file's own path, so a second stage that names it is refused;
  // empty for standard input.
  std::string path;
  // The file is read as a chain's second stage: its "source" and "chain"
  // are refused (the front stage's output drives it; one chain, one second
  // stage).
  bool as_second_stage = false;
};

// `path` as read: relative to `context.folder` unless absolute.
std::string ResolveStagePath(const StageContext& context,
                             const std::string& path);

// Throws Error naming `source_name` and the JSON path of the fault.
Stage ParseStage(std::string_view json_text, std::string_view source_name,
                 const StageContext& context);

// How errors name standard input.
inline constexpr const char* kStandardInputName = "stdin";

// Reads and parses a stage file; device and second stage paths are
// relative to its folder (and a second stage file's devices to that
// file's). "-" reads standard input (paths relative to the current folder).
// Files are read through ReadTextFile, so never more than kMaxInputBytes.
Stage LoadStageFile(const std::string& path, const DeviceLibrary& library);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_STAGE_PARSER_H_
