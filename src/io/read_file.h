// Reading and writing whole files. Writing goes to a temporary name beside
// the target and is renamed over it, so an interrupted or failed run never
// leaves a truncated file.
#ifndef HUSHGAIN_IO_READ_FILE_H_
#define HUSHGAIN_IO_READ_FILE_H_

#include <string>

namespace hushgain {

// Throws Error(path, "", "cannot read: <reason>").
std::string ReadTextFile(const std::string& path);

// Writes `contents` to `path` through "<path>.tmp-<pid>" and a rename.
// Throws Error naming the path on failure; the target is untouched then.
void WriteFileAtomically(const std::string& path, const std::string& contents);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_READ_FILE_H_
