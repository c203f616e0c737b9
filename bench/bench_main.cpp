// The benchmark binary that scripts/bench runs. Every figure is printed as
// one line `name: value unit`, each a median of repeated runs; nothing is
// asserted. To add benchmarks: write bench/<topic>_bench.{h,cpp} with one
// `void Run<Topic>Benchmarks()` that prints its figures, add the .cpp to
// hushgain_bench in CMakeLists.txt and one row to the table below.
// `hushgain_bench NAME...` runs only the named groups.
#include <cstdio>
#include <cstring>

#include "bench/budget_bench.h"
#include "bench/report_bench.h"
#include "bench/spread_bench.h"
#include "bench/tee_search_bench.h"

namespace {

struct BenchmarkGroup {
  const char* name;
  void (*run)();
};

// In the order they print; budget first (its first line is budget_tee_full).
constexpr BenchmarkGroup kGroups[] = {
    {"budget", hushgain::bench::RunBudgetBenchmarks},
    {"tee", hushgain::RunTeeSearchBenchmarks},
    {"spread", hushgain::RunSpreadBenchmarks},
    {"report", hushgain::bench::RunReportBenchmarks},
};

bool Selected(const char* name, int argc, char** argv) {
  if (argc < 2) return true;
  for (int i = 1; i < argc; ++i)
    if (std::strcmp(argv[i], name) == 0) return true;
  return false;
}

}  // namespace

int main(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    bool known = false;
    for (const BenchmarkGroup& g : kGroups)
      known = known || std::strcmp(argv[i], g.name) == 0;
    if (!known) {
      std::fprintf(stderr, "error: command line: unknown benchmark \"%s\"\n",
                   argv[i]);
      return 2;
    }
  }
  for (const BenchmarkGroup& g : kGroups)
    if (Selected(g.name, argc, argv)) g.run();
  return 0;
}
