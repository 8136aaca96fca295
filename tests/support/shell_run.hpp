// Running an outside program from a test (a renderer, a browser, a parser)
// through /bin/sh and decoding its exit status.
#pragma once

#include <cstdlib>
#include <string>
#include <sys/wait.h>

namespace ts::test {

inline int shell(const std::string& cmd) {
  const int status = std::system(cmd.c_str());
  return status != -1 && WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

} // namespace ts::test
