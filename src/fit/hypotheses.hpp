// The symmetry hypotheses a scan is compared against: the groups of the
// scenario's chain (from the cut on; a step that applies a field, an electric
// field or a current is part of the measurement, not of the sample, and gives
// no hypothesis of its own) and every subgroup of the last sample group down to
// a floor order, each conjugate on its own because the lab frame is fixed.
// Each keeps its group in the crystal frame; the forms are solved in the
// scenario's sample frame.
#pragma once

#include "lowering/inverse_search.hpp"
#include "scenario/scenario_run.hpp"

#include <string>
#include <vector>

namespace ts {

struct Hypothesis {
  PointGroup group;          // crystal frame
  std::string symbol;        // for people, with the orientation of its elements in words
  std::string origin;        // "chain step 2: cut (111)" or "subgroup of 3m1'"
  std::size_t chain_step = 0; // for chain groups: the step; for subgroups: the last sample step
  bool from_chain = false;
  // What imposes exactly this group on the last sample group (a polar
  // displacement, a magnetisation, a strain, ...); empty for chain groups.
  std::vector<std::string> producers;
};

// `floor`: the smallest group order kept (1 keeps every subgroup).
std::vector<Hypothesis> fit_hypotheses(const ScenarioResult& res, int floor);

} // namespace ts
