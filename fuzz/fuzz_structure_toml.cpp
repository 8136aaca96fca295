// Crystal structures (docs/structures.md) in a scenario's [crystal.structure]; small
// cells also go through spglib's symmetry search.
#include "fuzz_input.hpp"
#include "scenario/scenario.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = "responses = [\"shg\"]\n[crystal.structure]\n" + ts::fuzz::text_of(data, size, 16384);
  return ts::fuzz::expect_clean([&] {
    ts::Scenario sc = ts::parse_scenario(s, "fuzz.toml");
    if (sc.structure && sc.structure->sites.size() <= 8) ts::find_structure_symmetry(*sc.structure);
  });
}
