// Write a report to stdout ("-") or to a file, atomically: the text goes to a
// temporary file beside the target that is renamed over it only when complete,
// so a failure never leaves half a report.
#pragma once

#include <string>

namespace ts {

void write_output(const std::string& path, const std::string& text);

} // namespace ts
