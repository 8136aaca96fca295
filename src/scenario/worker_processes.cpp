#include "scenario/worker_processes.hpp"

#include <poll.h>
#include <signal.h>
#include <sys/socket.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <optional>
#include <stdexcept>

namespace ts {

namespace {

struct Worker {
  pid_t pid = -1;
  int fd = -1;                      // this process's end of the worker's socket
  std::optional<std::size_t> task;  // the task it is on
  std::string buffer;               // bytes of its answer read so far
};

bool send_all(int fd, const void* data, std::size_t n) {
  const char* p = static_cast<const char*>(data);
  while (n > 0) {
    const ssize_t w = ::send(fd, p, n, MSG_NOSIGNAL); // a dead worker is an error here, not a SIGPIPE
    if (w < 0 && errno == EINTR) continue;
    if (w <= 0) return false;
    p += w;
    n -= static_cast<std::size_t>(w);
  }
  return true;
}

bool receive_all(int fd, void* data, std::size_t n) {
  char* p = static_cast<char*>(data);
  while (n > 0) {
    const ssize_t r = ::recv(fd, p, n, 0);
    if (r < 0 && errno == EINTR) continue;
    if (r <= 0) return false;
    p += r;
    n -= static_cast<std::size_t>(r);
  }
  return true;
}

// A worker: task numbers in, answers (a length, then the bytes) out, until the
// caller closes its end. It leaves with _exit: the stack and the atexit handlers
// it shares with the caller are the caller's.
[[noreturn]] void worker_loop(int fd, const WorkerTasks& t) {
  // The caller's handlers (removing its temporary files on a signal) are not
  // the worker's business.
  for (int sig : {SIGINT, SIGTERM, SIGHUP}) ::signal(sig, SIG_DFL);
  try {
    if (t.start) t.start();
  } catch (...) {
    ::_exit(4);
  }
  for (;;) {
    std::uint64_t task = 0;
    if (!receive_all(fd, &task, sizeof task)) ::_exit(0);
    std::string answer;
    try {
      answer = t.work(static_cast<std::size_t>(task));
    } catch (...) {
      ::_exit(4);
    }
    const std::uint64_t n = answer.size();
    if (!send_all(fd, &n, sizeof n) || !send_all(fd, answer.data(), answer.size())) ::_exit(3);
  }
}

bool start_worker(Worker* w, const std::vector<Worker>& all, const WorkerTasks& t) {
  int sv[2];
  if (::socketpair(AF_UNIX, SOCK_STREAM | SOCK_CLOEXEC, 0, sv) != 0) return false;
  // Buffered output would otherwise be written twice, once by each process.
  std::fflush(stdout);
  std::fflush(stderr);
  const pid_t pid = ::fork();
  if (pid < 0) {
    ::close(sv[0]);
    ::close(sv[1]);
    return false;
  }
  if (pid == 0) {
    ::close(sv[0]);
    // The other workers see the end of their input only when every copy of the
    // caller's end is closed, this one's included.
    for (const auto& other : all)
      if (other.fd >= 0) ::close(other.fd);
    worker_loop(sv[1], t);
  }
  ::close(sv[1]);
  w->pid = pid;
  w->fd = sv[0];
  w->task.reset();
  w->buffer.clear();
  return true;
}

// Ends the worker's connection and waits for it; how it ended, in words.
std::string finish_worker(Worker* w, bool kill) {
  if (w->fd >= 0) ::close(w->fd);
  w->fd = -1;
  if (w->pid < 0) return "";
  if (kill) ::kill(w->pid, SIGKILL);
  int status = 0;
  while (::waitpid(w->pid, &status, 0) < 0 && errno == EINTR) {
  }
  w->pid = -1;
  if (WIFSIGNALED(status))
    return "signal " + std::to_string(WTERMSIG(status)) + ", " + ::strsignal(WTERMSIG(status));
  if (WIFEXITED(status) && WEXITSTATUS(status) != 0)
    return "the worker process ended with status " + std::to_string(WEXITSTATUS(status));
  return "the worker process ended without an answer";
}

class Pool {
public:
  Pool(const std::vector<std::size_t>& tasks, const WorkerTasks& t) : tasks_(tasks), t_(t) {}
  ~Pool() {
    for (auto& w : workers_) finish_worker(&w, /*kill=*/true);
  }

  bool start(unsigned n) {
    workers_.resize(n);
    for (auto& w : workers_)
      if (!start_worker(&w, workers_, t_)) break;
    return workers_.front().pid >= 0;
  }

  void run() {
    for (auto& w : workers_) give_work(&w);
    for (;;) {
      std::vector<pollfd> fds;
      std::vector<Worker*> busy;
      for (auto& w : workers_)
        if (w.fd >= 0 && w.task) {
          fds.push_back({w.fd, POLLIN, 0});
          busy.push_back(&w);
        }
      if (busy.empty()) break;
      if (::poll(fds.data(), fds.size(), -1) < 0) {
        if (errno == EINTR) continue;
        throw std::runtime_error(std::string("waiting for the worker processes: ") + std::strerror(errno));
      }
      for (std::size_t k = 0; k < fds.size(); ++k)
        if (fds[k].revents != 0) read_from(busy[k]);
    }
    // Every task is answered. Any task a dead worker could not be replaced for
    // runs here, in this process.
    while (next_ < tasks_.size()) {
      const std::size_t i = tasks_[next_++];
      t_.done(i, t_.work(i));
    }
  }

private:
  void give_work(Worker* w) {
    if (w->fd < 0 || next_ >= tasks_.size()) return;
    const std::size_t i = tasks_[next_];
    const std::uint64_t task = i;
    w->task = i;
    ++next_;
    if (!send_all(w->fd, &task, sizeof task)) died(w);
  }

  void read_from(Worker* w) {
    char chunk[65536];
    const ssize_t r = ::recv(w->fd, chunk, sizeof chunk, 0);
    if (r < 0 && (errno == EINTR || errno == EAGAIN)) return;
    if (r <= 0) {
      died(w);
      return;
    }
    w->buffer.append(chunk, static_cast<std::size_t>(r));
    std::uint64_t n = 0;
    if (w->buffer.size() < sizeof n) return;
    std::memcpy(&n, w->buffer.data(), sizeof n);
    if (w->buffer.size() < sizeof n + n) return;
    const std::string answer = w->buffer.substr(sizeof n, n);
    w->buffer.clear();
    const std::size_t i = *w->task;
    w->task.reset();
    t_.done(i, answer);
    give_work(w);
  }

  // The worker on a task ended: the task's answer is the caller's account of
  // the loss, and a fresh worker takes the next task.
  void died(Worker* w) {
    const std::optional<std::size_t> task = w->task;
    const std::string why = finish_worker(w, /*kill=*/true);
    if (task) t_.done(*task, t_.lost(*task, why));
    if (next_ < tasks_.size() && start_worker(w, workers_, t_)) give_work(w);
  }

  const std::vector<std::size_t>& tasks_;
  const WorkerTasks& t_;
  std::vector<Worker> workers_;
  std::size_t next_ = 0;
};

} // namespace

void run_in_worker_processes(const std::vector<std::size_t>& tasks, unsigned workers, const WorkerTasks& t) {
  if (tasks.empty()) return;
  const unsigned n = static_cast<unsigned>(std::min<std::size_t>(std::max(1u, workers), tasks.size()));
  Pool pool(tasks, t);
  if (!pool.start(n)) {
    for (std::size_t i : tasks) t.done(i, t.work(i));
    return;
  }
  pool.run();
}

} // namespace ts
