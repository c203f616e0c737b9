#include "cli/output_files.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <filesystem>
#include <iostream>

#include "cli/diagnostics.h"
#include "cli/exit_codes.h"
#include "cli/option_values.h"
#include "io/error.h"
#include "io/read_file.h"
#include "report/picture_check.h"

namespace hushgain {
namespace {

namespace fs = std::filesystem;

// Linux's limit on symbolic links followed in one lookup (MAXSYMLINKS).
constexpr int kMaxLinkHops = 40;

// Which file an output is: an existing one by device and inode, a file not
// there yet by its folder's device and inode and its name.
struct Identity {
  dev_t dev = 0;
  ino_t ino = 0;
  std::string name;
  bool operator==(const Identity&) const = default;
};

// `path` with its symbolic links followed to the name they end at, which
// may not exist yet (a link to a file to be made). Throws on a loop.
std::string FollowLinks(const std::string& path) {
  fs::path p = path;
  for (int hop = 0; hop < kMaxLinkHops; ++hop) {
    struct stat st;
    if (::lstat(p.c_str(), &st) != 0 || !S_ISLNK(st.st_mode)) return p.string();
    std::error_code ec;
    const fs::path target = fs::read_symlink(p, ec);
    if (ec) return p.string();
    p = target.is_absolute() ? target : p.parent_path() / target;
  }
  throw Error(path, "", "cannot write: " + LowercaseReason(ELOOP));
}

std::string FolderOf(const std::string& path) {
  const fs::path folder = fs::path(path).parent_path();
  return folder.empty() ? "." : folder.string();
}

// Throws unless a file can be made in `folder` (for `path`).
void CheckFolderWritable(const std::string& path, const std::string& folder) {
  if (::access(folder.c_str(), W_OK | X_OK) != 0)
    throw Error(path, "", "cannot write: " + LowercaseReason(errno));
}

// Writes all of `text` to `fd`; "" or why not.
std::string WriteAll(int fd, const char* data, std::size_t size) {
  while (size > 0) {
    const ssize_t n = ::write(fd, data, size);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) return LowercaseReason(errno);
    if (n == 0) return LowercaseReason(EIO);
    data += n;
    size -= static_cast<std::size_t>(n);
  }
  return "";
}

// Reads up to `size` bytes of `fd` at `offset`; "" and *out, or why not.
std::string ReadAt(int fd, off_t offset, std::size_t size, std::string* out) {
  out->assign(size, '\0');
  std::size_t got = 0;
  while (got < size) {
    const ssize_t n = ::pread(fd, out->data() + got, size - got,
                              offset + static_cast<off_t>(got));
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) return LowercaseReason(errno);
    if (n == 0) break;
    got += static_cast<std::size_t>(n);
  }
  out->resize(got);
  return "";
}

// Whether the picture gnuplot wrote at `path` reached the disk whole.
std::string CheckPictureFile(const std::string& path, PlotFormat format) {
  const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) return LowercaseReason(errno);
  struct stat st;
  std::string why;
  std::string head, tail;
  if (::fstat(fd, &st) != 0) {
    why = LowercaseReason(errno);
  } else if (::fsync(fd) != 0) {
    // The writer closed the file; data it left unwritten shows here.
    why = LowercaseReason(errno);
  } else {
    const auto size = static_cast<std::size_t>(st.st_size);
    why = ReadAt(fd, 0, std::min(size, kPictureHeadBytes), &head);
    const std::size_t tail_size = std::min(size, kPictureTailBytes);
    if (why.empty())
      why = ReadAt(fd, static_cast<off_t>(size - tail_size), tail_size, &tail);
    if (why.empty()) {
      const std::string missing = IncompletePicture(format, head, tail);
      if (!missing.empty())
        why = "the picture gnuplot drew is incomplete (" + missing +
              "); is the disk full?";
    }
  }
  ::close(fd);
  return why;
}

}  // namespace

OutputFiles::~OutputFiles() { Discard(); }

OutputFiles::Id OutputFiles::AddText(const std::string& option,
                                     const std::string& path, bool stdout_ok) {
  Output o;
  o.option = option;
  o.path = path;
  o.stdout_ok = stdout_ok;
  outputs_.push_back(std::move(o));
  return outputs_.size() - 1;
}

OutputFiles::Id OutputFiles::AddPicture(const std::string& option,
                                        const std::string& path,
                                        PlotFormat format) {
  const Id id = AddText(option, path, false);
  outputs_[id].picture = format;
  return id;
}

