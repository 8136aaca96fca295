// Writing reports and figures to files, never half-way.
//
// "-" (or an empty path) is standard output. Any other path is written like this:
// - A regular file, or a path that does not exist yet, is replaced atomically: the
//   text goes to a temporary file with a short name (".ts" and six random
//   characters) in the same directory, which is synced and then renamed over the
//   target. The old file keeps its place until then, and a replaced file keeps its
//   mode and (where the user may set them) its owner and group.
// - A symbolic link given as the output (-o link) is followed, also when it
//   dangles: the file it points to is written as above and the link stays.
//   Figure files inside a figures directory never follow a link: a link there is
//   replaced by the figure (`Links::replace`), so a link planted among the figures
//   cannot send a write elsewhere.
// - A file with several hard links is written through its path, so every name keeps
//   seeing it: its space is reserved first (posix_fallocate), so the old content is
//   not cut before the new one fits.
// - A device or a pipe (/dev/null, /dev/stdout, a FIFO) is written through its path.
// - SIGINT, SIGTERM, SIGHUP and SIGQUIT remove the temporary files of a write in
//   progress before the program ends.
// Several files of one run (a report and its figures) go through one OutputBatch:
// all are staged first and renamed only when every one of them is complete, so a
// failure leaves every old file as it was.
#pragma once

#include <string>
#include <vector>

namespace ts {

enum class Links { follow, replace };

class OutputBatch {
public:
  OutputBatch() = default;
  OutputBatch(const OutputBatch&) = delete;
  OutputBatch& operator=(const OutputBatch&) = delete;
  ~OutputBatch(); // removes the temporary files of an uncommitted batch

  void add(const std::string& path, std::string text, Links links = Links::follow);
  // Stages every file, then renames them all; throws Error(bad_file) naming the
  // file that could not be written, after removing every temporary file.
  void commit();

private:
  struct Entry {
    std::string path, text;
    Links links;
  };
  std::vector<Entry> entries_;
  std::vector<std::string> staged_; // temporary files not yet renamed
};

void write_output(const std::string& path, const std::string& text);

} // namespace ts
