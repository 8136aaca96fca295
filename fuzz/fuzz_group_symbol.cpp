// Group symbols: Hermann-Mauguin with primes, Schoenflies, Unicode minus and primes.
#include "fuzz_input.hpp"
#include "group/group_catalogue.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = ts::fuzz::text_of(data, size, 256);
  return ts::fuzz::expect_clean([&] {
    const auto& cat = ts::GroupCatalogue::builtin();
    cat.get(s, ts::PlainSymbol::nonmagnetic);
    cat.closest_symbols(s);
  });
}
