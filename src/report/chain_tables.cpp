#include "report/chain_tables.h"

#include <cstdio>

#include "base/printf.h"
#include "chain/chain_noise.h"
#include "io/units.h"
#include "report/budget_tables.h"
#include "report/csv_report.h"
#include "report/enum_words.h"

namespace hushgain {
namespace {

std::string FilterText(const ChainBlock& c) {
  if (!c.chain.filter) return "none (the stage drives the converter)";
  const ChainFilter& f = *c.chain.filter;
  std::string out = FilterKindWord(f.kind);
  if (f.kind != ChainFilter::Kind::kNone) {
    if (f.kind != ChainFilter::Kind::kSinglePole)
      out += " order " + std::to_string(f.order);
    out += ", -3 dB at " + FormatEng(f.cutoff_hz, "Hz") + ", ENBW " +
           FormatEng(c.filter_enbw_hz, "Hz") +
           Printf(" (%.4f x cutoff)", c.filter_enbw_hz / f.cutoff_hz);
  }
  out += ", gain " + FormatGain(f.gain);
  if (f.noise_v_per_rthz > 0)
    out += ", its noise " + FormatDensity(f.noise_v_per_rthz, "V");
  return out;
}

std::string CornerText(const CornerNoise& n, const std::string& unit) {
  std::string out = FormatDensity(n.density, unit);
  if (n.corner_hz > 0)
    out += " (1/f corner " + FormatEng(n.corner_hz, "Hz") + ")";
  return out;
}

// A stage file: what its own budget found over the front stage's band.
std::string NetworkText(const ChainBlock& c) {
  const SecondStageFigures& n = *c.second_stage_network;
  std::string out = "stage file " + c.chain.second_stage->file + " (\"" +
                    n.stage_name + "\", " + n.opamp_class +
                    "), its network solved: gain " +
                    FormatGain(n.signal_gain_dc) + " at DC, " +
                    FormatGain(n.signal_gain_ref) + " at the reference, ";
  out += n.bandwidth_3db_hz > 0
             ? "-3 dB at " + FormatEng(n.bandwidth_3db_hz, "Hz")
             : std::string("no -3 dB corner found");
  out += ", noise gain " + FormatGain(n.noise_gain_ref) +
         " at the reference; driven by the front stage's output as a 0 "
         "\xCE\xA9 source";
  if (!c.second_stage_contributors.empty()) {
    const ChainNoiseShare& top = c.second_stage_contributors.front();
    out += "; its largest contributor " + top.name + " (" +
           FormatShare(top.share) + " of the total)";
  }
  return out;
}

std::string SecondStageText(const SecondStage& s) {
  std::string out = "gain " + FormatGain(s.gain) + ", noise gain " +
                    FormatGain(s.noise_gain) + ", ";
  if (s.gbw_hz > 0)
    out += "pole at " + FormatEng(s.bandwidth_hz, "Hz") + " (GBW " +
           FormatEng(s.gbw_hz, "Hz") + " / noise gain)";
  else if (s.bandwidth_hz > 0)
    out += "pole at " + FormatEng(s.bandwidth_hz, "Hz");
  else
    out += "flat (no pole)";
  out += "; e_n " + CornerText(s.input_noise, "V");
  if (s.source_resistance_ohm > 0 || s.input_current_noise.density > 0)
    out += ", i_n " + CornerText(s.input_current_noise, "A") + " through R_s " +
           FormatEng(s.source_resistance_ohm, "\xCE\xA9") + " (and its 4kTR)";
  return out;
}

}  // namespace

std::string ChainTitle(const Budget& b) {
  const ChainBlock& c = *b.chain;
  return std::to_string(c.chain.adc.bits) + " bits, " +
         FormatEng(c.chain.adc.full_scale_v, "V") +
         " full scale (peak to peak), " +
         FormatEng(c.chain.adc.sample_rate_hz, "Hz") + " sampling (Nyquist " +
         FormatEng(c.nyquist_hz, "Hz") + ")";
}

Table ChainTable(const Budget& b, ChainCells cells) {
  const ChainBlock& c = *b.chain;
  const bool csv = cells == ChainCells::kCsv;
  Table t;
  t.header =
      csv ? std::vector<std::string>{"block", "rms_V", "lsb_rms", "share"}
          : std::vector<std::string>{"block", "rms at the ADC input", "LSB rms",
                                     "share"};
  t.align = {Table::Align::kLeft, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight};
  auto row = [&](const std::string& name, double rms, double share) {
    const double lsb = rms / c.adc.lsb_v;
    if (csv)
      t.AddRow({name, CsvNumber(rms), CsvNumber(lsb), CsvNumber(share)});
    else
      t.AddRow(
          {name, FormatEng(rms, "V"), Printf("%.4g", lsb), FormatShare(share)});
  };
  for (const ChainNoiseShare& block : c.blocks)
    row(block.name, block.rms_v, block.share);
  t.AddRule();
  row("total", c.total_rms_v, 1.0);
  return t;
}

std::vector<std::pair<std::string, std::string>> ChainNotes(const Budget& b) {
  const ChainBlock& c = *b.chain;
  std::vector<std::pair<std::string, std::string>> notes;
  if (c.chain.second_stage)
    notes.push_back(
        {"second stage", c.second_stage_network
                             ? NetworkText(c)
                             : SecondStageText(*c.chain.second_stage)});
  notes.push_back({"filter", FilterText(c)});
  std::string counted = FormatEng(b.band_low_hz, "Hz") +
                        " to Nyquist: " + FormatEng(c.in_zone_rms_v, "V") +
                        " rms; folded from above it, " +
                        FormatEng(c.nyquist_hz, "Hz") + " to " +
                        FormatEng(c.counted_to_hz, "Hz") + ": " +
                        FormatEng(c.folded_rms_v, "V") + " rms";
  counted += c.fold_limited
                 ? " (the search limit: the tail had not fallen away)"
                 : Printf(" (the tail beyond is below %.0e of the noise power)",
                          c.tail_fraction);
  notes.push_back({"counted", counted});
  const std::string converter_density =
      FormatDensity(c.converter_density_v_per_rthz, "V");
  if (c.below_converter_hz <= 0)
    notes.push_back({"against the converter",
                     "the chain's noise density stays above the converter's "
                     "own (" +
                         converter_density + ") up to " +
                         FormatEng(c.counted_to_hz, "Hz")});
  else if (c.below_converter_hz <= c.nyquist_hz)
    notes.push_back({"against the converter",
                     "the chain's noise density is below the converter's "
                     "own (" +
                         converter_density + ") from Nyquist on"});
  else
    notes.push_back({"against the converter",
                     "the chain's noise density falls below the converter's "
                     "own (" +
                         converter_density + ") at " +
                         FormatEng(c.below_converter_hz, "Hz")});
  notes.push_back({"converter",
                   Printf("SNR %.2f dB (full-scale sine)", c.adc.snr_db) +
                       Printf(", ENOB %.2f bits", c.adc.enob_bits) +
                       Printf(", noise-free bits %.2f", c.adc.noise_free_bits) +
                       Printf(", effective resolution %.2f bits",
                              c.adc.effective_resolution_bits) +
                       "; 1 LSB = " + FormatEng(c.adc.lsb_v, "V")});
  std::string dominant = c.dominant;
  for (const ChainNoiseShare& block : c.blocks)
    if (block.name == c.dominant)
      dominant += " (" + FormatShare(block.share) + ")";
  const std::vector<ChainNoiseShare>* within = nullptr;
  if (c.dominant == "front end") within = &c.front_end_contributors;
  if (c.chain.second_stage &&
      c.dominant == SecondStageBlockName(*c.chain.second_stage))
    within = &c.second_stage_contributors;
  if (within && !within->empty()) {
    const ChainNoiseShare& top = within->front();
    dominant += "; its largest contributor " + top.name + " (" +
                FormatShare(top.share) + " of the total)";
  }
  notes.push_back({"dominant", dominant});
  return notes;
}

}  // namespace hushgain
