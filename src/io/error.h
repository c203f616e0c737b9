// The one error type for user mistakes: bad stage files, bad device files,
// bad command-line values. It carries where (the file and the JSON path) and
// what was expected, and formats as one line:
//   stage.json: /stage/feedback/r2: expected a resistance, got "ten"
// Numerical trouble is not an Error: the core returns a Status for that.
#ifndef HUSHGAIN_IO_ERROR_H_
#define HUSHGAIN_IO_ERROR_H_

#include <stdexcept>
#include <string>

#include "base/control_characters.h"

namespace hushgain {

class Error : public std::runtime_error {
 public:
  // `source` names the file (or "command line"); `path` is a JSON pointer
  // such as "/stage/feedback/r2", empty when the error concerns the whole
  // file; `message` is short and lowercase.
  Error(std::string source, std::string path, std::string message)
      : std::runtime_error(Format(source, path, message)),
        source_(std::move(source)),
        path_(std::move(path)),
        message_(std::move(message)) {}

  const std::string& source() const { return source_; }
  const std::string& path() const { return path_; }
  const std::string& message() const { return message_; }

  // `text` with its control characters escaped (\n, \r, \t, \xHH, \u00HH:
  // base/control_characters.h), so a message that quotes the user's keys
  // and values (JSON lets a key hold "resist\nce") stays one line and
  // cannot drive the terminal. Every Error message goes through it.
  static std::string OneLine(const std::string& text) {
    return EscapeControlCharacters(text, LineBreaks::kEscape);
  }

 private:
  static std::string Format(const std::string& source, const std::string& path,
                            const std::string& message) {
    std::string out = source;
    if (!path.empty()) out += ": " + path;
    out += ": " + message;
    return OneLine(out);
  }

  std::string source_;
  std::string path_;
  std::string message_;
};

}  // namespace hushgain

#endif  // HUSHGAIN_IO_ERROR_H_
