// The short report of a scenario (`--brief`): the chain of groups and one verdict
// line per response part, then the verdicts of the observations, so a screenful
// answers "what is allowed?" and the full report says why.
#pragma once

#include "report/report_format.hpp"
#include "scenario/observation_run.hpp"
#include "scenario/scenario_run.hpp"

#include <string>

namespace ts {

// The verdict of one part after the last step, in words: "allowed", "forbidden",
// "switched on by step 2 (moment ∥ [001])", or the planar-bar reading.
std::string part_verdict(const ScenarioResult& result, std::size_t part);

// Text, Markdown or LaTeX (JSON always carries everything: Error(usage)).
// `observations` (whose scenario is `result`) adds the verdict of each observation.
std::string write_scenario_brief(const ScenarioResult& result, Format format,
                                 const ObservationRun* observations = nullptr);

} // namespace ts
