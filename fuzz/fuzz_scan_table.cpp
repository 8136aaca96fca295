// Measured scans for `fit`: the text-table reader (src/fit/scan_table.hpp), the
// one parser that reads a user's instrument files rather than files we define.
#include "fit/scan_table.hpp"
#include "fuzz_input.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = ts::fuzz::text_of(data, size, 16384);
  ts::fuzz::expect_clean([&] { ts::parse_scan_table(s, "fuzz.csv"); });
  return 0;
}
