// The valid stage that the bad-input tests break one thing at a time
// (tests/cli/cli_test.cpp, tests/cli/bad_input_test.cpp).
#ifndef HUSHGAIN_TESTS_CLI_BASE_STAGE_H_
#define HUSHGAIN_TESTS_CLI_BASE_STAGE_H_

namespace hushgain::test {

inline const char* BadInputBaseStageText() {
  return R"({
    "name": "bad-input test stage",
    "temperature_C": 25,
    "band_Hz": {"low": "10", "high": "1k"},
    "opamp": {"device": "zero-drift"},
    "source": {"voltage": {"resistance": "100"}},
    "stage": {
      "topology": "inverting",
      "input_resistor": "1k",
      "feedback": {"resistor": "100k"},
      "load": "10k"
    }
  })";
}

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_BASE_STAGE_H_
