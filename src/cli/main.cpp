// hushgain: noise and offset budgets of high-gain inverting op-amp stages.
// The subcommands come from one table, so --help and "did you mean" agree.
#include <CLI/CLI.hpp>
#include <cstdlib>
#include <functional>
#include <iostream>
#include <string>
#include <vector>

#include "cli/budget_command.h"
#include "cli/exit_codes.h"
#include "cli/spread_command.h"
#include "io/error.h"
#include "io/suggest.h"

#ifndef HUSHGAIN_DEFAULT_DEVICE_DIR
#define HUSHGAIN_DEFAULT_DEVICE_DIR "devices"
#endif

namespace hushgain {
namespace {

struct GlobalOptions {
  std::string devices_dir;
};

struct Command {
  const char* name;
  const char* help;
  // Declares the subcommand's options on `app`; returns the handler to run
  // after parsing.
  std::function<std::function<int()>(CLI::App* app,
                                     const GlobalOptions& global)>
      define;
};

std::function<int()> DefineBudget(CLI::App* app, const GlobalOptions& global) {
  auto options = std::make_shared<BudgetCommandOptions>();
  app->add_option("stage", options->stage_path, "stage file (JSON)")
      ->required();
  app->add_flag("--json", options->json, "print the budget as one JSON object");
  app->add_option("--tolerance", options->tolerance,
                  "relative error target of the noise integral (default 1e-4)");
  return [options, &global] {
    options->devices_dir = global.devices_dir;
    return RunBudgetCommand(*options);
  };
}

std::function<int()> DefineSpread(CLI::App* app, const GlobalOptions& global) {
  auto o = std::make_shared<SpreadCommandOptions>();
  app->add_option("stage", o->stage_path, "stage file (JSON)")->required();
  app->add_option("--samples", o->samples, "number of Monte Carlo samples (default 10000)");
  app->add_option("--seed", o->seed, "seed of the random streams (default 1)");
  app->add_option("--threads", o->threads, "worker threads (default 0: all)");
  app->add_option("--csv", o->csv_path, "write every sample to this CSV file");
  app->add_option("--gain-error-limit", o->gain_error_limit, "yield limit on |gain error|, e.g. 0.5%");
  app->add_option("--offset-limit", o->offset_limit, "yield limit on |output offset|, e.g. 5m");
  app->add_option("--noise-limit", o->noise_limit, "yield limit on the output noise rms, e.g. 100u");
  return [o, &global] {
    o->devices_dir = global.devices_dir;
    return RunSpreadCommand(*o);
  };
}

const std::vector<Command>& Commands() {
  static const std::vector<Command> commands = {
      {"budget", "noise and offset budget of a stage", DefineBudget},
      {"spread", "Monte Carlo over tolerances, offsets and temperature", DefineSpread},
  };
  return commands;
}

std::string DefaultDeviceDir() {
  if (const char* env = std::getenv("HUSHGAIN_DEVICES")) return env;
  return HUSHGAIN_DEFAULT_DEVICE_DIR;
}

int Run(int argc, char** argv) {
  CLI::App app{
      "hushgain: noise and offset budgets of inverting op-amp front ends"};
  app.require_subcommand(1);
  GlobalOptions global;
  global.devices_dir = DefaultDeviceDir();
  app.add_option("--devices", global.devices_dir, "device folder")
      ->capture_default_str();

  std::vector<std::string> names;
  std::function<int()> handler;
  for (const Command& command : Commands()) {
    names.push_back(command.name);
    CLI::App* sub = app.add_subcommand(command.name, command.help);
    auto run = command.define(sub, global);
    sub->callback([&handler, run] { handler = run; });
  }
  // An unknown subcommand gets a suggestion from the same table.
  for (int i = 1; i < argc; ++i) {
    std::string word = argv[i];
    if (word.empty() || word[0] == '-') {
      if (word == "--devices") ++i;
      continue;
    }
    bool known = false;
    for (const std::string& n : names) known = known || n == word;
    if (!known) {
      std::cerr << "error: unknown command \"" << word << "\""
                << DidYouMean(word, names) << "; try --help\n";
      return kExitUsage;
    }
    break;
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    if (e.get_exit_code() == 0) return app.exit(e);
    std::cerr << "error: " << e.what() << "\n";
    return kExitUsage;
  }
  return handler ? handler() : kExitUsage;
}

}  // namespace
}  // namespace hushgain

int main(int argc, char** argv) {
  try {
    return hushgain::Run(argc, argv);
  } catch (const hushgain::Error& e) {
    std::cerr << "error: " << e.what() << "\n";
    return hushgain::kExitUsage;
  }
}
