// Reading and writing whole files. Writing goes to a temporary name beside
// the target and is renamed over it, so an interrupted or failed run never
// leaves a truncated file.
#ifndef HUSHGAIN_IO_READ_FILE_H_
#define HUSHGAIN_IO_READ_FILE_H_

#include <cstddef>
#include <string>

namespace hushgain {

// The largest stage or device file read: generous for any hand-written or
// generated file (the largest shipped one is a few kilobytes), small enough
// that /dev/zero or a runaway pipe is refused at once instead of filling the
// memory.
inline constexpr std::size_t kMaxInputBytes = 16u << 20;  // 16 MiB

// Reads the whole file, a FIFO or a character device alike, never more than
// kMaxInputBytes (a FIFO waits for its writer as any reader does). Throws
// Error(path, "", "cannot read: <reason>"), or Error(path, "", "larger than
// 16 MiB, the limit of an input file") past the limit.
std::string ReadTextFile(const std::string& path);

// The same for standard input, named `source` in errors.
std::string ReadStandardInput(const std::string& source);

// The system's text for an errno value, starting lower-case as every
// message does: "no space left on device".
std::string LowercaseReason(int error_number);

// Writes `contents` to `path` through "<path>.tmp-<pid>" and a rename.
// Throws Error naming the path on failure; the target is untouched then.
// A command's outputs go through cli/output_files.h instead (checked
// before the work, same-file refusals, streams, written all or nothing).
void WriteFileAtomically(const std::string& path, const std::string& contents);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_READ_FILE_H_
