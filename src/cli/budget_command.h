// `hushgain budget STAGE.json`: the noise and offset budget of one stage.
#ifndef HUSHGAIN_CLI_BUDGET_COMMAND_H_
#define HUSHGAIN_CLI_BUDGET_COMMAND_H_

#include <string>

namespace hushgain {

struct BudgetCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  bool json = false;        // print the JSON object instead of the text
  double tolerance = 1e-4;  // relative, on the total output noise power
};

// Prints the budget on stdout; returns an exit code (cli/exit_codes.h).
// Throws Error for bad input (the caller prints it).
int RunBudgetCommand(const BudgetCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_BUDGET_COMMAND_H_
