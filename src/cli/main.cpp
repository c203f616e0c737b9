// hushgain: noise and offset budgets of high-gain inverting op-amp stages.
// The whole command line is RunCli (cli/run_cli.h), which the fuzz target of
// the command line calls in-process too.
#include <iostream>

#include "cli/run_cli.h"

int main(int argc, char** argv) {
  return hushgain::RunCli(argc, argv, std::cout, std::cerr);
}
