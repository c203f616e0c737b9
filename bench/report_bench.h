// Benchmarks of the pictures and tables: sampling the spectra on the plot
// grid, building the gnuplot script, and `hushgain plot` as a whole process
// (gnuplot included).
#ifndef HUSHGAIN_BENCH_REPORT_BENCH_H_
#define HUSHGAIN_BENCH_REPORT_BENCH_H_

namespace hushgain::bench {

void RunReportBenchmarks();

}  // namespace hushgain::bench

#endif  // HUSHGAIN_BENCH_REPORT_BENCH_H_
