// Running a scenario: the chain of groups from the bulk crystal through the
// cut and every lowering step, the sample frame, the allowed forms of each
// response part at each step, what each step switches on, and the domain
// variants of the lowering.
#pragma once

#include "group/identify.hpp"
#include "lowering/domains.hpp"
#include "scenario/scenario.hpp"
#include "tensor/allowed_form.hpp"

#include <optional>
#include <string>
#include <vector>

namespace ts {

struct ChainStep {
  std::string label;        // "bulk", "cut (110), interface", "moment ∥ [001]"
  std::string quantity;     // how the imposed quantity transforms, empty for the bulk
  PointGroup group;         // in the crystal frame
  Identification id;
  std::string sample_symbol; // HM symbol of a tabulated setting matching the sample frame, else empty
  std::string readable_symbol; // for people: the type, and for a non-standard setting its elements in words
  std::vector<std::string> lost; // operations the step removed (crystal-frame symbols)
};

struct PartForms {
  std::string response_id, response_name, part_label;
  TensorSpec spec;
  std::optional<TensorSpec> excluded; // a piece the response does not see (counts subtract it)
  std::vector<AllowedForm> forms;     // one per chain step, in the sample frame
  std::vector<int> counts;            // independent components the response sees, per step
};

// A relation C = factor·anchor of the previous step that a lowering broke.
struct BrokenRelation {
  std::string component, anchor;
  Surd factor;
};

struct StepChange {
  std::size_t step = 0;            // chain index (>= 1)
  std::size_t part = 0;            // index into parts
  int before = 0, after = 0;       // independent components
  std::vector<std::string> switched_on;    // components zero before, nonzero after
  std::vector<BrokenRelation> broken;      // relations of the previous step that no longer hold
};

// Orientation domains of the spontaneous steps (distortions, polar and magnetic
// order, tilts) after the cut; applied fields and currents form no domains.
struct DomainReport {
  std::size_t part = 0;
  std::size_t from_step = 0;  // chain step whose group the domains break (the cut, or the bulk)
  PointGroup domain_group;    // the group of variant 1: the spontaneous steps only
  AllowedForm form;           // the part's form in domain_group, sample frame
  DomainAnalysis analysis;
};

struct ScenarioResult {
  Scenario scenario;
  std::string parent_note;   // e.g. "m-3m taken as non-magnetic: m-3m1'"
  Frame frame;
  std::array<std::string, 3> frame_labels;
  std::vector<ChainStep> chain;
  std::vector<PartForms> parts;
  std::vector<StepChange> changes;
  std::vector<DomainReport> domains;
};

ScenarioResult run_scenario(const Scenario& scenario);

} // namespace ts
