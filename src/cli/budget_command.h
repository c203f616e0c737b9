// `hushgain budget STAGE.json`: the noise and offset budget of one stage.
#ifndef HUSHGAIN_CLI_BUDGET_COMMAND_H_
#define HUSHGAIN_CLI_BUDGET_COMMAND_H_

#include <string>

namespace hushgain {

struct BudgetCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;  // --device: replaces the stage's op-amp when set
  // text (default), json, markdown or csv.
  std::string format = "text";
  bool json = false;        // --json: the same as --format json
  double tolerance = 1e-4;  // relative, on the total output noise power
  // When set, the per-contributor output densities on a log grid across
  // the band (kSpectrumPointsPerDecade, band edges included) go to this CSV
  // file (report/csv_report.h SpectrumToCsv), written atomically.
  std::string spectrum_path;
  // When set, the chain table (report/chain_tables.h, ChainTable in SI
  // numbers) goes to this CSV file, written atomically; the stage must
  // have a chain.
  std::string chain_csv_path;
  // --sensitivity: print which part to change (review/sensitivity.h); the
  // JSON report always carries it.
  bool sensitivity = false;
};

inline constexpr double kSpectrumPointsPerDecade = 50;

// Prints the budget on stdout; returns an exit code (cli/exit_codes.h).
// Throws Error for bad input (the caller prints it), naming the option:
// an unknown --format, --json beside a --format other than json, or
// --chain-csv for a stage without a chain.
int RunBudgetCommand(const BudgetCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_BUDGET_COMMAND_H_
