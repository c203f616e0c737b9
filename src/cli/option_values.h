// Shared option helpers of the commands: command-line numbers with units,
// and the mapping from an options struct's Validate() message to the flag
// the user typed. Every message has the form "--flag: expected ..., got ...".
#ifndef HUSHGAIN_CLI_OPTION_VALUES_H_
#define HUSHGAIN_CLI_OPTION_VALUES_H_

#include <CLI/CLI.hpp>
#include <charconv>
#include <cstdint>
#include <initializer_list>
#include <limits>
#include <string>
#include <string_view>
#include <utility>

#include "io/error.h"
#include "io/units.h"

namespace hushgain {

// Error("command line", "", "OPTION: MESSAGE").
Error OptionError(std::string_view option, std::string_view message);

// `text` as a quantity ("4.7k", "50 kHz"); refused as
// "OPTION: expected a resistance, got "ten" (no number)".
double QuantityOption(std::string_view option, const std::string& text,
                      Quantity quantity);

// The same, and also refused when not positive:
// "OPTION: expected a positive frequency, got "0"".
double PositiveQuantityOption(std::string_view option, const std::string& text,
                              Quantity quantity);

// Which command-line flag sets which field of an options struct.
using FieldFlags =
    std::initializer_list<std::pair<std::string_view, std::string_view>>;

// Throws the options' Validate() message, if any, with its leading field
// name ("relative_tolerance: expected ...") replaced by the flag that sets
// it ("--tolerance: expected ..."); the rule itself is never restated here.
// A field no flag sets keeps its own name.
void ThrowIfInvalid(const std::string& validate_message, FieldFlags flags);

// A CLI11 check that an integer option's text is a plain decimal whole
// number that fits the option's type T, before CLI11 converts it (which
// would round "1e3", wrap "-1" into an unsigned or saturate
// "99999999999999999999"). The range the tool accepts is the options
// struct's Validate(); this only refuses what cannot be read exactly.
template <typename T>
CLI::Validator WholeNumber() {
  return CLI::Validator(
      [](std::string& text) -> std::string {
        T value{};
        const char* end = text.data() + text.size();
        const auto [ptr, ec] = std::from_chars(text.data(), end, value);
        if (ec == std::errc() && ptr == end) return {};
        if (ec == std::errc::result_out_of_range ||
            (std::numeric_limits<T>::min() == 0 && !text.empty() &&
             text[0] == '-'))
          return "expected a whole number from " +
                 std::to_string(std::numeric_limits<T>::min()) + " to " +
                 std::to_string(std::numeric_limits<T>::max()) + ", got \"" +
                 text + "\"";
        return "expected a whole number, got \"" + text + "\"";
      },
      "", "whole number");
}

// An option naming an output file (cli/output_files.h): an empty name is
// refused ("expected a file name, got """), never taken as "not given".
inline CLI::Validator OutputPath() {
  return CLI::Validator(
      [](std::string& text) -> std::string {
        return text.empty() ? "expected a file name, got \"\"" : "";
      },
      "", "file name");
}

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_OPTION_VALUES_H_
