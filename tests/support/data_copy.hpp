// A private copy of the data directory (groups/ and the response catalogue, laid
// out as when installed) that a test may edit; the binary finds it through
// TENSORSIEVE_DATA.
#pragma once

#include "cli_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <string>

namespace ts::test {

struct DataCopy {
  TempDir dir;
  DataCopy() {
    namespace fs = std::filesystem;
    const fs::path source = TENSORSIEVE_SOURCE_DIR;
    fs::copy(source / "groups", dir / "groups", fs::copy_options::recursive);
    fs::create_directories(dir / "responses");
    for (const char* f : {"catalogue.toml", "families.toml"})
      fs::copy_file(source / "src/response" / f, dir / ("responses/" + std::string(f)));
  }
  std::string path() const { return dir.path().string(); }
  std::string catalogue() const { return (dir / "responses/catalogue.toml").string(); }
  // Replace the first occurrence of `from` in the file at `relative` (e.g. "groups/cubic.toml").
  void replace(const std::string& relative, const std::string& from, const std::string& to) {
    const std::filesystem::path p = dir / relative;
    std::string text = read_file(p);
    const std::size_t at = text.find(from);
    REQUIRE(at != std::string::npos);
    text.replace(at, from.size(), to);
    std::ofstream(p, std::ios::binary | std::ios::trunc) << text;
  }
};

} // namespace ts::test
