// Benchmarks of the T-network search (printed as `name: value unit`,
// medians of repeated runs). Called by the benchmark programs.
#ifndef HUSHGAIN_BENCH_TEE_SEARCH_BENCH_H_
#define HUSHGAIN_BENCH_TEE_SEARCH_BENCH_H_

namespace hushgain {

void RunTeeSearchBenchmarks();

}  // namespace hushgain

#endif  // HUSHGAIN_BENCH_TEE_SEARCH_BENCH_H_
