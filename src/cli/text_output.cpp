#include "cli/text_output.h"

#include <langinfo.h>

#include <clocale>
#include <cstdlib>
#include <cstring>
#include <iostream>
#include <memory>
#include <streambuf>

#include "base/control_characters.h"
#include "report/ascii_text.h"

namespace hushgain {
namespace {

// A stream buffer that spells what passes through it in ASCII; a UTF-8
// sequence split across writes is held back until it is whole.
class AsciiStreambuf : public std::streambuf {
 public:
  explicit AsciiStreambuf(std::streambuf* target) : target_(target) {}

 protected:
  int overflow(int c) override {
    if (c == traits_type::eof()) return sync() == 0 ? 0 : traits_type::eof();
    pending_ += static_cast<char>(c);
    Pass();
    return c;
  }
  std::streamsize xsputn(const char* s, std::streamsize n) override {
    pending_.append(s, static_cast<std::size_t>(n));
    Pass();
    return n;
  }
  int sync() override { return target_->pubsync(); }

 public:
  // Passes on what is held back (a UTF-8 sequence never completed) as it
  // is, before the filter goes.
  void Drain() {
    target_->sputn(pending_.data(),
                   static_cast<std::streamsize>(pending_.size()));
    pending_.clear();
    target_->pubsync();
  }

 private:
  void Pass() {
    const std::size_t whole = CompleteUtf8Prefix(pending_);
    const std::string out =
        AsciiText(std::string_view(pending_).substr(0, whole));
    target_->sputn(out.data(), static_cast<std::streamsize>(out.size()));
    pending_.erase(0, whole);
  }

  std::streambuf* target_;
  std::string pending_;
};

// The run's choice, set by an AsciiOutput while it lives.
bool ascii_output = false;

bool Set(const char* name) {
  const char* v = std::getenv(name);
  return v != nullptr && v[0] != '\0';
}

}  // namespace

bool LocaleWantsAscii() {
  if (!Set("LC_ALL") && !Set("LC_CTYPE") && !Set("LANG")) return false;
  bool ascii = false;
  if (std::setlocale(LC_CTYPE, "") != nullptr) {
    const char* codeset = nl_langinfo(CODESET);
    ascii = codeset == nullptr || (std::strcmp(codeset, "UTF-8") != 0 &&
                                   std::strcmp(codeset, "utf8") != 0);
  }
  // A locale that does not exist on this machine tells nothing: stay UTF-8.
  std::setlocale(LC_CTYPE, "C");
  return ascii;
}

AsciiOutput::AsciiOutput()
    : previous_(std::cerr.rdbuf()),
      filter_(std::make_unique<AsciiStreambuf>(previous_)) {
  std::cerr.rdbuf(filter_.get());
  ascii_output = true;
}

AsciiOutput::~AsciiOutput() {
  static_cast<AsciiStreambuf*>(filter_.get())->Drain();
  std::cerr.rdbuf(previous_);
  ascii_output = false;
}

void WriteReport(const std::string& report, const std::string& format) {
  const std::string safe = EscapeControlCharacters(report, LineBreaks::kKeep);
  if (ascii_output && (format == "text" || format == "markdown"))
    std::cout << AsciiText(safe);
  else
    std::cout << safe;
  std::cout << std::flush;
}

}  // namespace hushgain
