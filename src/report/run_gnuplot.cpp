#include "report/run_gnuplot.h"

#include <fcntl.h>
#include <spawn.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <vector>

extern char** environ;

namespace hushgain {
namespace {

bool IsExecutableFile(const std::string& path) {
  struct stat st;
  return ::stat(path.c_str(), &st) == 0 && S_ISREG(st.st_mode) &&
         ::access(path.c_str(), X_OK) == 0;
}

std::string FirstLines(const std::string& text, int count) {
  std::string out;
  std::size_t start = 0;
  for (int i = 0; i < count && start < text.size(); ++i) {
    std::size_t end = text.find('\n', start);
    if (end == std::string::npos) end = text.size();
    std::string line = text.substr(start, end - start);
    start = end + 1;
    if (line.find_first_not_of(" \t") == std::string::npos) {
      --i;
      continue;
    }
    if (!out.empty()) out += " / ";
    out += line.substr(line.find_first_not_of(" \t"));
  }
  return out;
}

bool WriteAll(int fd, const std::string& text) {
  std::size_t done = 0;
  while (done < text.size()) {
    const ssize_t n = ::write(fd, text.data() + done, text.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) return false;
    done += static_cast<std::size_t>(n);
  }
  return true;
}

}  // namespace

std::string FindGnuplot() {
  const char* path = std::getenv("PATH");
  if (path == nullptr) return "";
  std::string dirs = path;
  std::size_t start = 0;
  while (start <= dirs.size()) {
    std::size_t end = dirs.find(':', start);
    if (end == std::string::npos) end = dirs.size();
    const std::string dir = dirs.substr(start, end - start);
    const std::string candidate = (dir.empty() ? "." : dir) + "/gnuplot";
    if (IsExecutableFile(candidate)) return candidate;
    start = end + 1;
  }
  return "";
}

GnuplotRun RunGnuplot(const std::string& gnuplot_path,
                      const std::string& script) {
  GnuplotRun run;
  const char* tmp = std::getenv("TMPDIR");
  std::string script_path = std::string(tmp != nullptr && *tmp ? tmp : "/tmp") +
                            "/hushgain-plot-XXXXXX";
  std::vector<char> name(script_path.begin(), script_path.end());
  name.push_back('\0');
  const int fd = ::mkstemp(name.data());
  if (fd < 0) {
    run.message = "cannot write the gnuplot script in " +
                  script_path.substr(0, script_path.rfind('/')) + ": " +
                  std::strerror(errno);
    return run;
  }
  script_path = name.data();
  const bool written = WriteAll(fd, script);
  ::close(fd);
  if (!written) {
    ::unlink(script_path.c_str());
    run.message = "cannot write the gnuplot script " + script_path;
    return run;
  }

  int pipe_fds[2];
  if (::pipe(pipe_fds) != 0) {
    ::unlink(script_path.c_str());
    run.message = std::string("cannot start gnuplot: ") + std::strerror(errno);
    return run;
  }
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_adddup2(&actions, pipe_fds[1], 2);
  posix_spawn_file_actions_addclose(&actions, pipe_fds[0]);
  posix_spawn_file_actions_addclose(&actions, pipe_fds[1]);
  std::string arg0 = "gnuplot";
  std::vector<char*> argv = {arg0.data(), script_path.data(), nullptr};
  pid_t pid = 0;
  const int spawn_error = posix_spawn(&pid, gnuplot_path.c_str(), &actions,
                                      nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  ::close(pipe_fds[1]);
  if (spawn_error != 0) {
    ::close(pipe_fds[0]);
    ::unlink(script_path.c_str());
    run.message =
        "cannot start " + gnuplot_path + ": " + std::strerror(spawn_error);
    return run;
  }
  char buf[4096];
  for (;;) {
    const ssize_t n = ::read(pipe_fds[0], buf, sizeof buf);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) break;
    run.stderr_text.append(buf, static_cast<std::size_t>(n));
  }
  ::close(pipe_fds[0]);
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0 && errno == EINTR) {
  }
  ::unlink(script_path.c_str());
  if (WIFEXITED(status) && WEXITSTATUS(status) == 0) {
    run.ok = true;
    return run;
  }
  run.message =
      WIFEXITED(status)
          ? "gnuplot failed (exit status " +
                std::to_string(WEXITSTATUS(status)) + ")"
          : "gnuplot was stopped by signal " + std::to_string(WTERMSIG(status));
  if (const std::string said = FirstLines(run.stderr_text, 2); !said.empty())
    run.message += ": " + said;
  return run;
}

}  // namespace hushgain
