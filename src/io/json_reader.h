// Reading a JSON object with its path known, so every error names the file
// and the JSON pointer of the value at fault. A reader records the keys it
// was asked for; Finish() rejects every other key with "did you mean", so a
// typo never falls back to a default silently.
#ifndef HUSHGAIN_IO_JSON_READER_H_
#define HUSHGAIN_IO_JSON_READER_H_

#include <nlohmann/json.hpp>
#include <optional>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include "io/error.h"
#include "io/units.h"

namespace hushgain {

// Parses JSON text; a syntax error becomes an Error naming the line and
// column. `//` and `/* */` comments are allowed (editors and people annotate
// stage files) and ignored.
nlohmann::json ParseJsonText(std::string_view text, const std::string& source);

// A JSON type in words: "a string", "a number", "an object".
std::string JsonTypeName(const nlohmann::json& value);

// A reader of a top-level object (empty path) accepts the key "$schema"
// and ignores it: editors use it to find the JSON Schema of the file.
class ObjectReader {
 public:
  // Throws unless `value` is an object.
  ObjectReader(const nlohmann::json& value, std::string source,
               std::string path);

  bool Has(const std::string& key);  // also marks the key as known
  const nlohmann::json& Get(const std::string& key);  // throws when missing

  // Quantities: a JSON number (SI) or a string with prefix and unit.
  double Quantity(const std::string& key, hushgain::Quantity kind);
  std::optional<double> OptionalQuantity(const std::string& key,
                                         hushgain::Quantity kind);
  std::string String(const std::string& key);
  std::optional<std::string> OptionalString(const std::string& key);
  ObjectReader Object(const std::string& key);

  // Throws on a key that no call above asked for.
  void Finish();

  // An error at this object's key.
  Error ErrorAt(const std::string& key, const std::string& message) const;
  Error ErrorHere(const std::string& message) const;

  // The JSON pointer of `key` (RFC 6901: "~" and "/" escaped).
  std::string PathOf(const std::string& key) const;
  const std::string& source() const { return source_; }
  const std::string& path() const { return path_; }
  const nlohmann::json& json() const { return value_; }

 private:
  const nlohmann::json& value_;
  std::string source_;
  std::string path_;
  std::vector<std::string> known_;
};

// While a KeyLog lives, every key that an ObjectReader on the same thread
// asks for (Has, Get and everything built on them) is recorded with the
// JSON pointer of its object, array indices written as "*": the parser's
// vocabulary, which tests/io/schema_keys_test.cpp compares with the JSON
// Schemas in schema/. Logs nest; the innermost records. Reading is
// unchanged whether a log lives or not.
class KeyLog {
 public:
  using Keys = std::set<std::pair<std::string, std::string>>;
  KeyLog();
  ~KeyLog();
  KeyLog(const KeyLog&) = delete;
  KeyLog& operator=(const KeyLog&) = delete;

  const Keys& keys() const { return keys_; }
  // Records into the thread's live log, if any.
  static void Record(const std::string& object_path, const std::string& key);

 private:
  KeyLog* previous_;
  Keys keys_;
};

// Reads `value` (at `path` of `source`) as a quantity of `kind`.
double ReadQuantity(const nlohmann::json& value, hushgain::Quantity kind,
                    const std::string& source, const std::string& path);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_JSON_READER_H_
