// libFuzzer target: device files (tests/fuzz/fuzz_entry_points.h).
#include <cstdio>
#include <cstdlib>

#include "fuzz/fuzz_entry_points.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data,
                                      std::size_t size) {
  const std::string finding = hushgain::fuzz::FuzzDevice(data, size);
  if (!finding.empty()) {
    std::fprintf(stderr, "finding: %s\n", finding.c_str());
    std::abort();
  }
  return 0;
}
