// Tensor specs: Jahn symbols and the index syntax. A spec that parses must parse
// again from its canonical text (docs/spec-syntax.md).
#include "fuzz_input.hpp"
#include "tensor/tensor_spec.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = ts::fuzz::text_of(data, size, 1024);
  return ts::fuzz::expect_clean([&] {
    ts::TensorSpec spec = ts::parse_tensor_spec(s);
    ts::TensorSpec again = ts::parse_tensor_spec(spec.canonical_text());
    if (again.rank != spec.rank) __builtin_trap();
  });
}
