#include "cli/tee_command.h"

#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <csignal>
#include <cstdio>
#include <iostream>
#include <optional>

#include "circuit/inverting_topology.h"
#include "circuit/preferred_series.h"
#include "cli/diagnostics.h"
#include "cli/draw_picture.h"
#include "cli/exit_codes.h"
#include "cli/interrupt.h"
#include "cli/option_values.h"
#include "cli/output_files.h"
#include "cli/output_format.h"
#include "cli/progress_bar.h"
#include "cli/stage_input.h"
#include "cli/text_output.h"
#include "design/tee_search.h"
#include "design/tee_sweep.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "io/suggest.h"
#include "io/units.h"
#include "report/enum_words.h"
#include "report/tee_plot_script.h"
#include "report/tee_report.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

double PositiveResistance(const std::string& option, const std::string& text) {
  const double ohms = QuantityOption(option, text, Quantity::kResistance);
  if (!(ohms > 0))
    throw OptionError(option,
                      "expected a positive resistance, got \"" + text + "\"");
  return ohms;
}

std::string SweepOutput(const std::string& format, const TeeSweepResult& r) {
  if (format == "csv") return SweepToCsv(r);
  if (format == "json") return SweepToJson(r);
  if (format == "markdown") return SweepToMarkdown(r);
  return SweepToText(r);
}

std::string SearchOutput(const std::string& format, const TeeSearchResult& r,
                         const TeeSearchQuery& q) {
  if (format == "csv") return SearchToCsv(r, q);
  if (format == "json") return SearchToJson(r, q);
  if (format == "markdown") return SearchToMarkdown(r, q);
  return SearchToText(r, q);
}

// The picture's format and gnuplot, checked before any work. Returns false
// after gnuplot's absence was explained.
bool PreparePlot(const std::string& plot_path, const std::string& who,
                 TeePlotOptions* plot, std::string* gnuplot) {
  if (plot_path.empty()) return true;
  plot->format = PictureFormat("--plot", plot_path);
  *gnuplot = GnuplotOrExplain(who);
  return !gnuplot->empty();
}

BudgetOptions BudgetWithTolerance(double tolerance) {
  BudgetOptions options;
  options.integration.relative_tolerance = tolerance;
  ThrowIfInvalid(options.Validate(), {{"relative_tolerance", "--tolerance"}});
  return options;
}

int Refused(const std::string& path, const Status& status) {
  return ReportRefusal(path, status.message);
}

// A progress bar on stderr, drawn only when stderr is a terminal.

TeeRanking ParseTeeRanking(const std::string& text) {
  std::vector<std::string> words;
  for (TeeRanking r : {TeeRanking::kInputNoise, TeeRanking::kNoise,
                       TeeRanking::kOffset, TeeRanking::kWeighted}) {
    if (text == TeeRankingWord(r)) return r;
    words.push_back(TeeRankingWord(r));
  }
  throw OptionError(
      "--rank", "unknown ranking \"" + text + "\"" + DidYouMean(text, words));
}

std::vector<double> SeriesRange(PreferredSeries series, double min_ohm,
                                double max_ohm, const std::string& min_option,
                                const std::string& max_option) {
  if (max_ohm < min_ohm)
    throw OptionError(max_option, FormatEng(max_ohm, kOhm) + " is below " +
                                      min_option + " (" +
                                      FormatEng(min_ohm, kOhm) + ")");
  std::vector<double> values = SeriesValuesInRange(series, min_ohm, max_ohm);
  if (values.empty())
    throw OptionError(min_option + "/" + max_option,
                      "no " + std::string(SeriesName(series)) +
                          " value lies between " + FormatEng(min_ohm, kOhm) +
                          " and " + FormatEng(max_ohm, kOhm));
  return values;
}

}  // namespace

