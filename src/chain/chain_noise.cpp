#include "chain/chain_noise.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <optional>

#include "base/printf.h"
#include "chain/converter_figures.h"
#include "chain/filter_response.h"
#include "chain/second_stage.h"

namespace hushgain {
namespace {

// The fold's step: half a decade.
constexpr double kFoldStep = 3.1622776601683795;
// The local slope is read over this ratio of frequencies.
constexpr double kSlopeRatio = 1.1;
// Steps in a row whose tail must be negligible before the count stops.
constexpr int kQuietSteps = 2;

Status Integrate(const ChainDensities& integrand, double a, double b,
                 const IntegrationOptions& options, std::vector<double>* sum) {
  IntegrationResult r = IntegrateBand(
      a, b, integrand.components(),
      [&](double f, double* out) { return integrand(f, out); }, options);
  if (!r.status.ok) return r.status;
  for (std::size_t k = 0; k < sum->size(); ++k) {
    if (!std::isfinite(r.integrals[k]))
      return Status::Fail("the chain's noise between " + HzText(a) + " and " +
                          HzText(b) + " is not finite");
    (*sum)[k] += r.integrals[k];
  }
  return Status::Ok();
}

// The frequency in [a, b] where the total density falls through `level`
// (total(a) >= level > total(b)), by bisection in log f.
Status Crossing(const ChainDensities& integrand, double a, double b,
                double level, double* f_hz) {
  for (int i = 0; i < 60 && b / a > 1 + 1e-9; ++i) {
    const double mid = std::sqrt(a * b);
    double s_mid = 0;
    Status s = integrand.Total(mid, &s_mid);
    if (!s.ok) return s;
    (s_mid >= level ? a : b) = mid;
  }
  *f_hz = std::sqrt(a * b);
  return Status::Ok();
}

// The tail beyond f of a density S(f) falling as f^-m: S f / (m - 1).
Status TailEstimate(const ChainDensities& integrand, double f_hz, double s_at_f,
                    double* tail) {
  if (s_at_f <= 0) {
    *tail = 0;
    return Status::Ok();
  }
  double s_next = 0;
  Status s = integrand.Total(f_hz * kSlopeRatio, &s_next);
  if (!s.ok) return s;
  const double m = s_next > 0
                       ? std::log(s_at_f / s_next) / std::log(kSlopeRatio)
                       : std::numeric_limits<double>::infinity();
  *tail =
      m > 1 ? s_at_f * f_hz / (m - 1) : std::numeric_limits<double>::infinity();
  return Status::Ok();
}

}  // namespace

std::string SecondStageBlockName(const SecondStage& second) {
  return second.is_network() ? "second stage " + second.file : "second stage";
}

ChainDensities::ChainDensities(const FrontEndSpectra& front_end,
                               const SignalChain& chain, double temperature_k,
                               const SecondStageSpectra* network)
    : front_end_(front_end),
      second_(chain.second_stage),
      network_(second_ && second_->is_network() ? network : nullptr),
      filter_(chain.filter ? *chain.filter : ChainFilter{}),
      temperature_k_(temperature_k),
      n_(static_cast<int>(front_end.names.size())),
      m_(network_ ? static_cast<int>(network_->names.size()) : 1) {
  assert(!(second_ && second_->is_network()) || network_);
}

Status ChainDensities::operator()(double f_hz, double* out) const {
  Status s = front_end_.densities(f_hz, out);
  if (!s.ok) return s;
  const double h2 = filter_.PowerGain(f_hz);
  double g2 = 1;
  if (network_) {
    s = network_->densities(f_hz, &g2, out + n_);
    if (!s.ok) return s;
    for (int j = 0; j < m_; ++j) out[n_ + j] *= h2;
  } else if (second_) {
    g2 = SecondStagePowerGain(*second_, f_hz);
    out[n_] = SecondStageNoisePsd(*second_, f_hz, temperature_k_) * h2;
  } else {
    out[n_] = 0;
  }
  for (int k = 0; k < n_; ++k) out[k] *= g2 * h2;
  const double e = filter_.filter().noise_v_per_rthz;
  out[n_ + m_] = e * e * h2;
  return s;
}

Status ChainDensities::Total(double f_hz, double* total) const {
  std::vector<double> psd(components());
  Status s = (*this)(f_hz, psd.data());
  *total = 0;
  for (double v : psd) *total += v;
  return s;
}

std::string ChainNoiseOptions::Validate() const {
  if (!(band_low_hz > 0 && std::isfinite(band_low_hz)))
    return Printf("band_low_hz: expected a positive frequency, got %g",
                  band_low_hz);
  if (!(temperature_k > 0 && std::isfinite(temperature_k)))
    return Printf("temperature_k: expected a positive temperature, got %g",
                  temperature_k);
  if (!(tail_fraction > 0 && tail_fraction < 1))
    return Printf("tail_fraction: expected a fraction in (0, 1), got %g",
                  tail_fraction);
  if (!(search_decades > 0 && search_decades <= 12))
    return Printf("search_decades: expected a count in (0, 12], got %g",
                  search_decades);
  return integration.Validate();
}

ChainNoiseOutcome ComputeChainNoise(const FrontEndSpectra& front_end,
                                    const SignalChain& chain,
                                    const ChainNoiseOptions& options,
                                    const SecondStageSpectra* network) {
  assert(options.Validate().empty());
  ChainNoiseOutcome outcome;
  ChainBlock& c = outcome.block;
  c.chain = chain;
  c.tail_fraction = options.tail_fraction;
  const ChainDensities integrand(front_end, chain, options.temperature_k,
                                 network);
  const int n = static_cast<int>(front_end.names.size());
  const int m = integrand.second_stage_components();
  const bool is_network =
      chain.second_stage && chain.second_stage->is_network();
  double second_gain = 1;
  if (is_network)
    second_gain = network->passband_gain;
  else if (chain.second_stage)
    second_gain = std::fabs(chain.second_stage->gain);
  c.filter_enbw_hz = NoiseBandwidthHz(integrand.filter());
  c.chain_gain_dc = (chain.filter ? chain.filter->gain : 1.0) * second_gain;
  c.nyquist_hz = chain.adc.sample_rate_hz / 2;
  if (!(options.band_low_hz < c.nyquist_hz)) {
    outcome.status =
        Status::Fail("the band's low edge (" + HzText(options.band_low_hz) +
                     ") is not below the converter's Nyquist frequency (" +
                     HzText(c.nyquist_hz) + ")");
    return outcome;
  }
  const double q_rms = QuantizationRmsV(chain.adc);
  const double own_rms = AdcOwnNoiseRmsV(chain.adc);
  const double converter_power = q_rms * q_rms + own_rms * own_rms;
  const double converter_psd = converter_power / c.nyquist_hz;
  c.converter_density_v_per_rthz = std::sqrt(converter_psd);

  std::vector<double> in_zone(integrand.components(), 0.0);
  Status s = Integrate(integrand, options.band_low_hz, c.nyquist_hz,
                       options.integration, &in_zone);
  std::vector<double> folded(integrand.components(), 0.0);
  double s_a = 0;
  if (s.ok) s = integrand.Total(c.nyquist_hz, &s_a);
  if (s.ok && s_a < converter_psd) c.below_converter_hz = c.nyquist_hz;
  const double limit_hz = c.nyquist_hz * std::pow(10.0, options.search_decades);
  double a = c.nyquist_hz;
  int quiet = 0;
  while (s.ok) {
    const double b = std::min(a * kFoldStep, limit_hz);
    s = Integrate(integrand, a, b, options.integration, &folded);
    double s_b = 0;
    if (s.ok) s = integrand.Total(b, &s_b);
    if (s.ok && c.below_converter_hz == 0 && s_b < converter_psd)
      s = Crossing(integrand, a, b, converter_psd, &c.below_converter_hz);
    double tail = 0;
    if (s.ok) s = TailEstimate(integrand, b, s_b, &tail);
    if (!s.ok) break;
    double power = converter_power;
    for (int k = 0; k < integrand.components(); ++k)
      power += in_zone[k] + folded[k];
    quiet = tail <= options.tail_fraction * power ? quiet + 1 : 0;
    c.counted_to_hz = b;
    if (quiet >= kQuietSteps) break;
    if (b >= limit_hz) {
      c.fold_limited = true;
      break;
    }
    a = b;
    s_a = s_b;
  }
  if (!s.ok) {
    outcome.status = s;
    return outcome;
  }

  double front_power = 0, in_zone_power = 0, folded_power = 0;
  for (int k = 0; k < integrand.components(); ++k) {
    in_zone_power += in_zone[k];
    folded_power += folded[k];
  }
  for (int k = 0; k < n; ++k) front_power += in_zone[k] + folded[k];
  double second_power = 0;
  for (int j = n; j < n + m; ++j) second_power += in_zone[j] + folded[j];
  const double filter_power = in_zone[n + m] + folded[n + m];
  const double analog_power = in_zone_power + folded_power;
  const double total_power = analog_power + converter_power;
  c.analog_rms_v = std::sqrt(analog_power);
  c.total_rms_v = std::sqrt(total_power);
  c.in_zone_rms_v = std::sqrt(in_zone_power);
  c.folded_rms_v = std::sqrt(folded_power);
  auto share = [&](const std::string& name, double power) {
    return ChainNoiseShare{name, std::sqrt(power),
                           total_power > 0 ? power / total_power : 0};
  };
  c.blocks.push_back(share("front end", front_power));
  if (chain.second_stage)
    c.blocks.push_back(
        share(SecondStageBlockName(*chain.second_stage), second_power));
  if (chain.filter) c.blocks.push_back(share("filter", filter_power));
  c.blocks.push_back(share("converter", own_rms * own_rms));
  c.blocks.push_back(share("quantization", q_rms * q_rms));
  for (int k = 0; k < n; ++k)
    c.front_end_contributors.push_back(
        share(front_end.names[k], in_zone[k] + folded[k]));
  auto largest_first = [](std::vector<ChainNoiseShare>* list) {
    std::stable_sort(list->begin(), list->end(),
                     [](const ChainNoiseShare& l, const ChainNoiseShare& r) {
                       return l.share > r.share;
                     });
  };
  largest_first(&c.front_end_contributors);
  if (is_network) {
    for (int j = 0; j < m; ++j)
      c.second_stage_contributors.push_back(
          share(network->names[j], in_zone[n + j] + folded[n + j]));
    largest_first(&c.second_stage_contributors);
  }
  const auto top =
      std::max_element(c.blocks.begin(), c.blocks.end(),
                       [](const ChainNoiseShare& l, const ChainNoiseShare& r) {
                         return l.share < r.share;
                       });
  c.dominant = top->name;
  c.adc = ConverterFigures(chain.adc, c.analog_rms_v);
  outcome.status = Status::Ok();
  return outcome;
}

}  // namespace hushgain
