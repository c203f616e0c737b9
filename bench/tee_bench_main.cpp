// The T-network search benchmarks on their own.
#include "tee_search_bench.h"

int main() {
  hushgain::RunTeeSearchBenchmarks();
  return 0;
}
