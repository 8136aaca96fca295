// The inverse question for a scenario: the sample's group (the last step of
// its chain, in the sample frame) and each observed signal; which symmetry
// breaking the signal proves (src/lowering/inverse_search.hpp).
#pragma once

#include "lowering/component_observation.hpp"
#include "scenario/scenario_run.hpp"

#include <string>
#include <vector>

namespace ts {

struct ObservationSolution {
  MinimalBreaking breaking;
  Identification id;
  std::string sample_symbol;            // tabulated setting in the sample frame, else empty
  std::string readable_symbol;          // for people (readable_symbol in scenario_run.hpp)
  std::vector<std::string> operations;  // crystal-axes symbols: they fix the orientation
  std::vector<std::string> producers;   // in words; empty: a higher-order order parameter
  std::vector<std::string> versions;    // which of i-type, c-type show the signal in this group
};

struct ObservationAnswer {
  ObservationRequest request;
  std::string what;                     // "response name [id]: part label" or "tensor SPEC"
  TensorSpec spec;
  TimeParity parity = TimeParity::either;
  std::vector<std::string> components;  // as named in the report (chi_xxx)
  std::vector<std::string> parent_versions; // readings the parent already allows (then no search)
  bool allowed_in_parent() const { return search.allowed_in_parent; }
  InverseResult search;
  std::vector<ObservationSolution> solutions;
};

struct ObservationRun {
  ScenarioResult scenario; // chain and sample frame; the parent of the search is chain.back()
  std::vector<ObservationAnswer> answers;
};

// The search for any observation (components, or a signal of a bar given by its
// own predicate) and the words for each solution, filled into `answer`.
// Words for what imposes exactly h (a polar displacement along [uvw], a strain of
// a given form, ...), for reports of the inverse search and of fits.
std::string producer_words(const Producer& p, const PointGroup& h, const Frame& frame, LatticeKind lattice,
                           const LatticeMetric& m);
void answer_observation(const PointGroup& parent, const Frame& frame, const LatticeMetric& metric,
                        const Observation& observation, ObservationAnswer& answer);

// Throws Error(usage) when the scenario has no observation; bad responses,
// parts and components are reported with the observation's file:line or option.
ObservationRun run_observations(const Scenario& scenario);

} // namespace ts
