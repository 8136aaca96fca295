// Reading figures back from a text report in a test.
#pragma once

#include <string>

namespace ts::test {

// "independent: N" of the first allowed form in a report; -1 when there is none.
inline int independent_in(const std::string& report) {
  const std::string key = "independent: ";
  std::size_t p = report.find(key);
  if (p == std::string::npos) return -1;
  return std::stoi(report.substr(p + key.size()));
}

} // namespace ts::test