void OutputFiles::Check(const std::vector<InputFile>& inputs) {
  struct stat out_st;
  const bool have_stdout = ::fstat(STDOUT_FILENO, &out_st) == 0;
  const auto is_stdout = [&](const struct stat& st) {
    return have_stdout && st.st_dev == out_st.st_dev &&
           st.st_ino == out_st.st_ino;
  };
  std::vector<Identity> seen;
  for (Output& o : outputs_) {
    if (o.path.empty())
      throw OptionError(o.option, "expected a file name, got \"\"");
    Identity id;
    struct stat st;
    if (o.path == "-") {
      if (!o.stdout_ok)
        throw OptionError(o.option,
                          "expected a file name (\"-\", standard output, is "
                          "taken by --spectrum, --chain-csv, --csv and "
                          "--script)");
      if (!have_stdout)
        throw Error("stdout", "", "cannot write: " + LowercaseReason(errno));
      o.target = Target::kStdout;
      id = {out_st.st_dev, out_st.st_ino, ""};
    } else if (::stat(o.path.c_str(), &st) == 0) {
      if (is_stdout(st)) {
        o.target = Target::kStdout;
      } else if (S_ISDIR(st.st_mode)) {
        throw Error(o.path, "", "cannot write: is a folder");
      } else if (S_ISFIFO(st.st_mode) || S_ISCHR(st.st_mode)) {
        o.target = Target::kDirect;
      } else if (S_ISREG(st.st_mode)) {
        o.target = Target::kRegular;
        o.final_path = FollowLinks(o.path);
        o.mode = st.st_mode & 07777;
        CheckFolderWritable(o.path, FolderOf(o.final_path));
      } else {
        throw Error(o.path, "",
                    "cannot write: not a regular file, FIFO or character "
                    "device");
      }
      id = {st.st_dev, st.st_ino, ""};
    } else if (errno == ENOENT || errno == ENOTDIR) {
      o.final_path = FollowLinks(o.path);
      const std::string folder = FolderOf(o.final_path);
      struct stat folder_st;
      if (::stat(folder.c_str(), &folder_st) != 0 ||
          !S_ISDIR(folder_st.st_mode))
        throw Error(o.path, "", "cannot write: no such folder");
      CheckFolderWritable(o.path, folder);
      o.target = Target::kRegular;
      id = {folder_st.st_dev, folder_st.st_ino,
            fs::path(o.final_path).filename().string()};
    } else {
      throw Error(o.path, "", "cannot write: " + LowercaseReason(errno));
    }

    for (std::size_t k = 0; k < seen.size(); ++k)
      if (seen[k] == id)
        throw OptionError(o.option, "\"" + o.path + "\" is the same file as " +
                                        outputs_[k].option + " \"" +
                                        outputs_[k].path + "\"");
    if (id.name.empty()) {
      for (const InputFile& in : inputs) {
        struct stat in_st;
        const bool found = in.path == "-"
                               ? ::fstat(STDIN_FILENO, &in_st) == 0
                               : ::stat(in.path.c_str(), &in_st) == 0;
        // Only a regular file can be overwritten; a terminal that is both
        // stdin and stdout is no conflict.
        if (found && S_ISREG(in_st.st_mode) && in_st.st_dev == id.dev &&
            in_st.st_ino == id.ino)
          throw OptionError(o.option, "\"" + o.path +
                                          "\" is the same file as " + in.what +
                                          " \"" + in.path + "\"");
      }
    }
    seen.push_back(std::move(id));
  }
}

bool OutputFiles::TakesStdout() const {
  for (const Output& o : outputs_)
    if (o.target == Target::kStdout) return true;
  return false;
}

void OutputFiles::SetText(Id id, std::string text) {
  outputs_[id].text = std::move(text);
  outputs_[id].producer = nullptr;
}

void OutputFiles::SetTextProducer(Id id, TextProducer producer) {
  outputs_[id].text.clear();
  outputs_[id].producer = std::move(producer);
}

std::string OutputFiles::WriteText(const Output& o, int fd) {
  if (!o.producer) return WriteAll(fd, o.text.data(), o.text.size());
  return o.producer([fd](std::string_view piece) {
    return WriteAll(fd, piece.data(), piece.size());
  });
}

