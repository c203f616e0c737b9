#include "io/chain_parser.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

#include "io/suggest.h"
#include "io/units.h"

namespace hushgain {
namespace {

// A whole JSON number from `low` to `high`.
int WholeNumber(ObjectReader& reader, const std::string& key, int low,
                int high) {
  const nlohmann::json& v = reader.Get(key);
  const std::string rule = "expected a whole number from " +
                           std::to_string(low) + " to " + std::to_string(high);
  if (!v.is_number())
    throw reader.ErrorAt(key, rule + ", got " + JsonTypeName(v));
  const double d = v.get<double>();
  if (!(d >= low && d <= high && d == std::floor(d)))
    throw reader.ErrorAt(key, rule + ", got " + v.dump());
  return static_cast<int>(d);
}

double Positive(ObjectReader& reader, const std::string& key, Quantity kind,
                const std::string& what) {
  const double v = reader.Quantity(key, kind);
  if (!(v > 0))
    throw reader.ErrorAt(
        key, "expected a positive " + what + ", got " + reader.Get(key).dump());
  return v;
}

const std::vector<std::string>& FilterKinds() {
  static const std::vector<std::string> kinds = {"butterworth", "bessel",
                                                 "single_pole", "none"};
  return kinds;
}

ChainFilter ParseFilter(ObjectReader& r) {
  ChainFilter f;
  const std::string kind = r.String("kind");
  if (kind == "butterworth") {
    f.kind = ChainFilter::Kind::kButterworth;
  } else if (kind == "bessel") {
    f.kind = ChainFilter::Kind::kBessel;
  } else if (kind == "single_pole") {
    f.kind = ChainFilter::Kind::kSinglePole;
  } else if (kind == "none") {
    f.kind = ChainFilter::Kind::kNone;
  } else {
    throw r.ErrorAt("kind", "unknown filter kind \"" + kind + "\"" +
                                DidYouMean(kind, FilterKinds()) +
                                " (expected butterworth, bessel, single_pole "
                                "or none)");
  }
  if (f.kind == ChainFilter::Kind::kNone) {
    for (const char* key : {"order", "cutoff"})
      if (r.Has(key))
        throw r.ErrorAt(key, "not with a filter of kind \"none\"");
  } else if (f.kind == ChainFilter::Kind::kSinglePole) {
    f.order = r.Has("order") ? WholeNumber(r, "order", 1, 1) : 1;
    f.cutoff_hz = Positive(r, "cutoff", Quantity::kFrequency, "frequency");
  } else {
    f.order = WholeNumber(r, "order", 1, kMaxFilterOrder);
    f.cutoff_hz = Positive(r, "cutoff", Quantity::kFrequency, "frequency");
  }
  if (r.Has("gain")) f.gain = Positive(r, "gain", Quantity::kGain, "gain");
  if (auto e = r.OptionalQuantity("noise", Quantity::kVoltageDensity)) {
    if (!(*e >= 0))
      throw r.ErrorAt("noise", "expected a non-negative voltage density, got " +
                                   r.Get("noise").dump());
    f.noise_v_per_rthz = *e;
  }
  r.Finish();
  return f;
}

// {"density": ..., "corner": ...} of `kind` (a voltage or current density).
CornerNoise ParseCornerNoise(ObjectReader& parent, const std::string& key,
                             Quantity kind, const std::string& what) {
  ObjectReader r = parent.Object(key);
  CornerNoise noise;
  noise.density = r.Quantity("density", kind);
  if (!(noise.density >= 0))
    throw r.ErrorAt("density", "expected a non-negative " + what +
                                   " density, got " + r.Get("density").dump());
  if (auto corner = r.OptionalQuantity("corner", Quantity::kFrequency)) {
    if (!(*corner >= 0))
      throw r.ErrorAt("corner",
                      "expected a non-negative frequency (0 = white), got " +
                          r.Get("corner").dump());
    noise.corner_hz = *corner;
  }
  r.Finish();
  return noise;
}

SecondStage ParseSecondStage(ObjectReader& r, const SecondStageLoader& load) {
  SecondStage s;
  if (r.Has("stage")) {
    for (auto it = r.json().begin(); it != r.json().end(); ++it)
      if (it.key() != "stage")
        throw r.ErrorAt(it.key(),
                        "not with \"stage\" (the second stage file's own "
                        "network sets its gain, bandwidth and noise)");
    s.file = r.String("stage");
    if (s.file.empty())
      throw r.ErrorAt("stage", "expected the path of a stage file, got \"\"");
    s.network = load(r, "stage", s.file);
    r.Finish();
    return s;
  }
  s.gain = r.Quantity("gain", Quantity::kGain);
  if (!(s.gain != 0))
    throw r.ErrorAt("gain",
                    "expected a non-zero gain, got " + r.Get("gain").dump());
  s.noise_gain = std::fabs(s.gain);
  if (r.Has("noise_gain")) {
    s.noise_gain = r.Quantity("noise_gain", Quantity::kGain);
    if (!(s.noise_gain >= 1))
      throw r.ErrorAt("noise_gain", "expected a gain of at least 1, got " +
                                        r.Get("noise_gain").dump());
  }
  if (r.Has("bandwidth")) {
    if (r.Get("bandwidth").is_object()) {
      ObjectReader bw = r.Object("bandwidth");
      s.gbw_hz = Positive(bw, "gbw", Quantity::kFrequency, "frequency");
      bw.Finish();
      s.bandwidth_hz = s.gbw_hz / s.noise_gain;
    } else {
      s.bandwidth_hz =
          Positive(r, "bandwidth", Quantity::kFrequency, "frequency");
    }
  }
  if (r.Has("input_noise"))
    s.input_noise = ParseCornerNoise(r, "input_noise",
                                     Quantity::kVoltageDensity, "voltage");
  if (r.Has("source_resistance")) {
    s.source_resistance_ohm =
        r.Quantity("source_resistance", Quantity::kResistance);
    if (!(s.source_resistance_ohm >= 0))
      throw r.ErrorAt("source_resistance",
                      "expected a non-negative resistance, got " +
                          r.Get("source_resistance").dump());
  }
  if (r.Has("input_current_noise")) {
    if (!r.Has("source_resistance"))
      throw r.ErrorAt("input_current_noise",
                      "needs a \"source_resistance\" beside it (the "
                      "resistance the input sees)");
    s.input_current_noise = ParseCornerNoise(
        r, "input_current_noise", Quantity::kCurrentDensity, "current");
  }
  r.Finish();
  return s;
}

ChainAdc ParseAdc(ObjectReader& r, double band_low_hz) {
  ChainAdc adc;
  adc.bits = WholeNumber(r, "bits", 1, kMaxAdcBits);
  adc.full_scale_v = Positive(r, "full_scale", Quantity::kVoltage,
                              "voltage (the peak-to-peak input range)");
  adc.sample_rate_hz =
      Positive(r, "sample_rate", Quantity::kFrequency, "frequency");
  if (!(adc.sample_rate_hz > 2 * band_low_hz))
    throw r.ErrorAt("sample_rate",
                    "expected a rate above twice the band's low edge (" +
                        FormatEng(2 * band_low_hz, "Hz") + "), got " +
                        r.Get("sample_rate").dump());
  if (r.Has("input_noise_rms") && r.Has("snr_dB"))
    throw r.ErrorAt("snr_dB",
                    "expected \"input_noise_rms\" or \"snr_dB\", not both");
  if (auto n = r.OptionalQuantity("input_noise_rms", Quantity::kVoltage)) {
    if (!(*n >= 0))
      throw r.ErrorAt("input_noise_rms",
                      "expected a non-negative voltage, got " +
                          r.Get("input_noise_rms").dump());
    adc.input_noise_rms_v = *n;
  }
  if (r.Has("snr_dB")) {
    const nlohmann::json& v = r.Get("snr_dB");
    const double ideal = IdealSnrDb(adc.bits);
    char rule[160];
    std::snprintf(rule, sizeof rule,
                  "expected a number of dB above 0 and at most the ideal "
                  "%.2f dB of a %d-bit converter",
                  ideal, adc.bits);
    if (!v.is_number())
      throw r.ErrorAt("snr_dB", std::string(rule) + ", got " + JsonTypeName(v));
    const double db = v.get<double>();
    // The ideal value is printed rounded to 0.01 dB; so much is allowed.
    if (!(db > 0 && db <= ideal + 0.005))
      throw r.ErrorAt("snr_dB", std::string(rule) + ", got " + v.dump());
    adc.snr_db = std::min(db, ideal);
  }
  r.Finish();
  return adc;
}

}  // namespace

SignalChain ParseChain(ObjectReader& chain, double band_low_hz,
                       const SecondStageLoader& load) {
  SignalChain c;
  if (chain.Has("second_stage")) {
    ObjectReader second = chain.Object("second_stage");
    c.second_stage = ParseSecondStage(second, load);
  }
  if (chain.Has("filter")) {
    ObjectReader f = chain.Object("filter");
    c.filter = ParseFilter(f);
  }
  ObjectReader adc = chain.Object("adc");
  c.adc = ParseAdc(adc, band_low_hz);
  chain.Finish();
  return c;
}

}  // namespace hushgain
