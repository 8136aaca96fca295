// Crystal directions [uvw], [uvtw] and Miller indices of planes.
#include "fuzz_input.hpp"
#include "geometry/crystal_direction.hpp"
#include "geometry/lattice_metric.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string s = ts::fuzz::text_of(data, size, 256);
  ts::fuzz::expect_clean([&] { ts::parse_direction(s, "fuzz"); });
  ts::LatticeMetric metric;
  metric.a = ts::Rational(3905, 1000);
  metric.c = ts::Rational(41, 10);
  ts::fuzz::expect_clean([&] { ts::parse_cut(s, "tetragonal", ts::LatticeKind::orthogonal, metric, "fuzz"); });
  ts::fuzz::expect_clean([&] { ts::parse_cut(s, "hexagonal", ts::LatticeKind::hexagonal, metric, "fuzz"); });
  return 0;
}
