// What one probe of a bar reads at one lock-in harmonic, summed over every
// transport part of the scenario that a group allows: the model of a transport
// scan. Every part with the right power of the current contributes (a lock-in
// reads the sum, not the mechanism the user has in mind); its terms are the
// exact Fourier terms of the part's bar signal times the part's lock-in factor
// at that harmonic, and terms with the same angle function, field power and
// current power are merged into one model function whose coefficient is an
// exact combination of the parameters of all parts.
//
// The sum is built here from the per-part bar signals (bar_signal.hpp); it is
// kept behind this one function so that a library-wide probe sum can replace it.
#pragma once

#include "geometry/bar_signal.hpp"
#include "scenario/scenario_run.hpp"

#include <string>
#include <utility>
#include <vector>

namespace ts {

enum class LockInReading { x, y, dc };

// One function of the model: cos/sin(k·angles) · B^field_power · I^current_power,
// with its exact coefficient Σ c_j p_j over the global parameter list.
struct ModelFunction {
  FourierTerm angles;          // k and sine; its coefficient is unused (see `coefficient`)
  int field_power = 0;
  int current_power = 0;
  std::vector<std::pair<int, Surd>> coefficient; // (global parameter, exact factor incl. the lock-in factor)
  friend bool same_function(const ModelFunction& a, const ModelFunction& b) {
    return a.angles.k == b.angles.k && a.angles.sine == b.angles.sine && a.field_power == b.field_power &&
           a.current_power == b.current_power;
  }
};

struct ProbeModel {
  std::vector<std::string> parameters;      // global names: "chi_xxy", or "chi_xxy@response" when two parts share one
  std::vector<std::string> parameter_parts; // the response part of each parameter, for reports
  std::vector<ModelFunction> functions;     // no zero coefficient; fixed order (angles, powers)
  std::vector<std::string> parts;           // parts that contribute (response id: label)
};

// The parts of `res` that the bar reads (transport parts of the bar's
// responses), each solved in `group` (crystal frame) in the sample frame.
ProbeModel probe_sum(const ScenarioResult& res, const BarResult& bar, const PointGroup& group, Probe probe,
                     int harmonic, LockInReading reading);

} // namespace ts
