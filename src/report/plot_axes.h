// Pieces of gnuplot scripts shared by the plot sheets (report/plot_script.h,
// report/tee_plot_script.h): numbers for datablocks, short tic labels with
// units, log-axis tic lists and an SI scale for a linear axis. Labels go
// through GnuplotString (report/text_escape.h).
#ifndef HUSHGAIN_REPORT_PLOT_AXES_H_
#define HUSHGAIN_REPORT_PLOT_AXES_H_

#include <functional>
#include <string>
#include <utility>

namespace hushgain {

// The picture formats: pngcairo, svg and pdfcairo, all in gnuplot-nox.
enum class PlotFormat { kPng, kSvg, kPdf };

// The terminal and output lines every sheet starts with: the format, the
// size (pixels; a PDF page gets one point per pixel, so text and lines keep
// their proportions), DejaVu Sans 11, no enhanced text (names are shown as
// typed), a white background, UTF-8, and `output_path` (escaped).
std::string TerminalCommands(PlotFormat format, int width_px, int height_px,
                             const std::string& output_path);

// The grid of every panel: major lines at the labelled tics and lighter
// minor lines at the minor tics (2..9 times each decade on a log axis).
std::string GridCommand();

// The pixel geometry of a sheet of stacked panels: tic labels on the left,
// a legend column on the right, a heading above the first panel. Every
// sheet is 1400 pixels wide.
struct SheetLayout {
  int width_px = 1400;
  int left_px = 140;
  int legend_px = 430;
  int key_gap_px = 40;  // between the plot's right edge and the legend
  int heading_px = 90;
  int panel_top_px = 50;
  int panel_px = 300;
  int panel_bottom_px = 75;

  int HeightPx(int panels) const {
    return heading_px + panels * (panel_top_px + panel_px + panel_bottom_px);
  }
};

// The gnuplot lines that open panel `index` (from 0) of a sheet
// `height_px` tall: reset what the previous panel set, margins, grid, border
// (gnuplot's bit mask: 3 = bottom and left, 11 = with the right axis), the
// legend box in the legend column, and the panel's title (escaped).
std::string PanelFrame(const SheetLayout& layout, int index, int height_px,
                       const std::string& title, int border);

// "%.9g", or "NaN" for a value that is not finite (gnuplot skips it).
std::string PlotNumber(double value);

// A positive value for a log axis, or "NaN".
std::string PlotLogNumber(double value);

// Engineering notation without trailing zeros, for tics: "10 Hz", "2.5 kΩ".
std::string ShortEng(double value, const std::string& unit);

// A gnuplot `set <axis>tics (...)` command for a log axis over
// [v_min, v_max]: labelled at each decade, unlabelled minor tics at 2..9
// times each decade; when fewer than three decades fall inside, 2 and 5
// times each decade are labelled too, so a short axis still reads; with
// no decade inside, every tic is labelled.
std::string LogTicsCommand(const char* axis, double v_min, double v_max,
                           const std::function<std::string(double)>& label);

// The SI-prefixed unit and its scale for values up to `max`:
// UnitScale(3e-4, "V") == {1e-6, "µV"}; {1, unit} when max is not positive.
std::pair<double, std::string> UnitScale(double max, const std::string& unit);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_PLOT_AXES_H_
