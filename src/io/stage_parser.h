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
  // Reads a device file named by path (relative paths are taken relative to
  // the stage file's folder by the caller's function).
  std::function<std::string(const std::string& path)> read_file;
};

// Throws Error naming `source_name` and the JSON path of the fault.
Stage ParseStage(std::string_view json_text, std::string_view source_name,
                 const StageContext& context);

// How errors name standard input.
inline constexpr const char* kStandardInputName = "stdin";

// Reads and parses a stage file; device paths are relative to its folder.
// "-" reads standard input (device paths relative to the current folder).
// Files are read through ReadTextFile, so never more than kMaxInputBytes.
Stage LoadStageFile(const std::string& path, const DeviceLibrary& library);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_STAGE_PARSER_H_
