// The command line of hushgain in-process (cli/run_cli.h). The subcommands
// come from one table, so --help and "did you mean" agree.
#include "cli/run_cli.h"

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cctype>
#include <charconv>
#include <cstdlib>
#include <functional>
#include <iostream>
#include <new>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "cli/budget_command.h"
#include "cli/compare_command.h"
#include "cli/device_folder.h"
#include "cli/devices_command.h"
#include "cli/exit_codes.h"
#include "cli/note_command.h"
#include "cli/option_values.h"
#include "cli/plot_command.h"
#include "cli/spread_command.h"
#include "cli/tee_command.h"
#include "cli/text_output.h"
#include "cli/tia_command.h"
#include "cli/tia_snr_command.h"
#include "cli/version.h"
#include "io/error.h"
#include "io/suggest.h"

namespace hushgain {
namespace {

struct GlobalOptions {
  // Filled after parsing, from --devices and the rules of device_folder.h.
  std::string devices_dir;
};

struct Command {
  const char* name;
  const char* help;
  // Declares the subcommand's options on `app`; returns the handler to run
  // after parsing.
  std::function<std::function<int()>(CLI::App* app,
                                     const GlobalOptions& global)>
      define;
};

// Refuses option text that is not a whole number, before CLI11 converts it,
// so the message reads as the others: --tolerance: expected a number, ...
CLI::Validator NumberValidator() {
  return CLI::Validator(
      [](std::string& text) -> std::string {
        // from_chars: the C locale's "." whatever LC_NUMERIC says.
        double value = 0;
        const char* first = text.data() + (text.rfind('+', 0) == 0 ? 1 : 0);
        const char* last = text.data() + text.size();
        const auto read = std::from_chars(first, last, value);
        if (first == last || read.ptr != last)
          return "expected a number, got \"" + text + "\"";
        return "";
      },
      "NUMBER");
}

// --device, the same for every command that budgets a stage.
void AddDeviceOption(CLI::App* app, std::string* device) {
  app->add_option("--device", *device,
                  "op-amp device (a name in the device folder or a part file) "
                  "replacing the stage's op-amp")
      ->type_name("NAME");
}

// --format with its --csv and --json synonyms, for the commands that write
// all four formats.
void AddFormatOptions(CLI::App* app, std::string* format, bool* csv,
                      bool* json) {
  app->add_option("--format", *format,
                  "text, json, markdown or csv (default text)");
  app->add_flag("--csv", *csv, "the same as --format csv");
  app->add_flag("--json", *json, "the same as --format json");
}

std::function<int()> DefineBudget(CLI::App* app, const GlobalOptions& global) {
  auto options = std::make_shared<BudgetCommandOptions>();
  app->add_option("stage", options->stage_path, "stage file (JSON)")
      ->required();
  AddDeviceOption(app, &options->device);
  app->add_flag("--json", options->json, "the same as --format json");
  app->add_option("--format", options->format,
                  "text, json, markdown or csv (default text)");
  app->add_option("--spectrum", options->spectrum_path,
                  "also write the output densities across the band to this "
                  "CSV file (\"-\": standard output, instead of the report)")
      ->check(OutputPath());
  app->add_option("--chain-csv", options->chain_csv_path,
                  "also write the signal chain's table (a stage with a "
                  "\"chain\" block) to this CSV file (\"-\": standard "
                  "output, instead of the report)")
      ->check(OutputPath());
  app->add_option("--tolerance", options->tolerance,
                  "relative error target of the noise integral (default 1e-4)")
      ->check(NumberValidator());
  app->add_flag("--sensitivity", options->sensitivity,
                "also print d ln(noise, offset, bandwidth) / d ln(part) for "
                "every part and op-amp parameter, and the change that pays "
                "most (always in JSON)");
  return [options, &global] {
    options->devices_dir = global.devices_dir;
    return RunBudgetCommand(*options);
  };
}

// A command group (tee, tia) needs one of its subcommands; an unknown one
// gets a "did you mean" (CLI11 would only say that one is required).
void RequireSubcommand(CLI::App* app, const std::string& group,
                       const std::vector<std::string>& names) {
  app->require_subcommand(0, 1);
  app->allow_extras();
  app->parse_complete_callback([app, group, names] {
    if (!app->get_subcommands().empty()) return;
    std::vector<std::string> words = app->remaining();
    std::string expected;
    for (const std::string& n : names)
      expected += (expected.empty() ? "\"" : " or \"") + n + "\"";
    if (words.empty())
      throw Error("command line", "", group + ": expected " + expected);
    throw Error("command line", "",
                "unknown " + group + " command \"" + words.front() + "\"" +
                    DidYouMean(words.front(), names) + "; try " + group +
                    " --help");
  });
}

std::function<int()> DefineTee(CLI::App* app, const GlobalOptions& global) {
  auto chosen = std::make_shared<std::function<int()>>();
  RequireSubcommand(app, "tee",
                    std::vector<std::string>(std::begin(kTeeSubcommands),
                                             std::end(kTeeSubcommands)));

  auto sweep = std::make_shared<TeeSweepCommandOptions>();
  CLI::App* s = app->add_subcommand(
      "sweep", "keep the gain, shrink the largest resistor of the T network");
  s->allow_extras(false);  // the group allows them only to name a command
  s->add_option("stage", sweep->stage_path, "stage file (JSON) with a tee")
      ->required();
  AddDeviceOption(s, &sweep->device);
  s->add_option("--min", sweep->min,
                "smallest largest-resistor value (default Req / 1000)");
  s->add_option("--points", sweep->points, "rows, both ends included (13)")
      ->check(WholeNumber<int>());
  s->add_option("--ratio", sweep->ratio,
                "fix R1/R2 to a number, or to the stage's (\"stage\")");
  AddFormatOptions(s, &sweep->format, &sweep->csv, &sweep->json);
  s->add_option("--plot", sweep->plot_path,
                "also draw noise and offset against the largest resistor "
                "(.png, .svg or .pdf)")
      ->check(OutputPath());
  s->add_option("--tolerance", sweep->tolerance,
                "relative error target of the noise integral (default 1e-4)");
  s->callback([sweep, chosen, &global] {
    *chosen = [sweep, &global] {
      sweep->devices_dir = global.devices_dir;
      return RunTeeSweepCommand(*sweep);
    };
  });

  auto search = std::make_shared<TeeSearchCommandOptions>();
  CLI::App* q = app->add_subcommand(
      "search", "standard-value T networks for the gain, least noise first");
  q->allow_extras(false);
  q->add_option("stage", search->stage_path, "stage file (JSON)")->required();
  AddDeviceOption(q, &search->device);
  q->add_option("--series", search->series,
                "E6, E12, E24, E48, E96 or E192 (default E96)");
  q->add_option("--max", search->max, "largest R1, R2, R3 (required)");
  q->add_option("--min", search->min, "smallest R1, R2, R3 (default max/1000)");
  q->add_option(
      "--gain", search->gain,
      "target |gain| (default the stage's own Req / (R_source + R_in))");
  q->add_option("--gain-tol", search->gain_tolerance,
                "relative gain tolerance: 0.5% or 0.005 (default 1%)");
  q->add_flag("--free-input", search->free_input,
              "draw R_in from the series too");
  q->add_option("--input-min", search->input_min,
                "smallest R_in with --free-input (default --min)");
  q->add_option("--input-max", search->input_max,
                "largest R_in with --free-input (default --max)");
  q->add_option("--rank", search->rank,
                "input-noise, noise (output), offset or weighted "
                "(input-noise)");
  q->add_option("--offset-weight", search->offset_weight,
                "offset weight of --rank weighted, 0 to 1 (0.5)");
  q->add_option("--top", search->top, "how many networks to show (10)")
      ->check(WholeNumber<int>());
  q->add_option("--threads", search->threads,
                "worker threads (0: one per core)")
      ->check(WholeNumber<int>());
  AddFormatOptions(q, &search->format, &search->csv, &search->json);
  q->add_option("--plot", search->plot_path,
                "also draw the networks' noise, offset and resistors by rank "
                "(.png, .svg or .pdf)")
      ->check(OutputPath());
  q->add_option("--tolerance", search->tolerance,
                "relative error target of the noise integral (default 1e-4)");
  q->callback([search, chosen, &global] {
    *chosen = [search, &global] {
      search->devices_dir = global.devices_dir;
      return RunTeeSearchCommand(*search);
    };
  });
  return [chosen] { return *chosen ? (*chosen)() : kExitUsage; };
}

std::function<int()> DefineTia(CLI::App* app, const GlobalOptions& global) {
  RequireSubcommand(app, "tia", {"suggest", "snr"});
  auto options = std::make_shared<TiaSuggestCommandOptions>();
  auto snr = std::make_shared<TiaSnrCommandOptions>();
  auto chosen = std::make_shared<std::function<int()>>();
  CLI::App* s = app->add_subcommand(
      "suggest", "feedback resistor and capacitor for a bandwidth target");
  s->allow_extras(false);
  s->add_option("stage", options->stage_path,
                "transimpedance stage file (JSON)")
      ->required();
  AddDeviceOption(s, &options->device);
  s->add_option("--bandwidth", options->bandwidth,
                "the -3 dB target, e.g. 50k (required)")
      ->required();
  s->add_option("--series", options->series,
                "IEC 60063 series of R_f (default E24)");
  s->add_option("--min", options->min, "smallest R_f (default 1k)");
  s->add_option("--max", options->max, "largest R_f (default 10G)");
  s->add_option("--rows", options->rows,
                "proposals at or below the best R_f (default 6)")
      ->check(WholeNumber<int>());
  s->add_option("--background", options->background,
                "background photocurrent, e.g. 400n (default: the stage's "
                "photocurrent)");
  s->add_option("--full-scale", options->full_scale,
                "output swing for the headroom, e.g. 4 (default: the stage's "
                "full_scale_output_V, else half the supply)");
  s->add_option("--cap-series", options->cap_series,
                "fit C_f from a capacitor series, e.g. E6 or E12, the "
                "resistor's parasitic counted in");
  AddFormatOptions(s, &options->format, &options->csv, &options->json);
  s->callback([options, chosen, &global] {
    *chosen = [options, &global] {
      options->devices_dir = global.devices_dir;
      return RunTiaSuggestCommand(*options);
    };
  });
  CLI::App* n = app->add_subcommand(
      "snr", "signal-to-noise ratio against optical power, NEP, saturation");
  n->allow_extras(false);
  n->add_option("stage", snr->stage_path, "transimpedance stage file (JSON)")
      ->required();
  AddDeviceOption(n, &snr->device);
  n->add_option("--power-range", snr->power_range,
                "incident optical power LOW..HIGH, e.g. 1n..1m (required)")
      ->required();
  n->add_option("--points", snr->points,
                "log-spaced powers, both ends included (default 31)")
      ->check(WholeNumber<int>());
  AddFormatOptions(n, &snr->format, &snr->csv, &snr->json);
  n->add_option("--plot", snr->plot_path,
                "also draw SNR against power, log-log (.png, .svg or .pdf)")
      ->check(OutputPath());
  n->callback([snr, chosen, &global] {
    *chosen = [snr, &global] {
      snr->devices_dir = global.devices_dir;
      return RunTiaSnrCommand(*snr);
    };
  });
  return [chosen] { return *chosen ? (*chosen)() : kExitUsage; };
}

std::function<int()> DefinePlot(CLI::App* app, const GlobalOptions& global) {
  auto options = std::make_shared<PlotCommandOptions>();
  app->add_option("stage", options->stage_path, "stage file (JSON)")
      ->required();
  AddDeviceOption(app, &options->device);
  app->add_option("-o,--output", options->output_path,
                  "picture to write, .png, .svg or .pdf")
      ->required()
      ->check(OutputPath());
  app->add_option("--only", options->only,
                  "draw one panel: spectrum, cumulative, gain or chain (a "
                  "stage with a \"chain\" block)");
  app->add_option("--script", options->script_path,
                  "also save the gnuplot script (data inline) to this file "
                  "(\"-\": standard output)")
      ->check(OutputPath());
  return [options, &global] {
    options->devices_dir = global.devices_dir;
    return RunPlotCommand(*options);
  };
}

std::function<int()> DefineSpread(CLI::App* app, const GlobalOptions& global) {
  auto o = std::make_shared<SpreadCommandOptions>();
  app->add_option("stage", o->stage_path, "stage file (JSON)")->required();
  AddDeviceOption(app, &o->device);
  app->add_option("--samples", o->samples,
                  "number of Monte Carlo samples (default 10000)")
      ->check(WholeNumber<long>());
  app->add_option("--seed", o->seed, "seed of the random streams (default 1)")
      ->check(WholeNumber<std::uint64_t>());
  app->add_option("--threads", o->threads, "worker threads (default 0: all)")
      ->check(WholeNumber<int>());
  app->add_option("--csv", o->csv_path,
                  "write every sample to this CSV file (\"-\": standard "
                  "output, instead of the summary; the summary as CSV is "
                  "--format csv)")
      ->check(OutputPath());
  app->add_option("--format", o->format,
                  "summary as text, json, markdown or csv (default text)");
  app->add_flag("--json", o->json, "the same as --format json");
  app->add_option("--plot", o->plot_path,
                  "also draw histograms of gain error, offset and noise "
                  "(.png, .svg or .pdf)")
      ->check(OutputPath());
  app->add_option("--gain-error-limit", o->gain_error_limit,
                  "yield limit on |gain error|, e.g. 0.5%");
  app->add_option("--offset-limit", o->offset_limit,
                  "yield limit on |output offset|, e.g. 5m");
  app->add_option("--noise-limit", o->noise_limit,
                  "yield limit on the output noise rms, e.g. 100u");
  return [o, &global] {
    o->devices_dir = global.devices_dir;
    return RunSpreadCommand(*o);
  };
}

std::function<int()> DefineDevices(CLI::App* app, const GlobalOptions& global) {
  auto o = std::make_shared<DevicesCommandOptions>();
  app->add_option("name", o->name,
                  "one device to print in full (default: list them all)");
  app->add_option("--format", o->format,
                  "text, json, markdown or csv (default text)");
  app->add_flag("--json", o->json, "the same as --format json");
  return [o, &global] {
    o->devices_dir = global.devices_dir;
    return RunDevicesCommand(*o);
  };
}

std::function<int()> DefineCompare(CLI::App* app, const GlobalOptions& global) {
  auto o = std::make_shared<CompareCommandOptions>();
  app->add_option("stage", o->stage_path, "stage file (JSON)")->required();
  app->add_option("--devices-list", o->devices_list,
                  "compare only these op-amps: device names or part files, "
                  "separated by commas (default: every op-amp of the device "
                  "folder)")
      ->type_name("A,B,...");
  app->add_option("--rank", o->rank,
                  "input-noise (input-referred noise rms) or offset "
                  "(worst-case output offset), smallest first (input-noise)");
  AddFormatOptions(app, &o->format, &o->csv, &o->json);
  app->add_option("--tolerance", o->tolerance,
                  "relative error target of each noise integral (default "
                  "1e-4)")
      ->check(NumberValidator());
  app->add_option("--plot", o->plot_path,
                  "also draw each op-amp's input-referred noise as a bar "
                  "split by kind of contributor (.png, .svg or .pdf)")
      ->check(OutputPath());
  return [o, &global] {
    o->devices_dir = global.devices_dir;
    return RunCompareCommand(*o);
  };
}

std::function<int()> DefineNote(CLI::App* app, const GlobalOptions& global) {
  auto o = std::make_shared<NoteCommandOptions>();
  app->add_option("stage", o->stage_path, "stage file (JSON)")->required();
  app->add_option("-o,--output", o->output_path,
                  "the note: one self-contained .html file, or .md with the "
                  "plot sheet as an SVG beside it")
      ->required()
      ->check(OutputPath());
  app->add_option("--format", o->format, "html or markdown (default html)");
  AddDeviceOption(app, &o->device);
  return [o, &global] {
    o->devices_dir = global.devices_dir;
    return RunNoteCommand(*o);
  };
}

const std::vector<Command>& Commands() {
  static const std::vector<Command> commands = {
      {"budget", "noise and offset budget of a stage", DefineBudget},
      {"tee", "T-network design: sweep the largest resistor, search E-series",
       DefineTee},
      {"tia",
       "photodiode stages: suggest R_f and C_f for a bandwidth; SNR against "
       "optical power",
       DefineTia},
      {"plot", "noise spectra, cumulative noise and gains as a picture",
       DefinePlot},
      {"spread", "Monte Carlo over tolerances, offsets and temperature",
       DefineSpread},
      {"compare",
       "the stage with every op-amp class: noise, offset, stability, verdict",
       DefineCompare},
      {"devices", "the device folder: op-amp classes, user parts, resistors",
       DefineDevices},
      {"note", "a design note: the budget, tables and plots in one HTML file",
       DefineNote},
  };
  return commands;
}

// Gives `command`, or each leaf command under it (tee sweep, ...), a
// --devices and an --ascii of its own, the same as the ones before the
// command.
void AddGlobalOptions(CLI::App* command,
                      const std::function<void(const std::string&)>& set) {
  const std::vector<CLI::App*> subs =
      command->get_subcommands([](CLI::App*) { return true; });
  if (subs.empty()) {
    command
        ->add_option_function<std::string>(
            "--devices", set, "device folder (as before the command)")
        ->type_name("DIR");
    command->add_flag("--ascii")->description(
        "ASCII text (as before the command)");
  }
  for (CLI::App* sub : subs) AddGlobalOptions(sub, set);
}

// Where the command word is: the first word that is not empty, not an
// option and not the value of --devices; argc when there is none.
int CommandWordIndex(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    const std::string_view word = argv[i];
    if (word == "--devices") {
      ++i;
      continue;
    }
    if (!word.empty() && word[0] != '-') return i;
  }
  return argc;
}

bool IsCommandName(std::string_view word,
                   const std::vector<std::string>& names) {
  return std::find(names.begin(), names.end(), word) != names.end();
}

// Refuses an option that the command it follows does not know, with a
// "did you mean" from that command's own options. CLI11 alone would accept
// it silently under a command group that allows extras (tee, tia), and
// elsewhere would name it without a suggestion.
void RefuseUnknownOptions(CLI::App* app, int argc, char** argv) {
  CLI::App* current = app;
  std::string path;  // "tee sweep", for the message
  for (int i = 1; i < argc; ++i) {
    const std::string word = argv[i];
    const bool long_name = word.size() > 2 && word.rfind("--", 0) == 0;
    const bool short_name = word.size() > 1 && word[0] == '-' &&
                            std::isalpha(static_cast<unsigned char>(word[1]));
    if (word == "--") break;  // everything after is positional
    if (!long_name && !short_name) {
      CLI::App* sub = nullptr;
      for (CLI::App* s :
           current->get_subcommands([](CLI::App*) { return true; }))
        if (s->get_name() == word) sub = s;
      if (sub != nullptr) {
        current = sub;
        path += (path.empty() ? "" : " ") + word;
      }
      continue;
    }
    const std::string name = word.substr(0, word.find('='));
    if (const CLI::Option* option = current->get_option_no_throw(name)) {
      // The next word is this option's value unless given after '='.
      if (option->get_items_expected_max() > 0 && name.size() == word.size())
        ++i;
      continue;
    }
    std::vector<std::string> known;
    for (const CLI::Option* option : current->get_options()) {
      for (const std::string& l : option->get_lnames())
        known.push_back("--" + l);
      for (const std::string& s : option->get_snames())
        known.push_back("-" + s);
    }
    // A known name that begins the word ("--gain-tol" in
    // "--gain-tolerance") is a better guess than the nearest by edits.
    std::string hint;
    for (const std::string& k : known)
      if (k.size() > 3 && name.rfind(k, 0) == 0 && k.size() > hint.size())
        hint = k;
    hint = hint.empty() ? DidYouMean(name, known)
                        : " (did you mean \"" + hint + "\"?)";
    throw Error("command line", "",
                (path.empty() ? std::string() : path + ": ") +
                    "unknown option \"" + name + "\"" + hint + "; try " +
                    (path.empty() ? "" : path + " ") + "--help");
  }
}

// "--name=" with nothing after the "=" becomes "--name" and "", so an empty
// value is refused as `--name ""` is ("--spectrum: expected a file name, got
// """). Left whole, CLI11 would take the next word as the value: "budget
// s.json --spectrum= --json" wrote the spectrum to a file named "--json".
std::vector<std::string> SplitEmptyValues(CLI::App* app, int argc,
                                          char** argv) {
  std::vector<std::string> words;
  CLI::App* current = app;
  bool positional = false;  // after "--"
  for (int i = 0; i < argc; ++i) {
    const std::string word = argv[i];
    words.push_back(word);
    if (i == 0 || positional) continue;
    if (word == "--") {
      positional = true;
      continue;
    }
    if (word.rfind("--", 0) != 0) {
      for (CLI::App* s :
           current->get_subcommands([](CLI::App*) { return true; }))
        if (s->get_name() == word) current = s;
      continue;
    }
    const std::size_t equals = word.find('=');
    const std::string name = word.substr(0, equals);
    const CLI::Option* option = current->get_option_no_throw(name);
    if (option == nullptr || option->get_items_expected_max() == 0) continue;
    if (equals == std::string::npos) {
      // The next word is this option's value.
      if (i + 1 < argc) words.push_back(argv[++i]);
    } else if (equals + 1 == word.size()) {
      words.back() = name;
      words.push_back("");
    }
  }
  return words;
}

int Run(int argc, char** argv) {
  // Named, so usage lines say "hushgain", not the path it was started by.
  CLI::App app{
      "hushgain: noise and offset budgets of inverting op-amp front ends",
      "hushgain"};
  app.require_subcommand(1);
  app.set_version_flag("--version", VersionLine(), "print the version");
  app.add_flag("--ascii")->description(
      "text and Markdown in ASCII: u for micro, rtHz, Ohm, deg, +- "
      "(also chosen when the locale's character set is not UTF-8)");
  GlobalOptions global;
  std::optional<std::string> devices_option;
  const auto set_devices = [&devices_option](const std::string& dir) {
    devices_option = dir;
  };
  app.add_option_function<std::string>(
         "--devices", set_devices,
         "device folder (default: $HUSHGAIN_DEVICES, else "
         "../share/hushgain/devices beside the program, else the source "
         "tree's devices/ for an uninstalled build)")
      ->type_name("DIR");

  std::vector<std::string> names;
  for (const Command& command : Commands()) names.push_back(command.name);
  // Every command is listed (name and help, for --help and the "did you
  // mean"), but only the one the words name gets its options: declaring
  // all of them took a fifth of a budget's process time, and no other
  // command's options can be used in the same run.
  const int at = CommandWordIndex(argc, argv);
  const std::string chosen =
      at < argc && IsCommandName(argv[at], names) ? argv[at] : "";
  std::function<int()> handler;
  for (const Command& command : Commands()) {
    CLI::App* sub = app.add_subcommand(command.name, command.help);
    if (command.name != chosen) continue;
    auto run = command.define(sub, global);
    sub->callback([&handler, run] { handler = run; });
    // --devices and --ascii may also follow the command.
    AddGlobalOptions(sub, set_devices);
  }
  std::vector<std::string> words = SplitEmptyValues(&app, argc, argv);
  std::vector<char*> pointers;
  for (std::string& w : words) pointers.push_back(w.data());
  pointers.push_back(nullptr);
  argc = static_cast<int>(words.size());
  argv = pointers.data();
  RefuseUnknownOptions(&app, argc, argv);
  // An unknown subcommand gets a suggestion from the same table.
  if (const int word = CommandWordIndex(argc, argv);
      word < argc && !IsCommandName(argv[word], names)) {
    std::cerr << "error: "
              << Error::OneLine("unknown command \"" + std::string(argv[word]) +
                                "\"" + DidYouMean(argv[word], names) +
                                "; try --help")
              << "\n";
    return kExitUsage;
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    if (e.get_exit_code() == 0) return app.exit(e);
    std::string why = e.what();  // CLI11 starts its messages upper-case
    if (!why.empty() && why[0] >= 'A' && why[0] <= 'Z') why[0] += 'a' - 'A';
    std::cerr << "error: command line: " << Error::OneLine(why) << "\n";
    return kExitUsage;
  }
  if (!handler) return kExitUsage;
  DeviceFolderInputs where;
  where.option = devices_option;
  if (const char* env = std::getenv("HUSHGAIN_DEVICES"))
    where.environment = env;
  where.program_folder = ProgramFolder(argc > 0 ? argv[0] : nullptr);
  global.devices_dir = LocateDeviceFolder(where);
  return handler();
}

// Points `stream` (std::cout or std::cerr) at `target`'s buffer while it
// lives; nothing to do when `target` is `stream` itself.
class StreamRedirect {
 public:
  StreamRedirect(std::ostream& stream, std::ostream& target)
      : stream_(stream), previous_(stream.rdbuf()) {
    if (&stream != &target) stream.rdbuf(target.rdbuf());
  }
  ~StreamRedirect() {
    stream_.flush();
    stream_.rdbuf(previous_);
  }
  StreamRedirect(const StreamRedirect&) = delete;
  StreamRedirect& operator=(const StreamRedirect&) = delete;

 private:
  std::ostream& stream_;
  std::streambuf* previous_;
};

}  // namespace

int RunCli(int argc, char** argv, std::ostream& out, std::ostream& err) {
  const StreamRedirect redirect_out(std::cout, out);
  const StreamRedirect redirect_err(std::cerr, err);
  // Chosen before parsing, so even a command-line error is spelled in ASCII.
  bool ascii = LocaleWantsAscii();
  for (int i = 1; i < argc; ++i)
    ascii = ascii || std::string(argv[i]) == "--ascii";
  std::optional<AsciiOutput> ascii_output;
  if (ascii) ascii_output.emplace();
  try {
    return Run(argc, argv);
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << "\n";
    return kExitUsage;
  } catch (const std::bad_alloc&) {
    std::cerr << "error: out of memory; ask for fewer samples, points or "
                 "rows\n";
    return kExitSystem;
  } catch (const std::exception& e) {
    // A failure of the system rather than of the input (threads that cannot
    // be started, a length beyond the library's limit): one line, never an
    // abort.
    std::cerr << "error: " << Error::OneLine(std::string("system: ") + e.what())
              << "\n";
    return kExitSystem;
  }
}

}  // namespace hushgain
