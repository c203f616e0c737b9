// The --format option of the table commands (budget, tee sweep, tee
// search), with the older flags --json and --csv as its synonyms.
#ifndef HUSHGAIN_CLI_OUTPUT_FORMAT_H_
#define HUSHGAIN_CLI_OUTPUT_FORMAT_H_

#include <string>
#include <vector>

namespace hushgain {

// text, json, markdown, csv.
const std::vector<std::string>& OutputFormats();

// The format asked for: `format` ("text" by default), or "json" / "csv"
// when that flag is set. Throws Error (exit code 2) naming the option for
// an unknown format ("--format: expected text, json, markdown or csv, got
// "x" (did you mean ...)"), --json beside --csv, or a flag beside a
// --format other than text and its own ("--json contradicts --format csv").
std::string ResolveOutputFormat(const std::string& format, bool json, bool csv);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_OUTPUT_FORMAT_H_
