#include "cli/stage_input.h"

#include "io/read_file.h"
#include "io/stage_parser.h"

namespace hushgain {

Stage LoadStageForCommand(const std::string& stage_path,
                          const DeviceLibrary& library,
                          const std::string& device_override) {
  Stage stage = LoadStageFile(stage_path, library);
  if (!device_override.empty()) {
    // A path on the command line is taken relative to the working folder.
    stage.opamp =
        FindOpAmp(library, device_override, "command line", "--device",
                  [](const std::string& path) { return ReadTextFile(path); });
  }
  return stage;
}

std::vector<InputFile> CommandInputs(const std::string& stage_path,
                                     const DeviceLibrary& library,
                                     const std::string& device_override) {
  std::vector<InputFile> inputs = {{"the stage file", stage_path}};
  if (!device_override.empty())
    inputs.push_back({"the --device file", device_override});
  for (const auto* files : {&library.opamp_files, &library.resistor_files})
    for (const auto& [name, info] : *files)
      inputs.push_back({"the device file", info.path});
  return inputs;
}

ReviewOptions FullReviewOptions(const DeviceLibrary& library,
                                double relative_tolerance) {
  ReviewOptions options;
  options.budget.integration.relative_tolerance = relative_tolerance;
  for (const auto& [name, technology] : library.resistors)
    options.budget.upgrade_candidates.push_back(
        {name, technology, technology.tolerance});
  return options;
}

}  // namespace hushgain
