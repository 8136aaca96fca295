// Scenario files (docs/scenarios.md), read but not run.
#include "fuzz_input.hpp"
#include "scenario/scenario.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = ts::fuzz::text_of(data, size, 16384);
  return ts::fuzz::expect_clean([&] { ts::parse_scenario(s, "fuzz.toml"); });
}
