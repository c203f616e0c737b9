#include "cli/option_values.h"

#include <optional>

namespace hushgain {

Error OptionError(std::string_view option, std::string_view message) {
  return Error("command line", "",
               std::string(option) + ": " + std::string(message));
}

double QuantityOption(std::string_view option, const std::string& text,
                      Quantity quantity) {
  std::string why;
  const std::optional<double> value = ParseQuantity(text, quantity, &why);
  if (!value)
    throw OptionError(option, "expected " +
                                  std::string(QuantityName(quantity)) +
                                  ", got \"" + text + "\" (" + why + ")");
  return *value;
}

double PositiveQuantityOption(std::string_view option, const std::string& text,
                              Quantity quantity) {
  std::string why;
  const std::optional<double> value = ParseQuantity(text, quantity, &why);
  if (!value || !(*value > 0))
    // QuantityName is "a resistance": "a positive resistance" drops its "a ".
    throw OptionError(
        option, "expected a positive " +
                    std::string(QuantityName(quantity)).substr(2) + ", got \"" +
                    text + "\"" + (why.empty() ? "" : " (" + why + ")"));
  return *value;
}

void ThrowIfInvalid(const std::string& validate_message, FieldFlags flags) {
  if (validate_message.empty()) return;
  const std::size_t colon = validate_message.find(": ");
  if (colon != std::string::npos) {
    const std::string_view field(validate_message.data(), colon);
    for (const auto& [name, flag] : flags)
      if (name == field)
        throw OptionError(flag, validate_message.substr(colon + 2));
  }
  throw Error("command line", "", validate_message);
}

}  // namespace hushgain