namespace {

// Creates "<final>.tmp-<pid>" for `final_path` with the mode of the file
// it replaces (none: a new file, as the umask allows); returns the
// descriptor, or -1 with errno set.
int CreateTemporary(const std::string& final_path,
                    const std::optional<mode_t>& mode, std::string* temporary) {
  *temporary = final_path + ".tmp-" + std::to_string(::getpid());
  const int fd =
      ::open(temporary->c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC,
             mode ? *mode : 0666);
  if (fd < 0) {
    temporary->clear();
    return -1;
  }
  // The umask may have taken bits the replaced file had.
  if (mode) ::fchmod(fd, *mode);
  return fd;
}

}  // namespace

std::string OutputFiles::PictureTemporary(Id id) {
  Output& o = outputs_[id];
  int fd = -1;
  std::string path;
  if (o.target == Target::kRegular) {
    fd = CreateTemporary(o.final_path, o.mode, &path);
  } else {
    path = (fs::temp_directory_path() / "hushgain-picture-XXXXXX").string();
    fd = ::mkstemp(path.data());
  }
  if (fd < 0) {
    ReportWriteFailure(o.path, LowercaseReason(errno));
    Discard();
    return "";
  }
  ::close(fd);
  o.temporary = path;
  return path;
}

std::string OutputFiles::WriteTemporary(Output& o) {
  std::string path;
  const int fd = CreateTemporary(o.final_path, o.mode, &path);
  if (fd < 0) return LowercaseReason(errno);
  o.temporary = path;
  std::string why = WriteText(o, fd);
  // fsync: a full disk or an I/O error that write() did not see shows here.
  if (why.empty() && ::fsync(fd) != 0) why = LowercaseReason(errno);
  if (::close(fd) != 0 && why.empty()) why = LowercaseReason(errno);
  return why;
}

std::string OutputFiles::WriteDirect(const Output& o) {
  int fd = STDOUT_FILENO;
  if (o.target == Target::kStdout) {
    std::cout.flush();
  } else {
    // A FIFO waits here for its reader, as any writer does.
    fd = ::open(o.path.c_str(), O_WRONLY | O_NOCTTY | O_CLOEXEC);
    if (fd < 0) return LowercaseReason(errno);
  }
  std::string why;
  if (!o.picture) {
    why = WriteText(o, fd);
  } else {
    const int in = ::open(o.temporary.c_str(), O_RDONLY | O_CLOEXEC);
    if (in < 0) why = LowercaseReason(errno);
    char buffer[65536];
    while (in >= 0 && why.empty()) {
      const ssize_t n = ::read(in, buffer, sizeof buffer);
      if (n < 0 && errno == EINTR) continue;
      if (n < 0) why = LowercaseReason(errno);
      if (n <= 0) break;
      why = WriteAll(fd, buffer, static_cast<std::size_t>(n));
    }
    if (in >= 0) ::close(in);
  }
  if (fd != STDOUT_FILENO && ::close(fd) != 0 && why.empty())
    why = LowercaseReason(errno);
  return why;
}

int OutputFiles::Fail(const Output& o, const std::string& why) {
  Discard();
  return ReportWriteFailure(o.path, why);
}

int OutputFiles::Commit(const std::atomic<bool>* stop) {
  for (Output& o : outputs_) {
    if (o.target == Target::kUnchecked)
      return Fail(o, "not checked before writing");
    if (o.target != Target::kRegular || o.picture) continue;
    const std::string why = WriteTemporary(o);
    if (!why.empty()) return Fail(o, why);
  }
  for (const Output& o : outputs_) {
    if (!o.picture) continue;
    if (o.temporary.empty()) return Fail(o, "no picture was drawn");
    const std::string why = CheckPictureFile(o.temporary, *o.picture);
    if (!why.empty()) return Fail(o, why);
  }
  if (stop != nullptr && stop->load()) {
    Discard();
    return kExitInterrupted;
  }
  for (const Output& o : outputs_) {
    if (o.target == Target::kRegular) continue;
    const std::string why = WriteDirect(o);
    if (!why.empty()) return Fail(o, why);
  }
  for (Output& o : outputs_) {
    if (o.target != Target::kRegular) continue;
    if (::rename(o.temporary.c_str(), o.final_path.c_str()) != 0)
      return Fail(o, LowercaseReason(errno));
    o.temporary.clear();
  }
  Discard();  // the pictures drawn for direct targets
  return kExitOk;
}

void OutputFiles::Discard() {
  for (Output& o : outputs_) {
    if (o.temporary.empty()) continue;
    ::unlink(o.temporary.c_str());
    o.temporary.clear();
  }
}

}  // namespace hushgain
