#include "core/output_file.hpp"

#include "core/error.hpp"

#include <cerrno>
#include <cstring>
#include <fcntl.h>
#include <filesystem>
#include <iostream>
#include <sys/stat.h>
#include <unistd.h>

namespace ts {

namespace {

[[noreturn]] void cannot_write(const std::string& path, const std::string& why) {
  fail(ErrorKind::bad_file, "cannot write " + path + ": " + why, "--output",
       "a path in a writable directory, or - for standard output");
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

// Devices, pipes and files with several hard links are written through the path:
// replacing them would turn /dev/null into a regular file or cut the links.
void write_in_place(const std::string& path, const std::string& text) {
  int fd = ::open(path.c_str(), O_WRONLY | O_TRUNC | O_CLOEXEC);
  if (fd < 0) cannot_write(path, std::strerror(errno));
  write_all(fd, text, path);
  if (::close(fd) != 0) cannot_write(path, std::strerror(errno));
}

mode_t creation_mode() {
  mode_t mask = ::umask(0);
  ::umask(mask);
  return 0666 & ~mask;
}

// A regular file (or a new one) is replaced atomically: a unique temporary file beside
// it, renamed over it when complete, with the mode the old file had.
void replace_atomically(const std::string& path, const std::string& text, mode_t mode) {
  std::string tmpl = path + ".tmpXXXXXX";
  int fd = ::mkstemp(tmpl.data());
  if (fd < 0) cannot_write(path, std::strerror(errno));
  auto give_up = [&](const std::string& why) {
    ::close(fd);
    ::unlink(tmpl.c_str());
    cannot_write(path, why);
  };
  if (::fchmod(fd, mode) != 0) give_up(std::strerror(errno));
  try {
    write_all(fd, text, path);
  } catch (...) {
    ::close(fd);
    ::unlink(tmpl.c_str());
    throw;
  }
  if (::fsync(fd) != 0 && errno != EINVAL) give_up(std::strerror(errno));
  if (::close(fd) != 0) {
    ::unlink(tmpl.c_str());
    cannot_write(path, std::strerror(errno));
  }
  if (::rename(tmpl.c_str(), path.c_str()) != 0) {
    int e = errno;
    ::unlink(tmpl.c_str());
    cannot_write(path, std::strerror(e));
  }
}

} // namespace

void write_output(const std::string& path, const std::string& text) {
  if (path.empty() || path == "-") {
    std::cout << text << std::flush;
    return;
  }
  namespace fs = std::filesystem;
  std::string target = path;
  struct stat st {};
  if (::lstat(path.c_str(), &st) == 0 && S_ISLNK(st.st_mode)) {
    // Follow the link: the report belongs in the file it points to, not in place of the link.
    std::error_code ec;
    fs::path resolved = fs::weakly_canonical(fs::absolute(path), ec);
    if (ec) cannot_write(path, ec.message());
    target = resolved.string();
  }
  if (::stat(target.c_str(), &st) == 0) {
    if (S_ISDIR(st.st_mode)) cannot_write(path, "it is a directory");
    if (!S_ISREG(st.st_mode) || st.st_nlink > 1) return write_in_place(target, text);
    return replace_atomically(target, text, st.st_mode & 07777);
  }
  replace_atomically(target, text, creation_mode());
}

} // namespace ts
