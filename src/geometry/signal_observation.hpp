// Observations given as what a Hall bar showed: a Fourier term of one probe's
// signal ("transverse:cos(phi)": a cos φ term in the transverse signal) or a
// nonzero reading at one current azimuth ("longitudinal@30"). Turned into the
// predicate of the inverse search (lowering/inverse_search.hpp).
#pragma once

#include "geometry/bar_signal.hpp"
#include "lowering/component_observation.hpp"

#include <string>

namespace ts {

struct SignalObservation {
  ResponsePart part;           // the catalogue part (its spec's time parity is replaced per version)
  BarMeasurement bar;
  Probe probe = Probe::transverse;
  std::string function;        // "cos(phi)", "sin(3*phi - phiB)"; empty: see azimuth
  int azimuth = -1;            // degrees (multiple of 15) at which the probe reads nonzero; -1: any term
  TimeParity parity = TimeParity::either;
  Frame frame;                 // the sample frame
  std::string text;            // as given, for reports
};

// "transverse:cos(phi)", "longitudinal@30", "transverse" (any nonzero reading).
void parse_signal_observation(const std::string& text, SignalObservation& o, const std::string& where);

// True when some version of the part gives the observed signal in g.
bool shows_signal(const SignalObservation& o, const TensorSpec& version, const PointGroup& g);

Observation observation_of(const SignalObservation& o);

} // namespace ts
