// Every file a command writes, in one place (README, "Output files"), so
// that a failed, refused or interrupted run harms nothing on disk:
//
// 1. Check() before any work: each output must name a place that can be
//    written, and no output may be one of the command's inputs (the stage
//    file, the device files) or another output. "Same" means the same file
//    (device and inode, after following symbolic links); a file not there
//    yet is named by its folder's device and inode and its name. Refused:
//    an empty name, "-" where standard output is not taken, a folder, a
//    missing folder, a folder that cannot be written, a block device or
//    socket.
// 2. The command produces its outputs: text with SetText(), pictures drawn
//    by gnuplot into PictureTemporary().
// 3. Commit() writes them all or nothing. A regular file (or a new one) is
//    written to "<name>.tmp-<pid>" in its own folder (for a symbolic link,
//    the folder of the file it points to: the link stays a link), every
//    write, the flush to disk and the close checked, a picture checked for
//    its end (report/picture_check.h). Only when every output is complete
//    are the direct ones written (standard output as "-", /dev/stdout or any
//    name of the file stdout is; a FIFO; a character device) and the
//    temporaries renamed over their targets. On any failure nothing is
//    renamed, every temporary is removed and the old files stay as they
//    were.
#ifndef HUSHGAIN_CLI_OUTPUT_FILES_H_
#define HUSHGAIN_CLI_OUTPUT_FILES_H_

#include <sys/types.h>

#include <atomic>
#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "report/plot_axes.h"

namespace hushgain {

// A file the command reads, named in refusals: {"the stage file", "s.json"}.
// "-" is standard input.
struct InputFile {
  std::string what;
  std::string path;
};

class OutputFiles {
 public:
  using Id = std::size_t;

  OutputFiles() = default;
  ~OutputFiles();  // removes every temporary not renamed
  OutputFiles(const OutputFiles&) = delete;
  OutputFiles& operator=(const OutputFiles&) = delete;

  // A text output named by `option` ("--spectrum") in messages; with
  // `stdout_ok`, "-" is standard output.
  Id AddText(const std::string& option, const std::string& path,
             bool stdout_ok);
  // A picture drawn by gnuplot; never "-".
  Id AddPicture(const std::string& option, const std::string& path,
                PlotFormat format);

  // Step 1. Throws Error: "command line: OPTION: ..." for an empty name,
  // "-" where it is not taken, or an output that is the same file as an
  // input or an earlier output; "PATH: cannot write: REASON" for a place
  // that cannot be written ("no such folder", "is a folder", ...).
  void Check(const std::vector<InputFile>& inputs);

  // True when an output writes to standard output; the command's report is
  // then not printed there.
  bool TakesStdout() const;

  // The text of output `id`, written by Commit().
  void SetText(Id id, std::string text);

  // Text written piece by piece, never held whole: Commit() calls the
  // producer once with a `write` that takes the next piece and returns ""
  // or why it could not be written; the producer stops at the first
  // failure and returns it, or returns "" when all is written.
  using Write = std::function<std::string(std::string_view piece)>;
  using TextProducer = std::function<std::string(const Write& write)>;
  void SetTextProducer(Id id, TextProducer producer);

  // Creates the temporary that picture `id` is drawn into (beside a regular
  // target, else in the system temporary folder) and returns its path; on
  // failure prints "error: PATH: cannot write: REASON" and returns "" (the
  // caller returns kExitSystem).
  std::string PictureTemporary(Id id);

  // Step 3: kExitOk; kExitSystem after one line "error: PATH: cannot
  // write: REASON" (disk full, an incomplete picture, ...); or, when `stop`
  // is set before anything is written, kExitInterrupted with nothing said
  // and nothing written (the caller reports the interruption).
  int Commit(const std::atomic<bool>* stop = nullptr);

  // Removes every temporary; nothing is written.
  void Discard();

  // The path of output `id` as given.
  const std::string& Path(Id id) const { return outputs_[id].path; }

 private:
  enum class Target { kUnchecked, kStdout, kRegular, kDirect };
  struct Output {
    std::string option;
    std::string path;  // as given
    bool stdout_ok = false;
    std::optional<PlotFormat> picture;
    Target target = Target::kUnchecked;
    std::string final_path;      // kRegular: the file replaced (links followed)
    std::optional<mode_t> mode;  // kRegular: the mode of the file replaced
    std::string temporary;       // created, not yet renamed or removed
    std::string text;
    TextProducer producer;  // when set, writes the text instead
  };

  // Writes the text of `o` to `fd`; "" or why not.
  static std::string WriteText(const Output& o, int fd);
  // Writes text output `o` to its temporary; "" or why not.
  std::string WriteTemporary(Output& o);
  // Writes `o` to standard output, its FIFO or device; "" or why not.
  std::string WriteDirect(const Output& o);
  int Fail(const Output& o, const std::string& why);

  std::vector<Output> outputs_;
};

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_OUTPUT_FILES_H_
