// The converter's figures for the total noise at its input (the formulas
// are stated with AdcFigures in budget/chain_block.h): LSB, quantization,
// its own noise, noise in LSB, SNR, ENOB, noise-free bits and effective
// resolution. A small pure function, so the ideal converter's
// 20 log10(2^N sqrt(1.5)) can be checked on it alone.
#ifndef HUSHGAIN_CHAIN_CONVERTER_FIGURES_H_
#define HUSHGAIN_CHAIN_CONVERTER_FIGURES_H_

#include "budget/chain_block.h"
#include "circuit/signal_chain.h"

namespace hushgain {

// `analog_rms_v`: the noise reaching the converter's input from everything
// before it; the converter's own noise and q / sqrt(12) are added in power.
AdcFigures ConverterFigures(const ChainAdc& adc, double analog_rms_v);

// (SINAD - 10 log10 1.5) / (20 log10 2): bits for a SINAD in dB.
double EffectiveBits(double sinad_db);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_CONVERTER_FIGURES_H_
