#include "inverse_bench.hpp"

#include "bench_clock.hpp"
#include "group/group_catalogue.hpp"
#include "lowering/component_observation.hpp"

#include <cstdio>

namespace ts::bench {

namespace {

ComponentObservation observed(const char* spec, const char* component, TimeParity parity) {
  ComponentObservation c;
  c.spec = parse_tensor_spec(spec);
  c.names = {component};
  c.codes = component_codes(c.spec, c.names, "bench");
  c.parity = parity;
  return c;
}

} // namespace

void print_inverse_figures(int repeats) {
  std::printf("\n");
  const PointGroup grey = GroupCatalogue::builtin().get("m-3m").group.with_time_reversal();
  // A fresh copy of the group: the subgroup cache is keyed by the operations,
  // so the first search below pays for the enumeration once.
  std::size_t count = 0;
  const double enumerate = seconds_of([&] { count = grey.subgroups().size(); });
  print_figure("subgroups of m-3m1' (PointGroup::subgroups, uncached)", duration_text(enumerate));
  print_figure("subgroups of m-3m1'", std::to_string(count));
  struct Case {
    const char* what;
    const char* spec;
    const char* component;
    TimeParity parity;
  };
  const Case cases[] = {
      {"inverse, rank 3, chi_xxx (i or c) in m-3m1'", "chi_abc: sym(abc)", "chi_xxx",
       TimeParity::either},
      {"inverse, rank 4, T_xxyz sym(kl) (i or c) in m-3m1'", "T_ijkl: sym(kl)", "T_xxyz",
       TimeParity::either},
  };
  for (const auto& c : cases) {
    const Observation o = observation_of(observed(c.spec, c.component, c.parity));
    InverseResult r;
    Timing t = time_repeated(repeats, [&] { r = find_minimal_breaking(grey, o); });
    print_figure(std::string(c.what) + ", first run", duration_text(t.first), "< 1 s", verdict(t.first < 1.0));
    print_figure(std::string(c.what) + ", median", duration_text(t.median), "< 1 s", verdict(t.median < 1.0));
    print_figure(std::string(c.what) + ": maximal / groups asked",
                 std::to_string(r.maximal.size()) + " / " + std::to_string(r.predicate_calls));
  }
}

} // namespace ts::bench
