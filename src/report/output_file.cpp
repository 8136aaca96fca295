#include "report/output_file.hpp"

#include "core/error.hpp"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <unistd.h>

namespace ts {

void write_output(const std::string& path, const std::string& text) {
  if (path.empty() || path == "-") {
    std::cout << text << std::flush;
    return;
  }
  namespace fs = std::filesystem;
  fs::path target(path);
  fs::path tmp = target;
  tmp += ".tmp" + std::to_string(::getpid());
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out) fail(ErrorKind::bad_file, "cannot write " + tmp.string(), "--output", "a path in a writable directory");
    out << text;
    out.flush();
    if (!out) {
      std::error_code ec;
      fs::remove(tmp, ec);
      fail(ErrorKind::bad_file, "writing " + path + " failed", "--output");
    }
  }
  std::error_code ec;
  fs::rename(tmp, target, ec);
  if (ec) {
    fs::remove(tmp, ec);
    fail(ErrorKind::bad_file, "cannot move the report into place at " + path, "--output");
  }
}

} // namespace ts
