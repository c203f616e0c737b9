#include "cli/progress_bar.h"

#include <unistd.h>

#include <cstdio>

namespace hushgain {

ProgressBar::ProgressBar(std::string label)
    : label_(std::move(label)), enabled_(isatty(STDERR_FILENO) == 1) {}

void ProgressBar::Show(double fraction) {
  if (!enabled_) return;
  constexpr int kWidth = 40;
  const int filled = static_cast<int>(fraction * kWidth + 0.5);
  std::string bar(filled, '#');
  bar += std::string(kWidth - filled, '.');
  std::fprintf(stderr, "\r%s [%s] %3d %%", label_.c_str(), bar.c_str(),
               static_cast<int>(100 * fraction + 0.5));
  std::fflush(stderr);
  drawn_ = true;
}

void ProgressBar::Clear() {
  if (!drawn_) return;
  std::fprintf(stderr, "\r%70s\r", "");
  std::fflush(stderr);
  drawn_ = false;
}

}  // namespace hushgain
