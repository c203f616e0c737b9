#include "chain/converter_figures.h"

#include <cmath>

#include "budget/budget.h"

namespace hushgain {

double EffectiveBits(double sinad_db) {
  return (sinad_db - 10.0 * std::log10(1.5)) / (20.0 * std::log10(2.0));
}

AdcFigures ConverterFigures(const ChainAdc& adc, double analog_rms_v) {
  AdcFigures a;
  a.lsb_v = AdcLsbV(adc);
  a.quantization_rms_v = QuantizationRmsV(adc);
  a.own_noise_rms_v = AdcOwnNoiseRmsV(adc);
  const double n = std::sqrt(analog_rms_v * analog_rms_v +
                             a.own_noise_rms_v * a.own_noise_rms_v +
                             a.quantization_rms_v * a.quantization_rms_v);
  const double fs = adc.full_scale_v;
  a.noise_lsb_rms = n / a.lsb_v;
  a.snr_db = 20.0 * std::log10(fs / (2.0 * std::sqrt(2.0)) / n);
  a.enob_bits = EffectiveBits(a.snr_db);
  a.noise_free_bits = std::log2(fs / (kPeakToPeakPerRms * n));
  a.effective_resolution_bits = std::log2(fs / n);
  return a;
}

}  // namespace hushgain
