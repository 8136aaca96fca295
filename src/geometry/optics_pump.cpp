#include "geometry/optics_pump.hpp"

#include "core/error.hpp"
#include "geometry/component_contraction.hpp"

#include <algorithm>
#include <utility>

namespace ts {

namespace {

const char* polarisation_help = "circular+, circular-, linear, linear:ANGLE, elliptical or elliptical:ANGLE "
                                "(ANGLE in whole degrees, a multiple of 15)";

// Whole degrees that are a multiple of 15, or false.
bool multiple_of_15(const std::string& t, int* out) {
  if (t.empty() || t.size() > 5 || t.find_first_not_of("-0123456789") != std::string::npos ||
      t.find('-', 1) != std::string::npos || t == "-")
    return false;
  const int v = std::stoi(t);
  if (v % 15 != 0) return false;
  *out = v;
  return true;
}

TrigPoly constant(const Surd& s) { return TrigPoly::constant(s); }

TrigVector scaled(const TrigVector& v, const TrigPoly& f) { return {v[0] * f, v[1] * f, v[2] * f}; }
TrigVector plus(const TrigVector& a, const TrigVector& b) { return {a[0] + b[0], a[1] + b[1], a[2] + b[2]}; }

TrigVector cross(const TrigVector& a, const TrigVector& b) {
  const Surd m1 = Rational(-1);
  return {a[1] * b[2] + (a[2] * b[1]).scaled(m1), a[2] * b[0] + (a[0] * b[2]).scaled(m1),
          a[0] * b[1] + (a[1] * b[0]).scaled(m1)};
}

// cos and sin of an angle that is a variable or fixed at whole degrees.
std::pair<TrigPoly, TrigPoly> cos_sin(bool variable, int degrees, Angle a) {
  if (variable) return {TrigPoly::cos_of(a), TrigPoly::sin_of(a)};
  return {constant(cos_degrees(degrees)), constant(sin_degrees(degrees))};
}

// A lab vector seen in the sample frame (the sample turned by +φ).
TrigVector to_sample(const PumpSetup& s, const TrigVector& v) {
  const auto [c, sn] = cos_sin(s.azimuth_rotating, s.azimuth_deg, Angle::phi);
  return {v[0] * c + v[1] * sn, v[0] * sn.scaled(Rational(-1)) + v[1] * c, v[2]};
}

bool is_light_pair(const std::vector<std::string>& ix) {
  return ix.size() == 3 && ix[1] == "light" && ix[2] == "light";
}

} // namespace

PumpPolarisation parse_pump_polarisation(const std::string& text, const std::string& where, ErrorKind bad_value) {
  PumpPolarisation p;
  p.name = text;
  const std::size_t colon = text.find(':');
  const std::string word = text.substr(0, colon);
  if (word == "circular+" || word == "circular-") {
    if (colon != std::string::npos) fail(bad_value, "circular polarisation takes no angle: '" + text + "'", where, polarisation_help);
    p.kind = word == "circular+" ? PumpPolarisation::Kind::circular_plus : PumpPolarisation::Kind::circular_minus;
    return p;
  }
  if (word == "linear") p.kind = PumpPolarisation::Kind::linear;
  else if (word == "elliptical") p.kind = PumpPolarisation::Kind::elliptical;
  else fail(bad_value, "unknown pump polarisation '" + text + "'", where, polarisation_help);
  if (colon == std::string::npos) return p;
  p.rotating = false;
  if (!multiple_of_15(text.substr(colon + 1), &p.degrees))
    fail(bad_value, "pump polarisation angle in '" + text + "' is not usable", where, polarisation_help);
  return p;
}

PumpSetup make_pump_setup(const std::string& name, const std::string& incidence, const std::string& azimuth,
                          const std::vector<std::string>& polarisations, const std::string& where, ErrorKind bad_value) {
  PumpSetup s;
  s.name = name;
  s.where = where;
  if (!multiple_of_15(incidence, &s.incidence_deg) || s.incidence_deg < 0 || s.incidence_deg > 75)
    fail(ErrorKind::bad_geometry, "pump angle of incidence '" + incidence + "' is not usable", where,
         "whole degrees from the normal, a multiple of 15 from 0 to 75");
  if (azimuth != "rotating") {
    if (!multiple_of_15(azimuth, &s.azimuth_deg))
      fail(ErrorKind::bad_geometry, "sample azimuth '" + azimuth + "' is not usable", where,
           "\"rotating\" or whole degrees, a multiple of 15");
    s.azimuth_rotating = false;
    s.azimuth_deg = ((s.azimuth_deg % 360) + 360) % 360;
  }
  const std::vector<std::string> names =
      polarisations.empty() ? std::vector<std::string>{"circular+", "circular-", "linear", "elliptical"} : polarisations;
  for (const auto& n : names) s.polarisations.push_back(parse_pump_polarisation(n, where, bad_value));
  return s;
}

PumpField pump_field(const PumpSetup& s, const PumpPolarisation& p) {
  const TrigPoly c = constant(cos_degrees(s.incidence_deg)), sn = constant(sin_degrees(s.incidence_deg)), zero;
  const TrigVector P{c, zero, sn}, S{zero, constant(Rational(1)), zero};
  const Surd half_root2 = Surd::sqrt_of(Rational(2)) * Surd(Rational(1, 2));
  const auto [ca, sa] = cos_sin(p.rotating, p.degrees, Angle::polariser); // α or β
  PumpField f;
  switch (p.kind) {
  case PumpPolarisation::Kind::linear:
    f.re = plus(scaled(P, ca), scaled(S, sa));
    f.im = {zero, zero, zero};
    break;
  case PumpPolarisation::Kind::circular_plus:
  case PumpPolarisation::Kind::circular_minus: {
    const bool plus_helicity = p.kind == PumpPolarisation::Kind::circular_plus;
    f.re = scaled(P, constant(half_root2));
    f.im = scaled(S, constant(plus_helicity ? -half_root2 : half_root2));
    break;
  }
  case PumpPolarisation::Kind::elliptical:
    f.re = scaled(P, ca);
    f.im = scaled(S, sa.scaled(Rational(-1)));
    break;
  }
  return {to_sample(s, f.re), to_sample(s, f.im)};
}

TrigVector light_spin(const PumpField& f) {
  TrigVector v = cross(f.re, f.im);
  return {v[0].scaled(Rational(2)), v[1].scaled(Rational(2)), v[2].scaled(Rational(2))};
}

std::array<TrigVector, 3> pump_lab_axes(const PumpSetup& s) {
  const TrigPoly one = constant(Rational(1)), zero;
  return {to_sample(s, {zero, zero, one}), to_sample(s, {one, zero, zero}), to_sample(s, {zero, one, zero})};
}

bool is_helicity_part(const ResponsePart& part) {
  return part.indices.size() == 2 && part.indices[1] == "helicity";
}

bool is_pump_part(const ResponsePart& part) { return is_helicity_part(part) || is_light_pair(part.indices); }

std::array<SignalSeries, 3> pump_response(const ResponsePart& part, const AllowedForm& form, const PumpField& f) {
  if (!is_pump_part(part)) fail(ErrorKind::internal, "pump_response called for a part the pump does not drive: " + part.label);
  const TrigPoly one = constant(Rational(1)), zero;
  const std::array<TrigVector, 3> unit{TrigVector{one, zero, zero}, TrigVector{zero, one, zero}, TrigVector{zero, zero, one}};
  std::array<SignalSeries, 3> out;
  auto add = [&](int i, const std::vector<const TrigVector*>& vectors) {
    contract_components(form, vectors, [&](int p, const Surd& c, const TrigPoly& product) {
      out[i].add_term(p, c, product);
    });
  };
  const TrigVector spin = light_spin(f);
  for (int i = 0; i < 3; ++i) {
    if (is_helicity_part(part)) {
      add(i, {&unit[i], &spin});
      continue;
    }
    // Re(e_j e_k*) = a_j a_k + b_j b_k.
    add(i, {&unit[i], &f.re, &f.re});
    add(i, {&unit[i], &f.im, &f.im});
  }
  return out;
}

PointGroup order_parameter_group(const PointGroup& phase, const Vec3& order, const std::string& where) {
  if (phase.is_grey())
    fail(ErrorKind::bad_geometry, "the phase keeps time reversal (a grey group): it has no magnetic order to drive", where,
         "a phase with a moment or magnetic-group step");
  std::vector<Operation> ops;
  for (const auto& g : phase.operations()) {
    // The action on an axial, time-odd vector: det(R) R, reversed by a prime.
    Vec3 image = g.R * order;
    if (g.det() < 0) image = -image;
    if (g.primed) image = -image;
    int chi = 0;
    if (image == order) chi = 1;
    else if (image == -order) chi = -1;
    else
      fail(ErrorKind::bad_geometry,
           "the operation " + g.symbol(phase.lattice()) + " of the phase moves the line of the order vector", where,
           "an order direction that every operation of the phase keeps or reverses (a symmetry axis of the phase)");
    ops.push_back({g.R, chi < 0});
  }
  return PointGroup::from_closed_set(ops, phase.lattice());
}

SignalSeries probe_reading(const AllowedForm& k, const TrigVector& w, int axis) {
  if (k.spec.rank != 2) fail(ErrorKind::internal, "probe_reading needs a rank-2 form");
  SignalSeries s;
  for (int i = 0; i < 3; ++i)
    if (!w[i].is_zero())
      for (const auto& t : k.value(i * 3 + axis)) s.add_term(t.parameter, t.coefficient, w[i]);
  return s;
}

} // namespace ts
