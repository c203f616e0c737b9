#include "cli/budget_command.h"

#include <cstdio>
#include <iostream>

#include "budget/compute_budget.h"
#include "cli/exit_codes.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "report/json_report.h"
#include "report/text_report.h"

namespace hushgain {

int RunBudgetCommand(const BudgetCommandOptions& options) {
  BudgetOptions budget_options;
  budget_options.integration.relative_tolerance = options.tolerance;
  if (std::string why = budget_options.Validate(); !why.empty())
    throw Error("command line", "", "--tolerance: " + why);

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage = LoadStageFile(options.stage_path, library);
  for (const auto& [name, technology] : library.resistors)
    budget_options.upgrade_candidates.push_back({name, technology, technology.tolerance});
  const BudgetOutcome outcome = ComputeBudget(stage, budget_options);
  if (!outcome.status.ok) {
    std::cerr << "error: " << options.stage_path
              << ": analysis refused: " << outcome.status.message << "\n";
    return kExitAnalysisRefused;
  }
  const std::string text = options.json ? BudgetToJson(outcome.budget)
                                        : BudgetToText(outcome.budget);
  for (const std::string& w : outcome.budget.warnings)
    std::cerr << "warning: " << w << "\n";
  std::cout << text << std::flush;
  return kExitOk;
}

}  // namespace hushgain
