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
  if (!budget_options.Validate().empty()) {
    char value[32];
    std::snprintf(value, sizeof value, "%g", options.tolerance);
    throw Error("command line", "",
                std::string("--tolerance: expected a relative tolerance in "
                            "(0, 1), got ") +
                    value);
  }

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage = LoadStageFile(options.stage_path, library);
  const BudgetOutcome outcome = ComputeBudget(stage, budget_options);
  if (!outcome.status.ok) {
    std::cerr << "error: "
              << Error::OneLine(options.stage_path +
                                ": analysis refused: " + outcome.status.message)
              << "\n";
    return kExitAnalysisRefused;
  }
  const std::string text = options.json ? BudgetToJson(outcome.budget)
                                        : BudgetToText(outcome.budget);
  for (const std::string& w : outcome.budget.warnings)
    std::cerr << "warning: " << Error::OneLine(w) << "\n";
  std::cout << text << std::flush;
  return kExitOk;
}

}  // namespace hushgain
