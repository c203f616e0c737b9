#include "cli/output_format.h"

#include "io/error.h"
#include "io/suggest.h"

namespace hushgain {

const std::vector<std::string>& OutputFormats() {
  static const std::vector<std::string> formats = {"text", "json", "markdown",
                                                   "csv"};
  return formats;
}

std::string ResolveOutputFormat(const std::string& format, bool json,
                                bool csv) {
  bool known = false;
  for (const std::string& f : OutputFormats()) known = known || f == format;
  if (!known)
    throw Error("command line", "",
                "--format: expected text, json, markdown or csv, got \"" +
                    format + "\"" + DidYouMean(format, OutputFormats()));
  if (json && csv)
    throw Error("command line", "", "--csv: cannot be combined with --json");
  for (const auto& [set, name] : {std::pair{json, "json"}, {csv, "csv"}}) {
    if (!set) continue;
    if (format != "text" && format != name)
      throw Error("command line", "",
                  std::string("--") + name + " contradicts --format " + format);
    return name;
  }
  return format;
}

}  // namespace hushgain
