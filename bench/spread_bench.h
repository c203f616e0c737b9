// The spread (Monte Carlo) benchmark: `spread_tee_1e5: <s> s`.
#ifndef HUSHGAIN_BENCH_SPREAD_BENCH_H_
#define HUSHGAIN_BENCH_SPREAD_BENCH_H_

namespace hushgain {
void RunSpreadBenchmarks();
}

#endif  // HUSHGAIN_BENCH_SPREAD_BENCH_H_
