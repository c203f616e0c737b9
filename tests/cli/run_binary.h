// Runs a program as a child process (fork and exec, no shell) and captures
// its exit code, standard output and standard error, for end-to-end tests
// of the built hushgain binary.
#ifndef HUSHGAIN_TESTS_CLI_RUN_BINARY_H_
#define HUSHGAIN_TESTS_CLI_RUN_BINARY_H_

#include <filesystem>
#include <string>
#include <vector>

namespace hushgain::test {

struct RunResult {
  // The exit status; 128 + signal number when the child died of a signal,
  // -1 when it could not be started.
  int exit_code = -1;
  int signal = 0;   // the signal that ended the child, 0 when it exited
  std::string out;  // everything written to stdout
  std::string err;  // everything written to stderr
};

// A child started by StartBinary and not yet waited for.
struct RunningBinary {
  int pid = -1;  // -1: it could not be started
  std::string out_path, err_path;
};

// Starts `program` as RunBinary does and returns at once.
RunningBinary StartBinary(const std::string& program,
                          const std::vector<std::string>& args,
                          const std::string& working_dir = "",
                          const std::string& stdin_path = "");

// Waits for a started child and collects what RunBinary returns.
RunResult WaitBinary(const RunningBinary& child);

// Runs `program` with `args` (argv[1..]); the child's stdout and stderr go
// to temporary files that are read back and removed. Blocks until the child
// exits. `working_dir`, when not empty, is the child's current directory.
// `stdin_path`, when not empty, is opened as the child's standard input.
RunResult RunBinary(const std::string& program,
                    const std::vector<std::string>& args,
                    const std::string& working_dir = "",
                    const std::string& stdin_path = "");

// The whole file at `path` as bytes; empty when it cannot be read.
std::string ReadAll(const std::filesystem::path& path);

// The lines of `text` (split at '\n'; a final newline ends the last line
// and does not start a new one).
std::vector<std::string> Lines(const std::string& text);

}  // namespace hushgain::test

#endif  // HUSHGAIN_TESTS_CLI_RUN_BINARY_H_
