// Running the pump-probe and photocurrent questions of a scenario
// (docs/optics.md), and the pieces of the chain they share with run_scenario.
#pragma once

#include "scenario/scenario_run.hpp"

namespace ts {

PumpProbeResult run_pump_probe(const PumpProbeSpec& spec, const ScenarioResult& res);
PhotocurrentResult run_photocurrent(const PhotocurrentSpec& spec, const ScenarioResult& res);

// One lowering step applied to a group, the direction of a step, and its label
// (the chain's own rules, scenario_run.cpp).
PointGroup apply_lowering_step(const PointGroup& g, const LoweringStep& s, const std::string& system,
                               const LatticeMetric& m);
Vec3 lowering_direction(const std::string& text, const std::string& system, LatticeKind lattice,
                        const LatticeMetric& m, const std::string& where);
std::string lowering_step_label(const LoweringStep& s);

} // namespace ts
