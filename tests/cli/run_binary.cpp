#include "cli/run_binary.h"

#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <csignal>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace hushgain::test {
namespace {

// A fresh, empty file under the system temporary folder; returns its path.
std::string TemporaryFile(const char* tag) {
  std::string pattern =
      (std::filesystem::temp_directory_path() / "hushgain-run-").string() +
      tag + "-XXXXXX";
  int fd = ::mkstemp(pattern.data());
  if (fd >= 0) ::close(fd);
  return pattern;
}

}  // namespace

std::string ReadAll(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
}

RunningBinary StartBinary(const std::string& program,
                          const std::vector<std::string>& args,
                          const std::string& working_dir,
                          const std::string& stdin_path) {
  RunningBinary child;
  child.out_path = TemporaryFile("out");
  child.err_path = TemporaryFile("err");
  const std::string& out_path = child.out_path;
  const std::string& err_path = child.err_path;

  std::vector<std::string> argv_storage;
  argv_storage.push_back(program);
  argv_storage.insert(argv_storage.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (std::string& a : argv_storage) argv.push_back(a.data());
  argv.push_back(nullptr);

  const pid_t pid = ::fork();
  if (pid == 0) {
    // Child: only async-signal-safe calls until exec. Ctrl-C as a shell
    // gives it, whatever the test runner's own handling.
    ::signal(SIGINT, SIG_DFL);
    int out_fd = ::open(out_path.c_str(), O_WRONLY | O_TRUNC);
    int err_fd = ::open(err_path.c_str(), O_WRONLY | O_TRUNC);
    if (out_fd < 0 || err_fd < 0) ::_exit(126);
    ::dup2(out_fd, STDOUT_FILENO);
    ::dup2(err_fd, STDERR_FILENO);
    ::close(out_fd);
    ::close(err_fd);
    if (!stdin_path.empty()) {
      const int in_fd = ::open(stdin_path.c_str(), O_RDONLY);
      if (in_fd < 0) ::_exit(126);
      ::dup2(in_fd, STDIN_FILENO);
      ::close(in_fd);
    }
    if (!working_dir.empty() && ::chdir(working_dir.c_str()) != 0) ::_exit(126);
    ::execv(program.c_str(), argv.data());
    ::_exit(127);
  }
  child.pid = pid > 0 ? pid : -1;
  return child;
}

RunResult WaitBinary(const RunningBinary& child) {
  RunResult result;
  if (child.pid > 0) {
    int status = 0;
    pid_t waited = -1;
    do {
      waited = ::waitpid(child.pid, &status, 0);
    } while (waited < 0 && errno == EINTR);
    if (waited < 0) {
      result.exit_code = -1;
    } else if (WIFEXITED(status)) {
      result.exit_code = WEXITSTATUS(status);
    } else if (WIFSIGNALED(status)) {
      result.signal = WTERMSIG(status);
      result.exit_code = 128 + result.signal;
    }
  }
  result.out = ReadAll(child.out_path);
  result.err = ReadAll(child.err_path);
  std::filesystem::remove(child.out_path);
  std::filesystem::remove(child.err_path);
  return result;
}

RunResult RunBinary(const std::string& program,
                    const std::vector<std::string>& args,
                    const std::string& working_dir,
                    const std::string& stdin_path) {
  return WaitBinary(StartBinary(program, args, working_dir, stdin_path));
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> lines;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string::npos) end = text.size();
    lines.push_back(text.substr(start, end - start));
    start = end + 1;
  }
  return lines;
}

}  // namespace hushgain::test
