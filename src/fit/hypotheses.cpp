#include "fit/hypotheses.hpp"

#include "group/group_catalogue.hpp"
#include "scenario/observation_run.hpp"

#include <algorithm>

namespace ts {

namespace {

bool applied_field(LoweringKind k) {
  return k == LoweringKind::magnetic_field || k == LoweringKind::electric_field || k == LoweringKind::current;
}

std::string describe(const PointGroup& g, const Frame& frame) {
  Identification id = identify(g, GroupCatalogue::builtin());
  return readable_symbol(g, id, sample_symbol(g, id, frame), true);
}

} // namespace

std::vector<Hypothesis> fit_hypotheses(const ScenarioResult& res, int floor) {
  std::vector<Hypothesis> out;
  auto known = [&](const PointGroup& g) {
    return std::any_of(out.begin(), out.end(), [&](const Hypothesis& h) { return h.group == g; });
  };
  const Scenario& sc = res.scenario;
  const std::size_t first = sc.cut.empty() ? 0 : 1;
  std::size_t last_sample = first;
  for (std::size_t i = first; i < res.chain.size(); ++i) {
    // chain[i] for i > first is the group after lowering step i - first - 1 (the cut is step 1 when present).
    const std::size_t step = i - first;
    if (step > 0 && applied_field(sc.steps[step - 1].kind)) continue;
    last_sample = i;
    const PointGroup& g = res.chain[i].group;
    if (known(g) || static_cast<int>(g.order()) < floor) continue;
    Hypothesis h;
    h.group = g;
    h.symbol = describe(g, res.frame);
    h.origin = "chain step " + std::to_string(i) + ": " + res.chain[i].label;
    h.chain_step = i;
    h.from_chain = true;
    out.push_back(std::move(h));
  }
  const PointGroup& parent = res.chain[last_sample].group;
  const std::string parent_symbol = describe(parent, res.frame);
  const LatticeKind lattice = parent.lattice();
  std::vector<PointGroup> subs = cached_subgroups(parent);
  // Larger groups first, then a fixed order, so reports are stable.
  std::stable_sort(subs.begin(), subs.end(), [](const PointGroup& a, const PointGroup& b) { return a.order() > b.order(); });
  for (const auto& g : subs) {
    if (known(g) || static_cast<int>(g.order()) < floor) continue;
    Hypothesis h;
    h.group = g;
    h.symbol = describe(g, res.frame);
    h.origin = "subgroup of " + parent_symbol;
    h.chain_step = last_sample;
    for (const auto& p : single_producers(parent, g))
      h.producers.push_back(producer_words(p, g, res.frame, lattice, res.metric));
    out.push_back(std::move(h));
  }
  return out;
}

} // namespace ts
