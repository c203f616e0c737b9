// The signal chain after the stage, as the stage file's "chain" block
// describes it: the stage's output drives an optional second gain stage,
// an optional anti-aliasing filter and then an analog-to-digital converter. A
// plain value held by Stage (no chain: the budget ends at the stage's output,
// band-limited by a brick wall at the band's edges, as before). The chain's
// noise is computed in chain/; here are the blocks and the converter's own
// textbook figures.
//
// Converter conventions (full_scale_v is the peak-to-peak input range):
//   q            = full_scale_v / 2^bits                 (one LSB)
//   quantization = q / sqrt(12) rms                       (uniform error)
//   ideal SNR    = 20 log10(2^bits sqrt(1.5)) dB for a full-scale sine,
//                  which 6.02 bits + 1.76 rounds (W. R. Bennett, "Spectra
//                  of quantized signals", Bell System Technical Journal 27,
//                  446-472, 1948)
#ifndef HUSHGAIN_CIRCUIT_SIGNAL_CHAIN_H_
#define HUSHGAIN_CIRCUIT_SIGNAL_CHAIN_H_

#include <memory>
#include <optional>
#include <string>

namespace hushgain {

struct Stage;  // circuit/stage.h

// A low-pass filter in front of the converter. Its response multiplies
// every noise that reaches it; its own noise is a white density at its
// input. The cutoff is the -3 dB frequency for every kind (a Bessel filter
// is scaled to it, not to its group delay).
struct ChainFilter {
  enum class Kind { kNone, kButterworth, kBessel, kSinglePole };
  Kind kind = Kind::kNone;
  int order = 0;                // 1 for a single pole, 0 for none
  double cutoff_hz = 0;         // -3 dB; 0 for none
  double gain = 1;              // passband (DC) gain, V/V, > 0
  double noise_v_per_rthz = 0;  // white, at the filter's input
};

// The converter at the end of the chain.
struct ChainAdc {
  int bits = 0;             // 1 .. kMaxAdcBits
  double full_scale_v = 0;  // peak-to-peak input range
  double sample_rate_hz = 0;
  // Its own noise apart from quantization, given either way or not at all
  // (an ideal converter): input_noise_rms_v directly, or snr_db, the data
  // sheet's SNR for a full-scale sine, which includes the quantization.
  std::optional<double> input_noise_rms_v;
  std::optional<double> snr_db;
};

// A white density with a 1/f corner: density^2 (1 + corner / f).
struct CornerNoise {
  double density = 0;
  double corner_hz = 0;  // 0 = white
};

// A second gain block between the stage and the filter: a signal gain
// `gain` with one pole at bandwidth_hz (0 = flat), and its own noise at its
// input: e_n (input_noise), reaching its output times noise_gain (default
// |gain|, as for a non-inverting stage; 1 + |gain| for an inverting one),
// and i_n (input_current_noise) through the source resistance it sees,
// with that resistance's thermal noise 4kTR, both reaching its output times
// |gain|. Its output for a signal and for each noise:
//   |G2(f)|^2 = gain^2 / (1 + (f / bandwidth)^2)
//   S_2(f)    = (e_n^2 noise_gain^2 + (i_n^2 R_s^2 + 4kT R_s) gain^2)
//               / (1 + (f / bandwidth)^2)
struct SecondStage {
  double gain = 1;        // V/V, signed (negative: inverting)
  double noise_gain = 1;  // >= 1
  // The pole: given directly, or the op-amp's GBW over the noise gain
  // (gbw_hz > 0 then, and bandwidth_hz = gbw_hz / noise_gain).
  double bandwidth_hz = 0;  // 0 = flat (no pole)
  double gbw_hz = 0;
  CornerNoise input_noise;          // V/rtHz
  CornerNoise input_current_noise;  // A/rtHz
  double source_resistance_ohm = 0;

  // Or a stage file ("second_stage": {"stage": path}): that file's own
  // network, solved by the engine (chain/second_stage_network.h), and then
  // the fields above are unused. `file` is the path as the stage file
  // writes it (the block's name in the chain table); `network` the stage
  // it holds, as parsed (at 25 degC; never null when `file` is set).
  std::string file;
  std::shared_ptr<const Stage> network;

  bool is_network() const { return network != nullptr; }
};

struct SignalChain {
  std::optional<SecondStage> second_stage;  // none: straight to the filter
  std::optional<ChainFilter> filter;  // none: the stage drives the converter
  ChainAdc adc;
};

inline constexpr int kMaxAdcBits = 32;
inline constexpr int kMaxFilterOrder = 10;

// One LSB, q = full_scale_v / 2^bits.
double AdcLsbV(const ChainAdc& adc);

// q / sqrt(12).
double QuantizationRmsV(const ChainAdc& adc);

// 20 log10(2^bits sqrt(1.5)): an ideal converter's SNR for a full-scale
// sine (rms full_scale_v / (2 sqrt 2)) against q / sqrt(12).
double IdealSnrDb(int bits);

// The converter's own noise apart from quantization, V rms: the given
// input_noise_rms_v; or from snr_db, sqrt(n^2 - q^2 / 12) with n the noise
// that SNR leaves under a full-scale sine; or 0. Requires snr_db at most
// IdealSnrDb(bits) (the parser refuses more).
double AdcOwnNoiseRmsV(const ChainAdc& adc);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_SIGNAL_CHAIN_H_
