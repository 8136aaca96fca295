// Seitz-type operation symbols, in both lattice bases (a first byte H: hexagonal).
#include "fuzz_input.hpp"
#include "group/operation.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const ts::LatticeKind lattice = data[0] == 'H' ? ts::LatticeKind::hexagonal : ts::LatticeKind::orthogonal;
  const std::string s = ts::fuzz::text_of(data + 1, size - 1, 256);
  return ts::fuzz::expect_clean([&] { ts::parse_operation(s, lattice, "fuzz"); });
}
