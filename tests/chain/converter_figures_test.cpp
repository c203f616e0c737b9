// The converter's figures (chain/converter_figures.h, circuit/
// signal_chain.h) against the ideal quantizer.
#include "chain/converter_figures.h"

#include <doctest/doctest.h>

#include <cmath>

#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

ChainAdc Adc(int bits, double full_scale_v) {
  ChainAdc adc;
  adc.bits = bits;
  adc.full_scale_v = full_scale_v;
  adc.sample_rate_hz = 1e5;
  return adc;
}

TEST_CASE("an ideal N-bit converter's SNR is 6.02 N + 1.76 dB") {
  // W. R. Bennett, "Spectra of quantized signals", BSTJ 27 (1948)
  // (REFERENCES.md section 13, from memory): a full-scale sine against
  // q^2/12 gives 20 log10(2^N sqrt(1.5)) dB, which 6.02 N + 1.76 rounds.
  for (int n : {12, 16, 24}) {
    CAPTURE(n);
    const AdcFigures a = ConverterFigures(Adc(n, 4.096), 0.0);
    // The exact form, to 0.01 dB (and in fact to rounding).
    const double exact = 20 * std::log10(std::pow(2.0, n) * std::sqrt(1.5));
    CHECK(std::fabs(a.snr_db - exact) < 0.01);
    CHECK(std::fabs(a.snr_db - exact) < 1e-9);
    // The rounded rule: its constants are 20 log10 2 = 6.0206 and
    // 10 log10 1.5 = 1.7609 rounded to 6.02 and 1.76, so it runs low by
    // 0.0006 dB per bit plus 0.0009 dB (0.016 dB at 24 bits).
    const double rule = 6.02 * n + 1.76;
    CHECK(a.snr_db - rule > 0);
    CHECK(a.snr_db - rule < 0.000601 * n + 0.000914);
    // ENOB gives the bits back; the quantization noise is q / sqrt(12).
    CHECK(std::fabs(a.enob_bits - n) < 1e-9);
    CHECK(RelErr(a.quantization_rms_v,
                 4.096 / std::pow(2.0, n) / std::sqrt(12.0)) < test::kRelTight);
    CHECK(RelErr(a.noise_lsb_rms, 1 / std::sqrt(12.0)) < test::kRelTight);
    // log2(FS / rms) with rms = q / sqrt(12): N + log2(sqrt 12).
    CHECK(std::fabs(a.effective_resolution_bits -
                    (n + std::log2(std::sqrt(12.0)))) < 1e-9);
    // Noise-free bits: the same less log2(6.6), the 6.6 x rms peak-to-peak
    // (REFERENCES.md section 5, common practice).
    CHECK(std::fabs(a.noise_free_bits -
                    (n + std::log2(std::sqrt(12.0)) - std::log2(6.6))) < 1e-9);
  }
}

TEST_CASE("a 12-bit converter over 4.096 V has a 1 mV LSB") {
  // 4.096 / 4096 = 1 mV; q / sqrt(12) = 288.675 uV (hand arithmetic).
  const AdcFigures a = ConverterFigures(Adc(12, 4.096), 0.0);
  CHECK(RelErr(a.lsb_v, 1e-3) < test::kRelTight);
  CHECK(RelErr(a.quantization_rms_v, 288.6751346e-6) < 1e-9);
}

TEST_CASE("a data-sheet SNR gives back the same SNR with no analog noise") {
  // The converter's own noise from snr_dB: sqrt(n^2 - q^2/12), so adding
  // q/sqrt(12) again restores n and the SNR.
  ChainAdc adc = Adc(16, 5.0);
  adc.snr_db = 90.0;
  const AdcFigures a = ConverterFigures(adc, 0.0);
  CHECK(std::fabs(a.snr_db - 90.0) < 1e-9);
  const double n = 5.0 / (2 * std::sqrt(2.0)) * std::pow(10.0, -90.0 / 20);
  CHECK(RelErr(a.own_noise_rms_v,
               std::sqrt(n * n - a.quantization_rms_v * a.quantization_rms_v)) <
        test::kRelTight);
  // ENOB from (SINAD - 1.76) / 6.02 with the exact constants.
  CHECK(std::fabs(a.enob_bits - (90.0 - 10 * std::log10(1.5)) /
                                    (20 * std::log10(2.0))) < 1e-9);
  // At the ideal SNR the converter adds nothing to quantization.
  adc.snr_db = IdealSnrDb(16);
  CHECK(AdcOwnNoiseRmsV(adc) < 1e-9 * QuantizationRmsV(adc));
}

TEST_CASE("analog noise adds in power to the converter's") {
  ChainAdc adc = Adc(24, 5.0);
  adc.input_noise_rms_v = 1e-6;
  const double analog = 3e-6;
  const AdcFigures a = ConverterFigures(adc, analog);
  const double q = 5.0 / std::pow(2.0, 24) / std::sqrt(12.0);
  const double total = std::sqrt(analog * analog + 1e-12 + q * q);
  CHECK(RelErr(a.snr_db, 20 * std::log10(5.0 / (2 * std::sqrt(2.0)) / total)) <
        test::kRelTight);
  CHECK(RelErr(a.effective_resolution_bits, std::log2(5.0 / total)) <
        test::kRelTight);
  CHECK(RelErr(a.noise_free_bits, std::log2(5.0 / (6.6 * total))) <
        test::kRelTight);
}

}  // namespace
}  // namespace hushgain
