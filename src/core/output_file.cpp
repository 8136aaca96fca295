#include "core/output_file.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <atomic>
#include <cerrno>
#include <csignal>
#include <cstring>
#include <fcntl.h>
#include <filesystem>
#include <iostream>
#include <limits.h>
#include <pthread.h>
#include <sys/stat.h>
#include <unistd.h>

namespace ts {

namespace {

namespace fs = std::filesystem;

[[noreturn]] void cannot_write(const std::string& path, const std::string& why) {
  fail(ErrorKind::bad_file, "cannot write " + path + ": " + why, "--output",
       "a path in a writable directory, or - for standard output");
}

// Temporary files of writes in progress, for the signal handler: fixed slots it
// can read without allocating.
constexpr int kSlots = 64;
char pending[kSlots][PATH_MAX];
std::atomic<int> pending_state[kSlots]; // 0 free, 1 being filled, 2 holds a path to remove

extern "C" void remove_pending_and_reraise(int sig) {
  for (int i = 0; i < kSlots; ++i)
    if (pending_state[i].load() == 2) ::unlink(pending[i]);
  std::signal(sig, SIG_DFL);
  std::raise(sig);
}

// Checked at every write rather than once: whoever set another handler in the
// meantime keeps it.
void install_cleanup() {
  for (int sig : {SIGINT, SIGTERM, SIGHUP, SIGQUIT}) {
    struct sigaction old {};
    if (::sigaction(sig, nullptr, &old) != 0 || old.sa_handler != SIG_DFL) continue; // the caller's choice stays
    struct sigaction sa {};
    sa.sa_handler = remove_pending_and_reraise;
    sigemptyset(&sa.sa_mask);
    ::sigaction(sig, &sa, nullptr);
  }
}

void remember(const std::string& tmp) {
  if (tmp.size() >= PATH_MAX) return;
  for (int i = 0; i < kSlots; ++i) {
    int expected = 0;
    if (!pending_state[i].compare_exchange_strong(expected, 1)) continue;
    std::memcpy(pending[i], tmp.c_str(), tmp.size() + 1);
    pending_state[i].store(2);
    return;
  }
}

void forget(const std::string& tmp) {
  for (int i = 0; i < kSlots; ++i)
    if (pending_state[i].load() == 2 && tmp == pending[i]) {
      pending_state[i].store(0);
      return;
    }
}

void write_all(int fd, const std::string& text, const std::string& path) {
  std::size_t done = 0;
  while (done < text.size()) {
    ssize_t n = ::write(fd, text.data() + done, text.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) cannot_write(path, std::strerror(errno));
    done += static_cast<std::size_t>(n);
  }
}

mode_t creation_mode() {
  mode_t mask = ::umask(0);
  ::umask(mask);
  return 0666 & ~mask;
}

// The file a path names: a symbolic link is followed, also when it dangles (the
// file it points to is created and the link stays).
std::string follow_links(const std::string& path) {
  std::string p = path;
  for (int hops = 0; hops < 40; ++hops) {
    struct stat st {};
    if (::lstat(p.c_str(), &st) != 0 || !S_ISLNK(st.st_mode)) return p;
    std::string target(PATH_MAX, '\0');
    const ssize_t n = ::readlink(p.c_str(), target.data(), target.size());
    if (n < 0 || static_cast<std::size_t>(n) >= target.size()) cannot_write(path, "its symbolic link cannot be read");
    target.resize(static_cast<std::size_t>(n));
    fs::path next(target);
    if (next.is_relative()) next = fs::path(p).parent_path() / next;
    p = next.string();
  }
  cannot_write(path, "too many levels of symbolic links");
}

// Devices and pipes are written through the path; so is a file with several hard
// links, whose room is reserved before the old content is overwritten.
void write_in_place(const std::string& path, const std::string& shown, const std::string& text, bool regular) {
  int fd = ::open(path.c_str(), O_WRONLY | O_CLOEXEC | (regular ? 0 : O_TRUNC));
  if (fd < 0) cannot_write(shown, std::strerror(errno));
  if (regular) {
    const int e = ::posix_fallocate(fd, 0, static_cast<off_t>(text.size()));
    if (e != 0 && e != EINVAL && e != EOPNOTSUPP) {
      ::close(fd);
      cannot_write(shown, std::strerror(e));
    }
  }
  try {
    write_all(fd, text, shown);
  } catch (...) {
    ::close(fd);
    throw;
  }
  if (regular && ::ftruncate(fd, static_cast<off_t>(text.size())) != 0) {
    const int e = errno;
    ::close(fd);
    cannot_write(shown, std::strerror(e));
  }
  if (::close(fd) != 0) cannot_write(shown, std::strerror(errno));
}

} // namespace

OutputBatch::~OutputBatch() {
  for (const auto& tmp : staged_) {
    ::unlink(tmp.c_str());
    forget(tmp);
  }
}

void OutputBatch::add(const std::string& path, std::string text, Links links) {
  entries_.push_back({path, std::move(text), links});
}

void OutputBatch::commit() {
  // A failure removes every temporary file at once, not only when the batch goes.
  struct Cleanup {
    std::vector<std::string>& staged;
    bool done = false;
    ~Cleanup() {
      if (done) return;
      for (const auto& tmp : staged) {
        ::unlink(tmp.c_str());
        forget(tmp);
      }
      staged.clear();
    }
  } cleanup{staged_};
  struct Rename {
    std::string tmp, target;
  };
  std::vector<Rename> renames;
  std::vector<const Entry*> in_place, to_stdout;
  std::vector<std::string> in_place_targets;
  std::vector<bool> in_place_regular;
  install_cleanup();
  for (const auto& e : entries_) {
    if (e.path.empty() || e.path == "-") {
      to_stdout.push_back(&e);
      continue;
    }
    const std::string target = e.links == Links::follow ? follow_links(e.path) : e.path;
    struct stat st {};
    const bool exists = ::stat(target.c_str(), &st) == 0;
    struct stat lst {};
    const bool is_link = ::lstat(target.c_str(), &lst) == 0 && S_ISLNK(lst.st_mode); // Links::replace only
    if (exists && !is_link) {
      if (S_ISDIR(st.st_mode)) cannot_write(e.path, "it is a directory");
      if (!S_ISREG(st.st_mode) || st.st_nlink > 1) {
        in_place.push_back(&e);
        in_place_targets.push_back(target);
        in_place_regular.push_back(S_ISREG(st.st_mode));
        continue;
      }
    }
    const bool keep = exists && !is_link;
    // A short name beside the target: the target's own name may already be as long as
    // the file system allows.
    fs::path dir = fs::path(target).parent_path();
    std::string tmpl = ((dir.empty() ? fs::path(".") : dir) / ".tsXXXXXX").string();
    // The cleanup signals wait while the file is created and remembered: a signal
    // between the two would leave a temporary file the handler does not know.
    sigset_t cleanup_signals, before;
    sigemptyset(&cleanup_signals);
    for (int sig : {SIGINT, SIGTERM, SIGHUP, SIGQUIT}) sigaddset(&cleanup_signals, sig);
    ::pthread_sigmask(SIG_BLOCK, &cleanup_signals, &before);
    int fd = ::mkstemp(tmpl.data());
    if (fd >= 0) remember(tmpl);
    ::pthread_sigmask(SIG_SETMASK, &before, nullptr);
    if (fd < 0) cannot_write(e.path, std::strerror(errno));
    staged_.push_back(tmpl);
    auto give_up = [&](const std::string& why) {
      ::close(fd);
      cannot_write(e.path, why);
    };
    // Owner first: changing it clears set-id bits, which the mode then restores. Only
    // root may give a file away; for anyone else the call fails and the new file is theirs.
    if (keep && (st.st_uid != ::geteuid() || st.st_gid != ::getegid()))
      if (::fchown(fd, st.st_uid, st.st_gid) != 0) (void)::fchown(fd, static_cast<uid_t>(-1), st.st_gid);
    if (::fchmod(fd, keep ? (st.st_mode & 07777) : creation_mode()) != 0) give_up(std::strerror(errno));
    try {
      write_all(fd, e.text, e.path);
    } catch (...) {
      ::close(fd);
      throw;
    }
    if (::fsync(fd) != 0 && errno != EINVAL) give_up(std::strerror(errno));
    if (::close(fd) != 0) cannot_write(e.path, std::strerror(errno));
    renames.push_back({tmpl, target});
  }
  for (const auto& r : renames) {
    if (::rename(r.tmp.c_str(), r.target.c_str()) != 0) cannot_write(r.target, std::strerror(errno));
    forget(r.tmp);
    staged_.erase(std::find(staged_.begin(), staged_.end(), r.tmp));
  }
  for (std::size_t i = 0; i < in_place.size(); ++i)
    write_in_place(in_place_targets[i], in_place[i]->path, in_place[i]->text, in_place_regular[i]);
  for (const Entry* e : to_stdout) std::cout << e->text << std::flush;
  entries_.clear();
  cleanup.done = true;
}

void write_output(const std::string& path, const std::string& text) {
  OutputBatch batch;
  batch.add(path, text);
  batch.commit();
}

} // namespace ts
