// A pump beam and what it drives (docs/optics.md): the effective magnetic
// field on the spins (inverse Faraday and inverse Cotton-Mouton effects) and
// the photogalvanic current, as exact functions of the pump polarisation and
// the sample azimuth; the torque on an order-parameter direction and which
// magneto-optic probe reads the precession it starts.
//
// Geometry as for the SHG setups (optics_geometry.hpp): n along +z, the plane
// of incidence xz, k_in = (sin θ, 0, -cos θ), P = (cos θ, 0, sin θ), S = y,
// the sample turned by φ about n. The complex field is e = a + i b (a, b real):
//   linear at α:      a = cos α P + sin α S,  b = 0,
//   circular ±:       a = P/√2,               b = ∓S/√2,
//   elliptical at β:  a = cos β P,            b = -sin β S,
// so that the light's spin vector i(e × e*) = 2 a × b is +k̂ for circular+
// (the helicity whose spin points along the beam), sin 2β k̂ for the ellipse
// and zero for linear light; Re(e_j e_k*) = a_j a_k + b_j b_k. θ is fixed (a
// multiple of 15°, refraction ignored); α and β are exact Fourier angles (the
// polariser slot), φ the azimuth slot.
#pragma once

#include "geometry/bar_measurement.hpp"
#include "group/point_group.hpp"
#include "response/response_catalogue.hpp"

#include <array>
#include <string>
#include <vector>

namespace ts {

struct PumpPolarisation {
  enum class Kind { linear, circular_plus, circular_minus, elliptical };
  Kind kind = Kind::linear;
  bool rotating = true; // linear and elliptical: the angle α (β) is a variable
  int degrees = 0;      // otherwise fixed, a multiple of 15
  std::string name;     // as written: "circular+", "linear", "linear:30", "elliptical"
};

// "circular+", "circular-", "linear", "linear:ANGLE", "elliptical",
// "elliptical:ANGLE" (ANGLE in degrees, a multiple of 15).
PumpPolarisation parse_pump_polarisation(const std::string& text, const std::string& where, ErrorKind bad_value);

struct PumpSetup {
  std::string name;
  int incidence_deg = 0;
  bool azimuth_rotating = true;
  int azimuth_deg = 0;
  std::vector<PumpPolarisation> polarisations;
  std::string where;
};

// incidence: degrees 0-75 (multiple of 15); azimuth "rotating" or degrees;
// polarisations: empty gives circular+, circular-, linear, elliptical.
PumpSetup make_pump_setup(const std::string& name, const std::string& incidence, const std::string& azimuth,
                          const std::vector<std::string>& polarisations, const std::string& where, ErrorKind bad_value);

// The complex pump field a + i b, in the sample frame.
struct PumpField {
  TrigVector re, im;
};
PumpField pump_field(const PumpSetup& s, const PumpPolarisation& p);
TrigVector light_spin(const PumpField& f); // i(e × e*) = 2 a × b

// Lab vectors seen in the sample frame: the normal, the in-plane direction of
// the plane of incidence and its normal n × p (functions of φ).
std::array<TrigVector, 3> pump_lab_axes(const PumpSetup& s);

// Whether a part answers the pump: a response index followed by `helicity`
// (the spin vector) or by `light light` (Re(e_j e_k*)).
bool is_pump_part(const ResponsePart& part);
bool is_helicity_part(const ResponsePart& part);

// The vector response (effective field or current) of a pump part: one series
// per sample-frame component, linear in the form's parameters.
std::array<SignalSeries, 3> pump_response(const ResponsePart& part, const AllowedForm& form, const PumpField& f);

// The order-parameter group of a magnetic phase: an order vector l0 (a Néel
// vector need not transform like a moment) is carried into ±l0 by each
// operation g of the phase; χ(g) is that sign. The returned group has the
// spatial parts of the phase with time reversal exactly where χ = -1, so that
// a polar time-odd rank-2 tensor in it transforms as χ(g) g⊗g: the law of
// ∂(gyration vector)/∂l. Throws Error(bad_geometry) naming `where` when an
// operation moves the line of l0 or the phase is grey.
PointGroup order_parameter_group(const PointGroup& phase, const Vec3& order, const std::string& where);

// w·K·e_axis for a rank-2 form K: how a probe with vector w reads a change
// along one sample axis.
SignalSeries probe_reading(const AllowedForm& k, const TrigVector& w, int axis);

} // namespace ts
