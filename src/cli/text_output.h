// How text reaches the terminal: UTF-8 as hushgain writes it, or ASCII
// spellings (report/ascii_text.h: u for µ, rtHz, Ohm, deg, +-) with
// --ascii, or by itself when the locale's character set is not UTF-8
// (LC_ALL, LC_CTYPE or LANG set to, say, en_US.ISO-8859-1 or C). With no
// locale variable set at all the output stays UTF-8.
// The choice is made once per run (cli/run_cli.h); ASCII applies to text and
// Markdown reports on stdout and to every message on stderr. JSON and CSV
// keep their data as it is (UTF-8).
#ifndef HUSHGAIN_CLI_TEXT_OUTPUT_H_
#define HUSHGAIN_CLI_TEXT_OUTPUT_H_

#include <memory>
#include <streambuf>
#include <string>

namespace hushgain {

// True when a locale variable names a character set other than UTF-8.
// Reads the environment's LC_CTYPE and puts the program's back to "C", so
// nothing else in hushgain depends on the locale.
bool LocaleWantsAscii();

// ASCII output for as long as it lives: std::cerr is filtered through a
// buffer that spells what passes in ASCII, and WriteReport spells text and
// Markdown in ASCII. The destructor puts std::cerr's buffer back and turns
// ASCII off, so one process can run the command line again and again
// (RunCli holds one for a run that asks for ASCII). Scopes do not nest.
class AsciiOutput {
 public:
  AsciiOutput();
  ~AsciiOutput();
  AsciiOutput(const AsciiOutput&) = delete;
  AsciiOutput& operator=(const AsciiOutput&) = delete;

 private:
  std::streambuf* previous_;
  std::unique_ptr<std::streambuf> filter_;
};

// Writes `report` to stdout (`format`: text, markdown, json or csv) and
// flushes. Whatever a report quotes from a stage or device file, no control
// character reaches the terminal: every one but the line breaks (LF, and
// CR LF as CSV ends its records) is made visible
// (base/control_characters.h), and a C1 control becomes \u00HH, which in
// JSON is the same character.
void WriteReport(const std::string& report, const std::string& format);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_TEXT_OUTPUT_H_
