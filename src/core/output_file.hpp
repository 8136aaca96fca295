// Write a report to stdout ("-") or to a file. A regular file is replaced
// atomically (a unique temporary file beside it, renamed over it when complete,
// keeping the old file's mode), so a failure never leaves half a report. A symlink
// is followed; a device, a pipe or a file with several hard links is written
// through the path the user gave.
#pragma once

#include <string>

namespace ts {

void write_output(const std::string& path, const std::string& text);

} // namespace ts
