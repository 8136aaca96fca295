// CIF and mCIF files (docs/structures.md): the line-keeping text repair, the
// parser with its block-by-block recovery, operations with fractional
// coefficients, symbols and numbers; small cells also go through spglib's
// search (in its child process).
#include "fuzz_input.hpp"
#include "lowering/structure_file.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = ts::fuzz::text_of(data, size, 16384);
  return ts::fuzz::expect_clean([&] {
    ts::StructureFileOptions options;
    options.max_atoms = 512;
    const ts::CrystalStructure cell = ts::read_structure_text(s, "fuzz.cif", options);
    if (cell.sites.size() <= 16) ts::find_structure_symmetry(cell);
  });
}