int RunTeeSweepCommand(const TeeSweepCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, options.csv);
  TeeSweepOptions sweep;
  sweep.budget = BudgetWithTolerance(options.tolerance);
  sweep.points = options.points;
  ThrowIfInvalid(sweep.Validate(), {{"points", "--points"}});
  std::optional<double> min_ohm;
  if (!options.min.empty()) min_ohm = PositiveResistance("--min", options.min);
  if (!options.ratio.empty() && options.ratio != "stage") {
    std::string why;
    std::optional<double> r = ParseQuantity(options.ratio, Quantity::kRatio);
    if (!r || !(*r > 0))
      throw OptionError("--ratio",
                        "expected a positive R1/R2 ratio or "
                        "\"stage\", got \"" +
                            options.ratio + "\"");
    sweep.r1_over_r2 = *r;
  }

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  if (stage.feedback.kind != Feedback::Kind::kTee)
    throw Error(options.stage_path, "/stage/feedback",
                "tee sweep needs a T network (\"tee\"), this stage has one "
                "resistor");
  const TeeNetwork& given = stage.feedback.tee;
  if (options.ratio == "stage") sweep.r1_over_r2 = given.r1_ohm / given.r2_ohm;
  const double req = FeedbackEquivalentOhm(stage.feedback);
  if (min_ohm) {
    if (!(*min_ohm < req))
      throw OptionError("--min",
                        FormatEng(*min_ohm, kOhm) +
                            " is not below the equivalent resistance (" +
                            FormatEng(req, kOhm) + ")");
    sweep.min_largest_ohm = *min_ohm;
  }

  TeePlotOptions plot;
  std::string gnuplot;
  if (!PreparePlot(options.plot_path, "tee sweep --plot", &plot, &gnuplot))
    return kExitToolFailed;
  OutputFiles outputs;
  std::optional<OutputFiles::Id> plot_file;
  if (!options.plot_path.empty())
    plot_file = outputs.AddPicture("--plot", options.plot_path, plot.format);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));
  plot.stage_largest_ohm = std::max({given.r1_ohm, given.r2_ohm, given.r3_ohm});

  const TeeSweepResult result = SweepTee(stage, sweep);
  if (!result.status.ok) return Refused(options.stage_path, result.status);
  for (const TeeSweepRow& row : result.rows)
    ReportWarnings(row.budget.warnings,
                   "largest " + FormatEng(row.largest_ohm, kOhm));
  if (plot_file) {
    const int drawn = DrawPicture(
        gnuplot, outputs, *plot_file, [&](const std::string& temporary) {
          TeePlotOptions drawing = plot;
          drawing.output_path = temporary;
          return BuildSweepPlotScript(result, drawing);
        });
    if (drawn != kExitOk) return drawn;
  }
  if (const int written = outputs.Commit(); written != kExitOk) return written;
  WriteReport(SweepOutput(format, result), format);
  return kExitOk;
}

