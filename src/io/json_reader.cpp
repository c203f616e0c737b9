#include "io/json_reader.h"

#include <algorithm>
#include <cmath>

#include "io/suggest.h"

namespace hushgain {
namespace {

// The parser's own reason without its prefix: from "[json.exception.
// parse_error.101] parse error at line 3, column 29: syntax error while
// parsing object - unexpected string literal; expected '}'" keeps
// "unexpected string literal; expected '}'". Empty when the text has
// another shape.
std::string ParseErrorReason(const std::string& what) {
  const std::string marker = " - ";
  const std::size_t at = what.find(marker);
  if (at == std::string::npos) return "";
  std::string reason = what.substr(at + marker.size());
  if (!reason.empty() && reason[0] >= 'A' && reason[0] <= 'Z')
    reason[0] += 'a' - 'A';
  // "invalid literal; last read: '...'; expected ..." quotes raw input, with
  // escaped newlines: the line and column already say where.
  const std::size_t last_read = reason.find("; last read: '");
  if (last_read != std::string::npos) {
    const std::size_t end = reason.find("'; ", last_read + 14);
    reason.erase(last_read, end == std::string::npos ? std::string::npos
                                                     : end + 1 - last_read);
  }
  return reason;
}

// "line L, column C" of the byte at 0-based offset `before`.
std::string LineAndColumn(std::string_view text, std::size_t before) {
  before = std::min(before, text.size());
  int line = 1, column = 1;
  for (std::size_t i = 0; i < before; ++i) {
    if (text[i] == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
  }
  return "line " + std::to_string(line) + ", column " + std::to_string(column);
}

// RFC 6901: "~" as "~0", "/" as "~1".
std::string PointerToken(const std::string& key) {
  std::string out;
  for (char c : key) {
    if (c == '~')
      out += "~0";
    else if (c == '/')
      out += "~1";
    else
      out += c;
  }
  return out;
}

// Follows the parser's events to know the JSON pointer of every key, and
// throws at the second occurrence of a key in one object: nlohmann keeps the
// last value silently, so "resistor": "100k", "resistor": "1k" would budget
// 1 k without a word.
class DuplicateKeyGuard {
 public:
  explicit DuplicateKeyGuard(const std::string& source) : source_(source) {}

  bool operator()(int /*depth*/, nlohmann::json::parse_event_t event,
                  nlohmann::json& parsed) {
    using Event = nlohmann::json::parse_event_t;
    switch (event) {
      case Event::object_start:
      case Event::array_start:
        frames_.push_back(
            {event == Event::array_start, ChildToken(), {}, "", 0});
        break;
      case Event::object_end:
      case Event::array_end:
        frames_.pop_back();
        break;
      case Event::key: {
        Frame& object = frames_.back();
        const std::string& key = parsed.get_ref<const std::string&>();
        if (!object.keys.insert(key).second)
          throw Error(source_, PathTo(PointerToken(key)),
                      "duplicate key (given twice in one object)");
        object.key = key;
        break;
      }
      case Event::value:
        ChildToken();  // a plain value in an array takes its index
        break;
    }
    return true;
  }

 private:
  struct Frame {
    bool array = false;
    std::string token;  // the pointer token of this object or array
    std::set<std::string> keys;
    std::string key;         // objects: the last key read
    std::size_t next_index;  // arrays: the index of the next element
  };

  // The token of the value that starts now inside the innermost frame.
  std::string ChildToken() {
    if (frames_.empty()) return "";
    Frame& parent = frames_.back();
    if (!parent.array) return PointerToken(parent.key);
    return std::to_string(parent.next_index++);
  }

  std::string PathTo(const std::string& last) const {
    std::string path;
    for (std::size_t i = 1; i < frames_.size(); ++i)
      path += "/" + frames_[i].token;
    return path + "/" + last;
  }

  const std::string& source_;
  std::vector<Frame> frames_;
};

}  // namespace

nlohmann::json ParseJsonText(std::string_view text, const std::string& source) {
  try {
    return nlohmann::json::parse(text.begin(), text.end(),
                                 DuplicateKeyGuard(source),
                                 /*allow_exceptions=*/true,
                                 /*ignore_comments=*/true);
  } catch (const nlohmann::json::parse_error& e) {
    // nlohmann reports the 1-based offset of the last byte it read (one
    // past the end when the text ended early); turn it into line and
    // column, so an early end points just after the last character.
    const std::string reason = ParseErrorReason(e.what());
    throw Error(source, "",
                "malformed JSON at " +
                    LineAndColumn(text, e.byte > 0 ? e.byte - 1 : 0) +
                    (reason.empty() ? "" : ": " + reason));
  } catch (const nlohmann::json::out_of_range& e) {
    // A number beyond the double range ("1e999"): the parser names the
    // token ("number overflow parsing '1e999'") but not where it is.
    const std::string what = e.what();
    const std::size_t open = what.find(" parsing '");
    const std::size_t close = what.rfind('\'');
    std::string where;
    if (open != std::string::npos && close != std::string::npos &&
        close > open + 10) {
      const std::size_t at =
          text.find(what.substr(open + 10, close - open - 10));
      if (at != std::string_view::npos)
        where = " at " + LineAndColumn(text, at);
    }
    throw Error(
        source, "",
        "malformed JSON" + where + ": a number beyond the range of a double");
  } catch (const nlohmann::json::exception&) {
    // Any other refusal of the parser (none is documented for parse).
    throw Error(source, "", "malformed JSON");
  }
}

std::string JsonTypeName(const nlohmann::json& value) {
  switch (value.type()) {
    case nlohmann::json::value_t::null:
      return "null";
    case nlohmann::json::value_t::object:
      return "an object";
    case nlohmann::json::value_t::array:
      return "an array";
    case nlohmann::json::value_t::string:
      return "a string";
    case nlohmann::json::value_t::boolean:
      return "a boolean";
    default:
      return "a number";
  }
}

double ReadQuantity(const nlohmann::json& value, hushgain::Quantity kind,
                    const std::string& source, const std::string& path) {
  const std::string expected = "expected " + std::string(QuantityName(kind));
  if (value.is_number()) {
    double v = value.get<double>();
    if (!std::isfinite(v))
      throw Error(source, path, expected + ", got a non-finite number");
    return v;
  }
  if (!value.is_string())
    throw Error(source, path, expected + ", got " + JsonTypeName(value));
  const std::string& text = value.get_ref<const std::string&>();
  std::string why;
  std::optional<double> parsed = ParseQuantity(text, kind, &why);
  if (!parsed)
    throw Error(source, path,
                expected + ", got \"" + text + "\" (" + why + ")");
  return *parsed;
}

namespace {
thread_local KeyLog* live_key_log = nullptr;
}  // namespace

KeyLog::KeyLog() : previous_(live_key_log) { live_key_log = this; }
KeyLog::~KeyLog() { live_key_log = previous_; }

void KeyLog::Record(const std::string& object_path, const std::string& key) {
  if (live_key_log == nullptr) return;
  // "/chain/stages/2" -> "/chain/stages/*": one entry per kind of object.
  std::string pattern;
  std::size_t start = 1;
  while (start <= object_path.size()) {
    std::size_t end = object_path.find('/', start);
    if (end == std::string::npos) end = object_path.size();
    const std::string segment = object_path.substr(start, end - start);
    const bool index =
        !segment.empty() &&
        segment.find_first_not_of("0123456789") == std::string::npos;
    pattern += "/" + (index ? std::string("*") : segment);
    start = end + 1;
  }
  live_key_log->keys_.emplace(pattern, key);
}

ObjectReader::ObjectReader(const nlohmann::json& value, std::string source,
                           std::string path)
    : value_(value), source_(std::move(source)), path_(std::move(path)) {
  if (!value_.is_object())
    throw Error(source_, path_.empty() ? "/" : path_,
                "expected an object, got " + JsonTypeName(value_));
  if (path_.empty()) Has("$schema");
}

bool ObjectReader::Has(const std::string& key) {
  if (std::find(known_.begin(), known_.end(), key) == known_.end()) {
    known_.push_back(key);
    KeyLog::Record(path_, key);
  }
  return value_.contains(key);
}

const nlohmann::json& ObjectReader::Get(const std::string& key) {
  if (!Has(key)) {
    // A misspelt key is likelier than a forgotten one: name it.
    for (auto it = value_.begin(); it != value_.end(); ++it) {
      if (it.key() != key && EditDistance(it.key(), key) <= 2)
        throw ErrorAt(key,
                      "missing (required; is \"" + it.key() + "\" a typo?)");
    }
    throw ErrorAt(key, "missing (required)");
  }
  return value_.at(key);
}

double ObjectReader::Quantity(const std::string& key, hushgain::Quantity kind) {
  return ReadQuantity(Get(key), kind, source_, PathOf(key));
}

std::optional<double> ObjectReader::OptionalQuantity(const std::string& key,
                                                     hushgain::Quantity kind) {
  if (!Has(key)) return std::nullopt;
  return Quantity(key, kind);
}

std::string ObjectReader::String(const std::string& key) {
  const nlohmann::json& v = Get(key);
  if (!v.is_string())
    throw ErrorAt(key, "expected a string, got " + JsonTypeName(v));
  return v.get<std::string>();
}

std::optional<std::string> ObjectReader::OptionalString(
    const std::string& key) {
  if (!Has(key)) return std::nullopt;
  return String(key);
}

ObjectReader ObjectReader::Object(const std::string& key) {
  return ObjectReader(Get(key), source_, PathOf(key));
}

void ObjectReader::Finish() {
  for (auto it = value_.begin(); it != value_.end(); ++it) {
    if (std::find(known_.begin(), known_.end(), it.key()) != known_.end())
      continue;
    throw ErrorAt(it.key(), "unknown key" + DidYouMean(it.key(), known_));
  }
}

std::string ObjectReader::PathOf(const std::string& key) const {
  std::string out = path_ + "/";
  for (char c : key) {
    if (c == '~')
      out += "~0";
    else if (c == '/')
      out += "~1";
    else
      out += c;
  }
  return out;
}

Error ObjectReader::ErrorAt(const std::string& key,
                            const std::string& message) const {
  return Error(source_, PathOf(key), message);
}

Error ObjectReader::ErrorHere(const std::string& message) const {
  return Error(source_, path_.empty() ? "/" : path_, message);
}

}  // namespace hushgain
