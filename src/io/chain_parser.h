// The stage file's "chain" block -> SignalChain (circuit/signal_chain.h):
//   "chain": {
//     "second_stage": {"gain": G, "noise_gain": NG, "bandwidth": f or
//                      {"gbw": f}, "input_noise": {"density", "corner"},
//                      "input_current_noise": {"density", "corner"},
//                      "source_resistance": R}
//                     or {"stage": "path/to/a stage file.json"},
//     "filter": {"kind": "butterworth" | "bessel" | "single_pole" | "none",
//                "order": n, "cutoff": f, "gain": g, "noise": e},
//     "adc": {"bits": N, "full_scale": V peak to peak, "sample_rate": f,
//             "input_noise_rms": V or "snr_dB": dB}
//   }
// "second_stage" and "filter" are optional; "adc" is required (the chain ends
// at a converter). Errors name the file and the JSON path; unknown keys and
// kinds get a "did you mean".
#ifndef HUSHGAIN_IO_CHAIN_PARSER_H_
#define HUSHGAIN_IO_CHAIN_PARSER_H_

#include <functional>
#include <memory>
#include <string>

#include "circuit/signal_chain.h"
#include "circuit/stage.h"
#include "io/json_reader.h"

namespace hushgain {

// Reads and parses the stage file `file` named at `key` of `reader` (the
// second stage's "stage"); throws Error naming the place at fault.
using SecondStageLoader = std::function<std::shared_ptr<const Stage>(
    ObjectReader& reader, const std::string& key, const std::string& file)>;

// `chain` reads the "chain" object; `band_low_hz` is the stage's band low
// edge, which must lie below the converter's Nyquist frequency; `load`
// reads a second stage given as a file. Throws Error.
SignalChain ParseChain(ObjectReader& chain, double band_low_hz,
                       const SecondStageLoader& load);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_CHAIN_PARSER_H_
