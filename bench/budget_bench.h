// The budget engine's benchmarks: one full budget of a T-network stage, the
// AC solve rate, the whole `hushgain budget` process, one plain budget.
#ifndef HUSHGAIN_BENCH_BUDGET_BENCH_H_
#define HUSHGAIN_BENCH_BUDGET_BENCH_H_

namespace hushgain::bench {

// Prints budget_tee_full, ac_solves_per_s, budget_process and
// budget_plain_full.
void RunBudgetBenchmarks();

}  // namespace hushgain::bench

#endif  // HUSHGAIN_BENCH_BUDGET_BENCH_H_
