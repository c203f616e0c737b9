// The entry points shared by the libFuzzer targets (tests/fuzz/*_fuzz.cpp)
// and the corpus regression test (tests/fuzz/corpus_test.cpp), so CI runs
// every corpus file through exactly what the fuzzers ran, without clang.
//
// Each takes arbitrary bytes and returns "" when the code under test kept
// its contract, or a one-line description of the breach (a finding):
//   FuzzQuantity  first byte picks the Quantity kind (mod the kind count),
//                 the rest is the text for ParseQuantity. Contract: returns
//                 a finite value or nullopt with a reason; never throws;
//                 FormatEng of any accepted value does not throw.
//   FuzzStage     the bytes are a stage file for ParseStage with a fixed
//                 in-memory device library (no file is read). Contract: only
//                 hushgain::Error escapes, its text is one line naming the
//                 source; an accepted stage has finite values inside the
//                 documented rules, and expands into a netlist that builds
//                 and solves (or fails with a Status) at the band's edges.
//   FuzzDevice    the bytes are a device file, read as an op-amp and as a
//                 resistor technology. Contract: only hushgain::Error escapes,
//                 as one line naming the file; at most one kind accepts it;
//                 an accepted op-amp keeps every documented rule (finite,
//                 non-negative densities, valid noise tables), its detail
//                 and list reports format in every format, and it drives a
//                 transimpedance and a tee stage that parse, solve and
//                 budget to numbers (or are refused in one line).
//   FuzzCli       the bytes build an argument vector for one command
//                 (budget, tee sweep/search, tia suggest/snr, plot, spread,
//                 compare, devices, note): the command, usually a stage
//                 file, then options with values from per-kind lists of
//                 good and bad spellings or the fuzzer's own text. Counts
//                 above a small cap (within the documented range) are
//                 capped, so a run stays short. RunCli runs in-process in a
//                 scratch folder (copies of examples and devices/; PATH an
//                 empty folder, so no gnuplot is found and nothing is
//                 spawned: pictures end as "missing tool", exit 3).
//                 Contract: no exception escapes; a documented exit code;
//                 stderr only "error:" and "warning:" lines, one error line
//                 exactly when the exit code is not 0; no report with exit
//                 2; a failed run changes no file; a successful one changes
//                 only files named as outputs and never its stage or device
//                 file; no temporary is left, in the folder or in TMPDIR.
// Memory errors and undefined behaviour are the sanitizers' to catch.
#ifndef HUSHGAIN_TESTS_FUZZ_FUZZ_ENTRY_POINTS_H_
#define HUSHGAIN_TESTS_FUZZ_FUZZ_ENTRY_POINTS_H_

#include <cstddef>
#include <cstdint>
#include <string>

namespace hushgain::fuzz {

std::string FuzzQuantity(const std::uint8_t* data, std::size_t size);
std::string FuzzStage(const std::uint8_t* data, std::size_t size);
std::string FuzzDevice(const std::uint8_t* data, std::size_t size);
std::string FuzzCli(const std::uint8_t* data, std::size_t size);

}  // namespace hushgain::fuzz

#endif  // HUSHGAIN_TESTS_FUZZ_FUZZ_ENTRY_POINTS_H_
