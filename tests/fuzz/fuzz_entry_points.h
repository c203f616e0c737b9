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
// Memory errors and undefined behaviour are the sanitizers' to catch.
#ifndef HUSHGAIN_TESTS_FUZZ_FUZZ_ENTRY_POINTS_H_
#define HUSHGAIN_TESTS_FUZZ_FUZZ_ENTRY_POINTS_H_

#include <cstddef>
#include <cstdint>
#include <string>

namespace hushgain::fuzz {

std::string FuzzQuantity(const std::uint8_t* data, std::size_t size);
std::string FuzzStage(const std::uint8_t* data, std::size_t size);

}  // namespace hushgain::fuzz

#endif  // HUSHGAIN_TESTS_FUZZ_FUZZ_ENTRY_POINTS_H_
