// A measurement plan over everything a probe reads at one harmonic: the
// unknowns are the free parameters of every contributing mechanism together
// (docs/hall-bars.md, "Measurement plans"); the readings are bar direction ×
// field direction × probe × lock-in quadrature, with the field and the
// magnetisation each reversed and the current scaled where that tells terms
// apart. Each reading is one exact linear equation in the unknowns. The plan
// is the smallest set of bars found by greedy selection with exchange whose
// readings have the exact rank of every candidate together (the rank is
// decided in exact arithmetic, surd_echelon.hpp; floating point only guides
// the search and gives the condition number). The result says which
// mechanisms the plan separates and which parameter directions stay
// undetermined, each as an exact combination.
#pragma once

#include "device/probe_sum.hpp"
#include "geometry/layout_design.hpp"

#include <string>
#include <utility>
#include <vector>

namespace ts {

// One unknown: a parameter of a mechanism; a c-type coefficient that is odd only
// with B and M reversed together has two, one odd in each.
struct PlanColumn {
  std::size_t mechanism = 0;
  int parameter = 0;
  std::string name;     // parameter name, with " (odd in B)" / " (odd in M)" for such a pair
};

using PlanCombination = std::vector<std::pair<std::size_t, Surd>>; // column, coefficient

struct MeasurementPlan {
  int harmonic = 0;
  std::vector<SumMechanism> mechanisms;    // those a candidate reading sees at this harmonic
  std::vector<std::string> unread;         // mechanisms at this harmonic that no candidate reads
  std::vector<PlanColumn> columns;
  std::vector<LayoutCandidate> candidates;
  std::vector<std::string> fields;         // field geometries tried on every bar
  int rank_all = 0;                        // exact rank of every candidate's readings
  std::vector<std::size_t> chosen;         // candidate indices of the plan
  int rank_chosen = 0;                     // exact, equal to rank_all
  double condition = 0;                    // σ_max/σ_min of the plan's readings (floating point)
  std::vector<std::string> handles;        // what the plan needs beyond bar directions: field reversal, ...
  std::vector<std::string> fields_needed;  // field geometries the plan uses
  std::vector<std::size_t> separated;      // mechanisms whose parameters the plan determines
  std::vector<std::size_t> not_separated;
  std::vector<std::size_t> unseen;         // columns no candidate reading sees (out-of-plane components, ...)
  std::vector<PlanCombination> undetermined; // null-space directions among the seen columns: changes no reading can see
};

struct PlanGeometry {
  const SampleFrame* sample = nullptr;
  std::string system;
  LatticeKind lattice = LatticeKind::orthogonal;
  LatticeMetric metric;
  Waveform waveform = Waveform::sine;
};

MeasurementPlan design_plan(const std::vector<SumInput>& inputs, int harmonic, std::vector<LayoutCandidate> candidates,
                            const std::vector<std::string>& fields, const PlanGeometry& geometry);

} // namespace ts
