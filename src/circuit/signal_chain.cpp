#include "circuit/signal_chain.h"

#include <algorithm>
#include <cmath>

namespace hushgain {

double AdcLsbV(const ChainAdc& adc) {
  return adc.full_scale_v / std::ldexp(1.0, adc.bits);
}

double QuantizationRmsV(const ChainAdc& adc) {
  return AdcLsbV(adc) / std::sqrt(12.0);
}

double IdealSnrDb(int bits) {
  // 20 log10(2^N) + 10 log10(1.5), kept exact rather than 6.02 N + 1.76.
  return 20.0 * bits * std::log10(2.0) + 10.0 * std::log10(1.5);
}

double AdcOwnNoiseRmsV(const ChainAdc& adc) {
  if (adc.input_noise_rms_v) return *adc.input_noise_rms_v;
  if (!adc.snr_db) return 0;
  const double sine_rms = adc.full_scale_v / (2.0 * std::sqrt(2.0));
  const double noise = sine_rms * std::pow(10.0, -*adc.snr_db / 20.0);
  const double q_rms = QuantizationRmsV(adc);
  // At the ideal SNR the difference is rounding around zero.
  return std::sqrt(std::max(0.0, noise * noise - q_rms * q_rms));
}

}  // namespace hushgain
