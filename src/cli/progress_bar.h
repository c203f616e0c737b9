// A one-line progress bar on stderr, drawn only when stderr is a terminal,
// erased when done or destroyed.
#ifndef HUSHGAIN_CLI_PROGRESS_BAR_H_
#define HUSHGAIN_CLI_PROGRESS_BAR_H_

#include <string>

namespace hushgain {

class ProgressBar {
 public:
  explicit ProgressBar(std::string label);
  ~ProgressBar() { Clear(); }
  ProgressBar(const ProgressBar&) = delete;
  ProgressBar& operator=(const ProgressBar&) = delete;

  bool enabled() const { return enabled_; }
  void Show(double fraction);  // 0 .. 1
  void Clear();

 private:
  std::string label_;
  bool enabled_;
  bool drawn_ = false;
};

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_PROGRESS_BAR_H_
