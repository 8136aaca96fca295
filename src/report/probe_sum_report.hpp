// The report sections on what a probe really reads: per bar, probe and
// harmonic the sum of every mechanism with labelled terms and what separates
// each pair (ProbeSum), and per layout the measurement plan over all of them
// together (MeasurementPlan). Writers only format the values of ScenarioResult.
#pragma once

#include "report/report_format.hpp"
#include "scenario/scenario_run.hpp"

#include <toml++/toml.h>

#include <string>

namespace ts {

std::string write_probe_sums(const ScenarioResult& r, Format f);
std::string write_plans(const ScenarioResult& r, Format f);
toml::array probe_sums_json(const ScenarioResult& r);
toml::array plans_json(const ScenarioResult& r);

} // namespace ts