int RunTeeSearchCommand(const TeeSearchCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, options.csv);
  TeeSearchOptions search;
  search.budget = BudgetWithTolerance(options.tolerance);

  const std::optional<PreferredSeries> series = SeriesFromName(options.series);
  if (!series)
    throw OptionError("--series",
                      "unknown series \"" + options.series + "\"" +
                          DidYouMean(options.series, SeriesNames()));
  if (options.max.empty())
    throw OptionError("--max",
                      "required: the largest R1, R2, R3 allowed (e.g. --max "
                      "100k)");
  const double max_ohm = PositiveResistance("--max", options.max);
  const double min_ohm = options.min.empty()
                             ? max_ohm / 1000
                             : PositiveResistance("--min", options.min);
  search.values = SeriesRange(*series, min_ohm, max_ohm, "--min", "--max");

  std::optional<double> input_min;
  std::optional<double> input_max;
  if (!options.free_input) {
    if (!options.input_min.empty())
      throw OptionError("--input-min", "needs --free-input");
    if (!options.input_max.empty())
      throw OptionError("--input-max", "needs --free-input");
  } else {
    input_min = options.input_min.empty()
                    ? min_ohm
                    : PositiveResistance("--input-min", options.input_min);
    input_max = options.input_max.empty()
                    ? max_ohm
                    : PositiveResistance("--input-max", options.input_max);
    search.input_values = SeriesRange(*series, *input_min, *input_max,
                                      "--input-min", "--input-max");
  }

  search.gain_tolerance =
      QuantityOption("--gain-tol", options.gain_tolerance, Quantity::kRatio);
  if (!(search.gain_tolerance >= 0))
    throw OptionError("--gain-tol",
                      "expected a non-negative tolerance, got \"" +
                          options.gain_tolerance + "\"");
  if (!(search.gain_tolerance < 1))
    throw OptionError("--gain-tol", "expected a tolerance below 100 %, got \"" +
                                        options.gain_tolerance + "\"");
  search.ranking = ParseTeeRanking(options.rank);
  if (!(options.offset_weight >= 0 && options.offset_weight <= 1))
    throw OptionError("--offset-weight",
                      "expected a weight from 0 to 1, got " +
                          std::to_string(options.offset_weight));
  search.offset_weight = options.offset_weight;
  search.top = options.top;
  search.threads = options.threads;

  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  const Stage stage =
      LoadStageForCommand(options.stage_path, library, options.device);
  if (stage.capacitive)
    throw Error(options.stage_path, "/source/capacitive",
                "tee search needs a voltage source (its gain target is "
                "R_eq / (R_source + R_in)); tee sweep takes a capacitive "
                "sensor");
  if (stage.topology == Topology::kTransimpedance)
    throw Error(options.stage_path, "/stage/topology",
                "tee search needs a voltage source (its gain target is R_eq / "
                "(R_source + R_in)); a transimpedance stage's gain is R_eq "
                "itself, and tee sweep takes a T network there");
  if (stage.feedback.kind == Feedback::Kind::kTee &&
      stage.feedback.tee.c3_f > 0)
    throw Error(options.stage_path, "/stage/feedback/tee/c3",
                "tee search's closed forms take no C3 in series with R3; tee "
                "sweep takes one");
  if (stage.input_capacitor_f > 0)
    throw Error(options.stage_path, "/stage/input_capacitor",
                "tee search's closed forms take no input capacitor; tee sweep "
                "takes one");
  const double stage_gain =
      FeedbackEquivalentOhm(stage.feedback) /
      (stage.source.resistance_ohm + stage.input_resistor_ohm);
  search.target_gain = stage_gain;
  if (!options.gain.empty()) {
    search.target_gain =
        QuantityOption("--gain", options.gain, Quantity::kGain);
    if (!(search.target_gain > 0))
      throw OptionError(
          "--gain", "expected a positive gain, got \"" + options.gain + "\"");
  }

  ThrowIfInvalid(search.Validate(), {{"top", "--top"},
                                     {"threads", "--threads"},
                                     {"relative_tolerance", "--tolerance"}});

  TeePlotOptions plot;
  std::string gnuplot;
  if (!PreparePlot(options.plot_path, "tee search --plot", &plot, &gnuplot))
    return kExitToolFailed;
  OutputFiles outputs;
  std::optional<OutputFiles::Id> plot_file;
  if (!options.plot_path.empty())
    plot_file = outputs.AddPicture("--plot", options.plot_path, plot.format);
  outputs.Check(CommandInputs(options.stage_path, library, options.device));

  ProgressBar bar("searching");
  if (bar.enabled()) search.progress = [&bar](double f) { bar.Show(f); };
  TeeSearchResult result;
  {
    InterruptScope interrupt;
    search.cancel = interrupt.flag();
    result = SearchTee(stage, search);
  }
  bar.Clear();

  if (!result.status.ok) return Refused(options.stage_path, result.status);
  ReportWarnings(result.warnings);
  if (result.cancelled) ReportInterrupted("showing the best found so far");
  if (result.best.empty()) {
    if (result.cancelled) {
      ReportNoResult(options.stage_path,
                     "interrupted before any network was found");
      return kExitInterrupted;
    }
    char gain[32];
    std::snprintf(gain, sizeof gain, "%.6g", search.target_gain);
    char tolerance[32];
    std::snprintf(tolerance, sizeof tolerance, "%.3g %%",
                  100 * search.gain_tolerance);
    return ReportNoResult(
        options.stage_path,
        "no T network of " + std::string(SeriesName(*series)) +
            " values from " + FormatEng(min_ohm, kOhm) + " to " +
            FormatEng(max_ohm, kOhm) + " has a gain within " + tolerance +
            " of " + gain +
            "; relax --gain-tol, widen --min/--max or take a denser --series");
  }

  TeeSearchQuery query;
  query.series = std::string(SeriesName(*series));
  query.min_ohm = min_ohm;
  query.max_ohm = max_ohm;
  query.input_min_ohm = input_min;
  query.input_max_ohm = input_max;
  query.target_gain = search.target_gain;
  query.gain_tolerance = search.gain_tolerance;
  query.ranking = search.ranking;
  query.offset_weight = search.offset_weight;
  // The budgets' own warnings, once each, naming the first network (by
  // rank) that has it.
  std::vector<std::string> seen;
  for (std::size_t i = 0; i < result.best.size(); ++i)
    for (const std::string& w : result.best[i].budget.warnings) {
      if (std::find(seen.begin(), seen.end(), w) != seen.end()) continue;
      seen.push_back(w);
      ReportWarning(w, "#" + std::to_string(i + 1));
    }
  if (plot_file) {
    const int drawn = DrawPicture(
        gnuplot, outputs, *plot_file, [&](const std::string& temporary) {
          TeePlotOptions drawing = plot;
          drawing.output_path = temporary;
          return BuildSearchPlotScript(result, query, drawing);
        });
    if (drawn != kExitOk) return drawn;
  }
  if (const int written = outputs.Commit(); written != kExitOk) return written;
  WriteReport(SearchOutput(format, result, query), format);
  return result.cancelled ? kExitInterrupted : kExitOk;
}

}  // namespace hushgain
