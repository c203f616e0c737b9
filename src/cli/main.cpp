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

// Refuses option text that is not a whole number, before CLI11 converts it,
// so the message reads as the others: --tolerance: expected a number, ...
CLI::Validator NumberValidator() {
  return CLI::Validator(
      [](std::string& text) -> std::string {
        char* end = nullptr;
        std::strtod(text.c_str(), &end);
        if (text.empty() || end != text.c_str() + text.size())
          return "expected a number, got \"" + text + "\"";
        return "";
      },
      "NUMBER");
}

std::function<int()> DefineBudget(CLI::App* app, const GlobalOptions& global) {
  auto options = std::make_shared<BudgetCommandOptions>();
  app->add_option("stage", options->stage_path, "stage file (JSON)")
      ->required();
  app->add_flag("--json", options->json, "print the budget as one JSON object");
  app->add_option("--tolerance", options->tolerance,
                  "relative error target of the noise integral (default 1e-4)")
      ->check(NumberValidator());
  return [options, &global] {
    options->devices_dir = global.devices_dir;
    return RunBudgetCommand(*options);
  };
}

const std::vector<Command>& Commands() {
  static const std::vector<Command> commands = {
      {"budget", "noise and offset budget of a stage", DefineBudget},
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
      std::cerr << "error: "
                << Error::OneLine("unknown command \"" + word + "\"" +
                                  DidYouMean(word, names) + "; try --help")
                << "\n";
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
    std::string why = e.what();  // CLI11 starts its messages upper-case
    if (!why.empty() && why[0] >= 'A' && why[0] <= 'Z') why[0] += 'a' - 'A';
    std::cerr << "error: command line: " << Error::OneLine(why) << "\n";
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
