// Replays the starting corpus of every libFuzzer target (fuzz/corpus/<target>/) through
// the target's own entry point, built with the normal compiler and no fuzzer: each
// input, including every crash a fuzzing run once found, must still be handled cleanly
// (a parse or a ts::Error; an internal error traps). It also keeps the fuzz targets
// compiling with the library, which scripts/fuzz alone (clang, not in CI) would not.
// Usage: fuzz_corpus_replay CORPUS_DIR
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

// Each target's LLVMFuzzerTestOneInput, renamed per source file by the build.
extern "C" int fuzz_one_group_symbol(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_tensor_spec(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_operation(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_miller(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_scenario_toml(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_structure_toml(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_structure_cif(const std::uint8_t*, std::size_t);
extern "C" int fuzz_one_scan_table(const std::uint8_t*, std::size_t);

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: fuzz_corpus_replay CORPUS_DIR\n");
    return 2;
  }
  struct Target {
    const char* name;
    int (*one)(const std::uint8_t*, std::size_t);
  };
  const Target targets[] = {{"group_symbol", fuzz_one_group_symbol},   {"tensor_spec", fuzz_one_tensor_spec},
                            {"operation", fuzz_one_operation},         {"miller", fuzz_one_miller},
                            {"scenario_toml", fuzz_one_scenario_toml}, {"structure_toml", fuzz_one_structure_toml},
                            {"structure_cif", fuzz_one_structure_cif}, {"scan_table", fuzz_one_scan_table}};
  namespace fs = std::filesystem;
  int status = 0;
  for (const Target& t : targets) {
    const fs::path dir = fs::path(argv[1]) / t.name;
    std::vector<fs::path> files;
    std::error_code ec;
    for (const auto& e : fs::directory_iterator(dir, ec))
      if (e.is_regular_file()) files.push_back(e.path());
    if (ec || files.empty()) {
      std::fprintf(stderr, "%s: no starting inputs in %s\n", t.name, dir.c_str());
      status = 1;
      continue;
    }
    for (const auto& f : files) {
      std::ifstream in(f, std::ios::binary);
      const std::string bytes((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
      t.one(reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size());
    }
    std::printf("%s: %zu inputs handled cleanly\n", t.name, files.size());
  }
  return status;
}
