// Count and seed options on the command line: each has a documented range
// (README, "Ranges of the count options"), and a value outside it, or one
// that is not a plain whole number, is one line naming the option and exit
// 2, before any work starts. Before the ranges existed, --samples 2147483648
// and --threads 100000 aborted with "terminate called ..." (bad_alloc,
// system_error), and --seed -1 silently became 2^64 - 1.
#include <doctest/doctest.h>

#include <string>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

using test::ExamplePath;
using test::RunBinary;
using test::RunResult;

struct BadCount {
  std::vector<std::string> args;
  std::string
      message;  // the whole stderr line, without "error: command line: "
};

TEST_CASE("count options outside their range are one line and exit 2") {
  const std::string tee = ExamplePath("geophone-preamp");
  const std::string tia = ExamplePath("smoke-chamber-receiver");
  const std::vector<BadCount> cases = {
      {{"spread", tee, "--samples", "2147483648"},
       "--samples: expected 1 to 100000000, got 2147483648"},
      {{"spread", tee, "--samples", "1000000000000"},
       "--samples: expected 1 to 100000000, got 1000000000000"},
      {{"spread", tee, "--samples", "99999999999999999999"},
       "--samples: expected a whole number from -9223372036854775808 to "
       "9223372036854775807, got \"99999999999999999999\""},
      {{"spread", tee, "--samples", "1e3"},
       "--samples: expected a whole number, got \"1e3\""},
      {{"spread", tee, "--threads", "100000"},
       "--threads: expected 0 (all) to 256, got 100000"},
      {{"spread", tee, "--samples", "10", "--seed", "-1"},
       "--seed: expected a whole number from 0 to 18446744073709551615, got "
       "\"-1\""},
      {{"spread", tee, "--samples", "10", "--seed", "18446744073709551616"},
       "--seed: expected a whole number from 0 to 18446744073709551615, got "
       "\"18446744073709551616\""},
      {{"tee", "search", tee, "--max", "100k", "--threads", "100000"},
       "--threads: expected 0 (every core) to 256, got 100000"},
      {{"tee", "search", tee, "--max", "100k", "--top", "0"},
       "--top: expected 1 to 10000, got 0"},
      {{"tee", "search", tee, "--max", "100k", "--top", "2x"},
       "--top: expected a whole number, got \"2x\""},
      {{"tee", "sweep", tee, "--points", "100000"},
       "--points: expected 2 to 10000, got 100000"},
      {{"tia", "suggest", tia, "--bandwidth", "10k", "--rows", "5000"},
       "--rows: expected 1 to 1000, got 5000"},
      {{"tia", "snr", tia, "--power-range", "1n..1m", "--points", "20000"},
       "--points: expected 2 to 10000, got 20000"},
  };
  for (const BadCount& c : cases) {
    CAPTURE(c.message);
    const RunResult r = RunBinary(HUSHGAIN_BINARY, c.args);
    CHECK(r.exit_code == 2);
    CHECK(r.err == "error: command line: " + c.message + "\n");
    CHECK(r.out.empty());
  }
}

TEST_CASE("the largest seed is accepted as given") {
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY,
                {"spread", ExamplePath("geophone-preamp"), "--samples", "20",
                 "--seed", "18446744073709551615", "--format", "json"});
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("18446744073709551615") != std::string::npos);
}

}  // namespace
}  // namespace hushgain
