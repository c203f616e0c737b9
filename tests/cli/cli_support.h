// Helpers for the end-to-end tests: every example stage in examples/, the
// scratch folder (cli/temp_folder.h), and the built binary run through
// RunBinary (cli/run_binary.h: fork and exec, no shell).
#ifndef HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_
#define HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_

#include <unistd.h>

#include <algorithm>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "cli/run_binary.h"
#include "cli/temp_folder.h"

namespace hushgain::test {

// Every stage file in examples/, by path, sorted.
inline std::vector<std::string> ExamplePaths() {
  std::vector<std::string> out;
  for (const auto& e : std::filesystem::directory_iterator(
           std::filesystem::path(HUSHGAIN_SOURCE_DIR) / "examples"))
    if (e.path().extension() == ".json") out.push_back(e.path().string());
  std::sort(out.begin(), out.end());
  return out;
}

inline std::string ExamplePath(const std::string& name) {
  return std::string(HUSHGAIN_SOURCE_DIR) + "/examples/" + name + ".json";
}

inline std::string Stem(const std::string& path) {
  return std::filesystem::path(path).stem().string();
}

// A minimal XML well-formedness check (XML 1.0, section 2.1 production
// "document"): tags balance and nest, with comments, processing
// instructions, the DOCTYPE and CDATA skipped; one root element.
inline bool WellFormedXml(const std::string& xml, std::string* why) {
  std::vector<std::string> open;
  int roots = 0;
  std::size_t i = 0;
  while ((i = xml.find('<', i)) != std::string::npos) {
    auto skip = [&](const char* start, const char* end) {
      if (xml.compare(i, std::strlen(start), start) != 0) return false;
      const std::size_t e = xml.find(end, i);
      i = e == std::string::npos ? xml.size() : e + std::strlen(end);
      return true;
    };
    if (skip("<!--", "-->") || skip("<?", "?>") || skip("<![CDATA[", "]]>") ||
        skip("<!DOCTYPE", ">"))
      continue;
    const std::size_t end = xml.find('>', i);
    if (end == std::string::npos) return *why = "unclosed tag", false;
    std::string tag = xml.substr(i + 1, end - i - 1);
    i = end + 1;
    if (tag.empty()) return *why = "empty tag", false;
    if (tag[0] == '/') {
      const std::string name = tag.substr(1, tag.find_first_of(" \t\n") - 1);
      if (open.empty() || open.back() != name)
        return *why = "mismatched </" + name + ">", false;
      open.pop_back();
      continue;
    }
    const bool self_closing = tag.back() == '/';
    const std::string name = tag.substr(0, tag.find_first_of(" \t\n/"));
    if (open.empty()) ++roots;
    if (!self_closing) open.push_back(name);
  }
  if (!open.empty()) return *why = "unclosed <" + open.back() + ">", false;
  if (roots != 1) return *why = "expected one root element", false;
  return true;
}

// `text` with the predefined XML entities (XML 1.0 section 4.6) read back.
inline std::string DecodeXmlEntities(const std::string& text) {
  std::string decoded;
  for (std::size_t k = 0; k < text.size(); ++k) {
    bool replaced = false;
    for (auto [entity, c] : {std::pair{"&amp;", '&'},
                             {"&lt;", '<'},
                             {"&gt;", '>'},
                             {"&quot;", '"'},
                             {"&apos;", '\''}})
      if (text.compare(k, std::strlen(entity), entity) == 0) {
        decoded += c;
        k += std::strlen(entity) - 1;
        replaced = true;
        break;
      }
    if (!replaced) decoded += text[k];
  }
  return decoded;
}

// The built binary with `args`; `env` entries ("PATH=...") go through
// /usr/bin/env when given.
// Stage names that would run a command if they reached gnuplot unescaped
// (`pwned` is the file each would create).
inline std::vector<std::string> HostileStageNames(const std::string& pwned) {
  return {
      "\"; system(\"touch " + pwned + "\") ; \"",
      "'; system('touch " + pwned + "') ; '",
      "`touch " + pwned + "` @x & <b> | *c* \\",
  };
}

inline RunResult RunHushgain(const std::vector<std::string>& args,
                             const std::vector<std::string>& env = {}) {
  if (env.empty()) return RunBinary(HUSHGAIN_BINARY, args);
  std::vector<std::string> all = env;
  all.push_back(HUSHGAIN_BINARY);
  all.insert(all.end(), args.begin(), args.end());
  return RunBinary("/usr/bin/env", all);
}

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_CLI_SUPPORT_H_
