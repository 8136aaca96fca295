#include "core/data_dir.hpp"

#include "core/error.hpp"

#include <cstdlib>
#include <filesystem>
#include <vector>

namespace fs = std::filesystem;

namespace ts {

namespace {
std::string& preferred_root() {
  static std::string root;
  return root;
}

// An installed binary (prefix/bin/tensorsieve) uses its own prefix/share first,
// so a copy installed elsewhere never reads a stale source tree; a binary in the
// build tree has no such directory beside it and falls through to the sources.
std::vector<std::string> candidate_roots() {
  std::vector<std::string> c;
  if (const char* env = std::getenv("TENSORSIEVE_DATA"); env && *env) c.emplace_back(env);
  if (!preferred_root().empty()) c.push_back(preferred_root());
  std::error_code ec;
  fs::path exe = fs::read_symlink("/proc/self/exe", ec);
  if (!ec) c.push_back((exe.parent_path().parent_path() / "share" / "tensorsieve").string());
  c.emplace_back(TENSORSIEVE_SOURCE_DATA_DIR);
  c.emplace_back(TENSORSIEVE_INSTALL_DATA_DIR);
  return c;
}
} // namespace

std::string data_directory() {
  std::string tried;
  for (const auto& root : candidate_roots()) {
    std::error_code ec;
    if (fs::is_directory(fs::path(root) / "groups", ec)) return root;
    tried += (tried.empty() ? "" : ", ") + root + "/groups";
  }
  fail(ErrorKind::bad_file, "cannot find the groups/ data directory (tried " + tried + ")", "",
       "set TENSORSIEVE_DATA to the directory that contains groups/");
}

void prefer_data_directory(const std::string& root) { preferred_root() = root; }

std::string response_catalogue_path() {
  std::string root = data_directory();
  for (const char* rel : {"src/response/catalogue.toml", "responses/catalogue.toml"}) {
    std::error_code ec;
    fs::path p = fs::path(root) / rel;
    if (fs::is_regular_file(p, ec)) return p.string();
  }
  fail(ErrorKind::bad_file, "cannot find the response catalogue under " + root, "",
       "src/response/catalogue.toml in the source tree or responses/catalogue.toml when installed");
}

} // namespace ts
