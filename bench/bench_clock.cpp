#include "bench_clock.hpp"

#include "core/error.hpp"

#include <fcntl.h>
#include <poll.h>
#include <spawn.h>
#include <signal.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <sstream>

namespace ts::bench {

namespace {
int checked = 0, met = 0;
constexpr int label_width = 68, value_width = 14, target_width = 16;
} // namespace

double seconds_of(const std::function<void()>& job) {
  auto t0 = Clock::now();
  job();
  auto t1 = Clock::now();
  return std::chrono::duration<double>(t1 - t0).count();
}

double median_of(std::vector<double> v) {
  if (v.empty()) return 0;
  std::sort(v.begin(), v.end());
  std::size_t n = v.size();
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

Timing time_repeated(int repeats, const std::function<void()>& job) {
  std::vector<double> t;
  for (int i = 0; i < std::max(1, repeats); ++i) t.push_back(seconds_of(job));
  return {t.front(), median_of(t), static_cast<int>(t.size())};
}

double seconds_of_process(const std::vector<std::string>& argv, int* status, long* page_faults) {
  std::vector<char*> args;
  for (const auto& a : argv) args.push_back(const_cast<char*>(a.c_str()));
  args.push_back(nullptr);
  posix_spawn_file_actions_t io;
  posix_spawn_file_actions_init(&io);
  posix_spawn_file_actions_addopen(&io, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&io, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&io, 2, "/dev/null", O_WRONLY, 0);
  *status = -1;
  auto t0 = Clock::now();
  pid_t pid = 0;
  int rc = posix_spawn(&pid, args[0], &io, nullptr, args.data(), environ);
  int wstatus = 0;
  rusage used{};
  if (rc == 0 && wait4(pid, &wstatus, 0, &used) == pid && WIFEXITED(wstatus)) *status = WEXITSTATUS(wstatus);
  if (page_faults) *page_faults = used.ru_minflt + used.ru_majflt;
  auto t1 = Clock::now();
  posix_spawn_file_actions_destroy(&io);
  return std::chrono::duration<double>(t1 - t0).count();
}

double peak_memory_mib() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_maxrss) / 1024.0; // Linux reports KiB
}

double peak_memory_children_mib() {
  rusage u{};
  getrusage(RUSAGE_CHILDREN, &u);
  return static_cast<double>(u.ru_maxrss) / 1024.0;
}

ProbeOutcome run_in_child(int repeats, double timeout, const std::function<int()>& job) {
  ProbeOutcome out;
  int fd[2];
  if (pipe(fd) != 0) fail(ErrorKind::internal, "pipe() failed for a benchmark probe");
  std::fflush(stdout);
  std::fflush(stderr);
  pid_t pid = fork();
  if (pid < 0) fail(ErrorKind::internal, "fork() failed for a benchmark probe");
  if (pid == 0) {
    close(fd[0]);
    std::string line;
    try {
      int independent = -1;
      Timing t = time_repeated(repeats, [&] { independent = job(); });
      char buf[64];
      std::snprintf(buf, sizeof buf, "ok %.9g %d", t.median, independent);
      line = buf;
    } catch (const std::exception& e) {
      const auto* te = dynamic_cast<const Error*>(&e);
      line = std::string("error ") + (te ? te->problem() : e.what());
    }
    for (std::size_t done = 0; done < line.size();) {
      ssize_t n = write(fd[1], line.data() + done, line.size() - done);
      if (n <= 0) break;
      done += static_cast<std::size_t>(n);
    }
    close(fd[1]);
    _exit(0);
  }
  close(fd[1]);
  std::string text;
  const auto deadline = Clock::now() + std::chrono::duration<double>(timeout);
  bool eof = false;
  while (!eof) {
    auto left = std::chrono::duration_cast<std::chrono::milliseconds>(deadline - Clock::now()).count();
    if (left <= 0) break;
    pollfd p{fd[0], POLLIN, 0};
    int r = poll(&p, 1, static_cast<int>(std::min<long long>(left, 1000)));
    if (r < 0) break;
    if (r == 0) continue;
    char buf[512];
    ssize_t n = read(fd[0], buf, sizeof buf);
    if (n <= 0) eof = true;
    else text.append(buf, static_cast<std::size_t>(n));
  }
  close(fd[0]);
  int status = 0;
  if (!eof) {
    kill(pid, SIGKILL);
    waitpid(pid, &status, 0);
    out.status = ProbeOutcome::timed_out;
    char buf[64];
    std::snprintf(buf, sizeof buf, "stopped after %g s", timeout);
    out.message = buf;
    return out;
  }
  waitpid(pid, &status, 0);
  std::istringstream in(text);
  std::string word;
  in >> word;
  if (word == "ok" && (in >> out.median >> out.independent)) {
    out.status = ProbeOutcome::ok;
  } else if (word == "error") {
    std::getline(in, out.message);
    if (!out.message.empty() && out.message[0] == ' ') out.message.erase(0, 1);
  } else {
    out.message = WIFSIGNALED(status) ? "the probe process died of signal " + std::to_string(WTERMSIG(status))
                                      : "the probe process gave no result";
  }
  return out;
}

std::string duration_text(double s) {
  char buf[64];
  if (s >= 1.0) std::snprintf(buf, sizeof buf, "%.3f s", s);
  else if (s >= 1e-3) std::snprintf(buf, sizeof buf, "%.2f ms", s * 1e3);
  else std::snprintf(buf, sizeof buf, "%.1f us", s * 1e6);
  return buf;
}

void print_header() {
  std::printf("%-*s %*s   %-*s %s\n", label_width, "figure", value_width, "value", target_width, "target",
              "verdict");
  std::printf("%s\n", std::string(label_width + value_width + target_width + 13, '-').c_str());
}

void print_figure(const std::string& label, const std::string& value, const std::string& target,
                  const std::string& verdict_text) {
  std::printf("%-*s %*s   %-*s %s\n", label_width, label.c_str(), value_width, value.c_str(), target_width,
              target.c_str(), verdict_text.c_str());
  std::fflush(stdout);
}

std::string verdict(bool ok) {
  ++checked;
  if (ok) ++met;
  return ok ? "met" : "MISSED";
}

int targets_checked() { return checked; }
int targets_met() { return met; }

} // namespace ts::bench
