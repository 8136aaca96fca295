#include "scenario/scenario_run.hpp"

#include "core/error.hpp"
#include "core/text.hpp"
#include "lowering/curie.hpp"
#include "geometry/crystal_direction.hpp"
#include "geometry/sample_frame.hpp"
#include "lowering/glazer_tilts.hpp"
#include "lowering/structure_file.hpp"
#include "response/response_catalogue.hpp"
#include "response/response_expansion.hpp"
#include "scenario/light_run.hpp"
#include "tensor/param_tensor.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <set>
#include <tuple>

namespace ts {

namespace {

// spglib gives Cartesian matrices in doubles; in a conventional frame every
// entry is one of 0, ±1, ±1/2, ±√3/2, which we recover exactly.
QSqrt3 exact_entry(double v, const std::string& where) {
  const QSqrt3 candidates[] = {QSqrt3(0), QSqrt3(1), QSqrt3(-1), QSqrt3(Rational(1, 2)), QSqrt3(Rational(-1, 2)),
                               QSqrt3(0, Rational(1, 2)), QSqrt3(0, Rational(-1, 2))};
  for (const auto& c : candidates)
    if (std::fabs(c.to_double() - v) < 1e-6) return c;
  fail(ErrorKind::bad_group, "a symmetry operation of the structure has the entry " + std::to_string(v) +
                                 ", so its lattice is not in a conventional Cartesian setting",
       where, "a lattice with a along x (and b in the xy plane) in a conventional cell");
}

struct Parent {
  PointGroup group;
  std::string system;
  std::string note;
  std::optional<StructureSymmetry> symmetry;
};

Parent parent_group(const Scenario& sc, LatticeMetric& metric) {
  const auto& cat = GroupCatalogue::builtin();
  Parent p;
  if (!sc.structure) {
    const NamedGroup& literal = cat.get(sc.group);
    const NamedGroup& g =
        cat.get(sc.group, sc.assume_nonmagnetic ? PlainSymbol::nonmagnetic : PlainSymbol::colourless);
    p.group = g.group;
    p.system = g.crystal->system;
    if (&g != &literal)
      p.note = literal.symbol + " taken as non-magnetic: " + g.symbol +
               " (--colourless or nonmagnetic = false for the colourless magnetic group)";
    return p;
  }
  const CrystalStructure& st = *sc.structure;
  StructureSymmetry sym = sc.structure_symmetry ? *sc.structure_symmetry : find_structure_symmetry(st);
  std::vector<Operation> ops;
  bool hexagonal = false;
  for (const auto& po : sym.point_operations) {
    Operation op;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) {
        op.R(i, j) = exact_entry(po.rotation_cartesian[i][j], st.where);
        if (!op.R(i, j).is_rational()) hexagonal = true;
      }
    op.primed = po.time_reversal;
    ops.push_back(op);
  }
  LatticeKind lattice = hexagonal ? LatticeKind::hexagonal : LatticeKind::orthogonal;
  p.group = PointGroup::generate(ops, lattice, 96, st.where);
  if (!st.magnetic && sc.assume_nonmagnetic) p.group = p.group.with_time_reversal();
  Identification id = identify(p.group, cat);
  p.system = id.type->crystal->system;
  p.note = "structure: space group " + sym.space_group_symbol + " (" + std::to_string(sym.space_group_number) +
           "), point group " + id.type->symbol + (st.magnetic ? " with the given moments" : ", non-magnetic") +
           " (spglib, symprec " + std::to_string(sym.symprec) + ")";
  for (const auto& n : structure_symmetry_notes(st, sym)) p.note += "; " + n;
  p.symmetry = sym;
  if (!metric.known()) {
    auto length = [&](int r) {
      double s = 0;
      for (double v : st.lattice[r]) s += v * v;
      return exact_decimal(std::sqrt(s), st.where, ErrorKind::bad_file);
    };
    metric.a = length(0);
    metric.b = length(1);
    metric.c = length(2);
  }
  return p;
}

Vec3 step_direction(const std::string& text, const std::string& system, LatticeKind lattice, const LatticeMetric& m,
                    const std::string& where) {
  return metric_direction(parse_direction(text, where), system, lattice, m, where);
}

PointGroup tilt_group(const std::string& glazer, const PointGroup& current, const std::string& where) {
  TiltedPerovskite tp = build_tilted_perovskite(parse_glazer_symbol(glazer));
  std::vector<Operation> ops;
  for (const auto& r : tp.point_rotations_pseudocubic) {
    Operation op;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) op.R(i, j) = QSqrt3(r[i][j]);
    ops.push_back(op);
    ops.push_back({op.R, true}); // tilts are non-magnetic: they keep time reversal
  }
  if (current.lattice() != LatticeKind::orthogonal)
    fail(ErrorKind::bad_geometry, "Glazer tilts belong to a perovskite with a cubic parent frame", where,
         "a cubic (pseudocubic) parent such as m-3m");
  return PointGroup::from_closed_set(ops, LatticeKind::orthogonal);
}

std::string step_label(const LoweringStep& s) {
  std::string base;
  switch (s.kind) {
  case LoweringKind::strain: base = "strain ∥ " + s.along; break;
  case LoweringKind::shear: base = "shear " + s.along + "/" + s.second; break;
  case LoweringKind::polar: base = "polar displacement ∥ " + s.along; break;
  case LoweringKind::electric_field: base = "electric field ∥ " + s.along; break;
  case LoweringKind::moment: base = "magnetic moment ∥ " + s.along; break;
  case LoweringKind::magnetic_field: base = "magnetic field ∥ " + s.along; break;
  case LoweringKind::current: base = "current ∥ " + s.along; break;
  case LoweringKind::magnetic_group: base = "magnetic order " + s.value; break;
  case LoweringKind::subgroup: base = "structural subgroup " + s.value; break;
  case LoweringKind::tilts: base = "octahedral tilts " + s.value; break;
  }
  return s.label.empty() ? base : s.label + " (" + base + ")";
}

PointGroup lower(const PointGroup& g, const LoweringStep& s, const std::string& system, const LatticeMetric& m,
                 std::string* quantity) {
  auto dir = [&](const std::string& t) { return step_direction(t, system, g.lattice(), m, s.where); };
  auto vec = [&](QuantityKind k) {
    *quantity = quantity_kind_name(k);
    return stabiliser(g, {k, dir(s.along), Mat3::identity()});
  };
  switch (s.kind) {
  case LoweringKind::strain:
    *quantity = quantity_kind_name(QuantityKind::strain);
    return stabiliser(g, {QuantityKind::strain, {}, uniaxial_strain(dir(s.along))});
  case LoweringKind::shear: {
    Vec3 a = dir(s.along), b = dir(s.second);
    *quantity = quantity_kind_name(QuantityKind::strain);
    return stabiliser(g, {QuantityKind::strain, {}, shear_strain(a, b)});
  }
  case LoweringKind::polar:
  case LoweringKind::electric_field: return vec(QuantityKind::polar_even);
  case LoweringKind::moment:
  case LoweringKind::magnetic_field: return vec(QuantityKind::axial_odd);
  case LoweringKind::current: return vec(QuantityKind::polar_odd);
  case LoweringKind::magnetic_group: {
    const NamedGroup& order = GroupCatalogue::builtin().get(s.value);
    if (order.group.lattice() != g.lattice())
      fail(ErrorKind::bad_geometry, "magnetic group " + s.value + " is given in other axes than the crystal", s.where,
           "a magnetic point group of the same crystal family, written in the crystal's axes");
    *quantity = "intersection with the magnetic point group " + order.symbol + " (crystal axes)";
    return g.intersection(order.group);
  }
  case LoweringKind::subgroup: {
    // A twin, a distortion or a superstructure: operations of space, no time reversal
    // of its own. In a non-magnetic crystal each kept operation keeps its partner with 1'.
    const NamedGroup& h = GroupCatalogue::builtin().get(s.value);
    if (h.kind != MagneticKind::colourless)
      fail(s.bad_value, "structural subgroup " + s.value + " has primed operations", s.where,
           "a point group symbol without primes or 1' (mm2, 4mm, ...); magnetic order is magnetic-group:" + s.value);
    if (h.group.lattice() != g.lattice())
      fail(ErrorKind::bad_geometry, "subgroup " + s.value + " is given in other axes than the crystal", s.where,
           "a point group of the same crystal family, written in the crystal's axes");
    *quantity = "intersection with the structural point group " + h.symbol + " (crystal axes; time reversal as before)";
    return g.intersection(h.group.with_time_reversal());
  }
  case LoweringKind::tilts:
    *quantity = "intersection with the point group of the tilted perovskite (spglib)";
    return g.intersection(tilt_group(s.value, g, s.where));
  }
  return g;
}

Combination sorted_value(const AllowedForm& f, int code) {
  Combination c = f.value(code);
  std::sort(c.begin(), c.end(), [](const LinearTerm& x, const LinearTerm& y) { return x.parameter < y.parameter; });
  return c;
}

StepChange compare(const AllowedForm& before, const AllowedForm& after) {
  StepChange ch;
  ch.before = before.independent();
  ch.after = after.independent();
  const auto& sym = *before.symmetry;
  for (int r = 0; r < sym.size(); ++r) {
    int code = sym.rep_code(r);
    if (before.components[r].empty() && !after.components[r].empty()) ch.switched_on.push_back(before.component_name(code));
  }
  // Relations of the form C = c·anchor, anchor the leading component of a parameter.
  for (int j = 0; j < before.independent(); ++j) {
    int anchor = sym.rep_code(before.parameter_components[j]);
    Combination anchor_after = sorted_value(after, anchor);
    for (int r = 0; r < sym.size(); ++r) {
      const auto& v = before.components[r];
      if (v.size() != 1 || v[0].parameter != j || sym.rep_code(r) == anchor) continue;
      const Surd& c = v[0].coefficient;
      Combination expected = combine({}, anchor_after, c);
      if (expected != sorted_value(after, sym.rep_code(r))) {
        ch.broken.push_back({before.component_name(sym.rep_code(r)), before.component_name(anchor), c});
      }
    }
  }
  return ch;
}

} // namespace

std::string readable_symbol(const PointGroup& g, const Identification& id, const std::string& sample_symbol,
                            bool with_words) {
  const std::string& type = id.type->symbol;
  auto worded = [&](const std::string& symbol) {
    const std::string words = elements_in_words(g, g.lattice());
    return words.empty() ? symbol : symbol + " (" + words + ")";
  };
  if (sample_symbol.empty()) return with_words ? worded(type) : type;
  // A setting written with 1 positions says little to a reader: its type and its
  // elements instead. Named variants such as mm'2' stay.
  std::string plain = sample_symbol;
  if (g.is_grey() && plain.size() > 2) plain.resize(plain.size() - 2);
  const bool cryptic = sample_symbol != type && plain.find('1') != std::string::npos;
  if (cryptic) return worded(type);
  return with_words ? worded(sample_symbol) : sample_symbol;
}

std::string sample_symbol(const PointGroup& g, const Identification& id, const Frame& frame) {
  if (frame.is_identity()) return id.same_setting ? id.same_setting->symbol : "";
  for (const auto& cand : GroupCatalogue::builtin().groups())
    if (cand.type_symbol == id.type->symbol && frame_carries(frame.axes, g, cand.group)) return cand.symbol;
  return "";
}

namespace {

ShgResult run_shg(const ShgSpec& spec, const ScenarioResult& res, const ResponseCatalogue& responses) {
  ShgResult out;
  out.measurement =
      make_optical_measurement(spec.name, spec.geometry, spec.incidence, spec.azimuth, spec.channels, spec.where);
  if (spec.local_field) apply_local_field(out.measurement, spec.indices, spec.where);
  for (const auto& id : spec.responses) responses.get(id); // unknown ids fail here, with the closest ids
  for (std::size_t k = 0; k < res.parts.size(); ++k) {
    const PartForms& p = res.parts[k];
    if (!p.catalogue_part || !is_shg_part(*p.catalogue_part)) continue;
    if (!spec.responses.empty() && std::none_of(spec.responses.begin(), spec.responses.end(), [&](const std::string& id) {
          return responses.get(id).id == p.response_id;
        }))
      continue;
    // The factors of a magnetic dipole, a quadrupole or a field gradient differ
    // from those of the dipole; mixing them with bare amplitudes would mislead.
    if (spec.local_field && !is_dipole_shg_part(*p.catalogue_part))
      fail(ErrorKind::bad_geometry,
           "local-field factors are defined for electric-dipole sources only, not for " + p.response_id + ": " +
               p.part_label,
           spec.where, "responses = [\"electric-dipole-shg\"] in this [[shg]] table (or --response electric-dipole-shg)");
    ShgSource src{k, {}, {}};
    for (const auto& c : out.measurement.channels) {
      src.channels.push_back(shg_amplitude(*p.catalogue_part, p.forms.back(), channel_vectors(out.measurement, c)));
      const ChannelAmplitude& a = src.channels.back();
      ShgChannelSignal signal{optical_terms(a), {}, product_harmonics(a, a)};
      for (const auto& t : signal.terms) signal.amplitude_harmonics.push_back({t.k, t.sine});
      src.signals.push_back(std::move(signal));
    }
    out.sources.push_back(std::move(src));
  }
  if (out.sources.empty())
    fail(spec.bad_value, "the SHG setup '" + spec.name + "' finds no second-harmonic source among the responses",
         spec.where, "add electric-dipole-shg (and magnetic-dipole-shg, electric-quadrupole-shg) to responses");
  // Every i-type source against every c-type source: their cross term is
  // what changes sign between the two 180° domains.
  for (std::size_t a = 0; a < out.sources.size(); ++a)
    for (std::size_t b = 0; b < out.sources.size(); ++b) {
      const TensorSpec& sa = res.parts[out.sources[a].part].spec;
      const TensorSpec& sb = res.parts[out.sources[b].part].spec;
      if (sa.time_odd || !sb.time_odd) continue;
      ShgInterference in{a, b, {}};
      bool any = false;
      for (std::size_t c = 0; c < out.measurement.channels.size(); ++c) {
        in.cross.push_back(product_harmonics(out.sources[a].channels[c], out.sources[b].channels[c]));
        any = any || !in.cross.back().empty();
      }
      if (any) out.interference.push_back(std::move(in));
    }
  for (std::size_t c = 0; c < out.measurement.channels.size(); ++c) {
    bool any = false;
    for (const auto& src : out.sources) any = any || src.channels[c].radiates();
    if (!any) out.dark_channels.push_back(out.measurement.channels[c].name);
  }
  return out;
}

// A part's tensor given as combinations of the parameters of `params` (a domain
// average), as a form of the part's shape, so a bar contracts it like any form.
// Only the number of parameters matters to the contraction: the report names
// them through `params`.
AllowedForm with_values(const AllowedForm& shape, const ParamTensor& t, const AllowedForm& params) {
  AllowedForm out = shape;
  out.parameter_components = params.parameter_components;
  for (int r = 0; r < shape.symmetry->size(); ++r) out.components[r] = t.components[shape.symmetry->rep_code(r)];
  return out;
}

// Why a requested part is no bar reading: a probe reads the electric field (or
// current) between two contacts, so the part's response index must be E or j.
std::string unread_reason(const PartForms& p) {
  if (!p.catalogue_part)
    return "a tensor given by its spec carries no index roles (which index is the voltage, which the current), so "
           "no probe contraction is defined; a catalogue entry with roles makes it one (docs/responses.md)";
  static const std::map<std::string, std::string> what{
      {"S", "a spin polarisation"}, {"Js", "a spin current"},       {"P", "an electric polarisation"},
      {"M", "a magnetisation"},     {"light", "an optical field"},  {"g", "a gyration vector (optics)"},
      {"heat", "a heat current"},   {"Q", "a quadrupole"},          {"strain", "a strain"},
      {"indicatrix", "the optical indicatrix"}, {"k", "a wave vector"}, {"H", "a magnetic field"}};
  const auto& ix = p.catalogue_part->indices;
  const std::string role = ix.empty() ? "" : ix.front();
  auto it = what.find(role);
  const std::string response = role.empty() ? "a scalar" : (it == what.end() ? "the quantity " + role : it->second) +
                                                               " (index role " + role + ")";
  return "its response is " + response + ", not the electric field or current that two contacts of a bar read";
}

KerrResult run_kerr(const KerrSpec& spec, const ScenarioResult& res, LatticeKind lattice) {
  KerrResult out;
  out.name = spec.name;
  out.where = spec.where;
  BarMeasurement m; // only its field direction: the magnetisation
  m.where = spec.where;
  set_bar_field(m, spec.magnetisation, res.sample, res.system, lattice, res.metric);
  if (m.field == FieldGeometry::none || m.field == FieldGeometry::along_current || m.field == FieldGeometry::across_current)
    fail(ErrorKind::bad_geometry, "'" + spec.magnetisation + "' is not a magnetisation direction", spec.where,
         "in-plane, normal, any, a crystal direction [uvw] or in-plane:ANGLE");
  out.magnetisation_label = m.field_label;
  // A fixed magnetisation must be one the final group allows: the moment is an
  // axial time-odd vector, so it lies in the span of that vector's allowed form.
  // A group that allows no net moment (grey, or an antiferromagnet) says nothing
  // here: the quadratic terms then describe the order vector.
  out.moment_form = allowed_form(parse_tensor_spec("m_a: axial, time-odd"), res.chain.back().group, res.frame);
  const AllowedForm& mf = *out.moment_form;
  if ((m.field == FieldGeometry::fixed || m.field == FieldGeometry::normal) && mf.independent() > 0 &&
      mf.independent() < 3) {
    const std::array<Surd, 3> d =
        m.field == FieldGeometry::normal ? std::array<Surd, 3>{Surd(), Surd(), Surd(Rational(1))} : m.b;
    std::array<std::array<Surd, 3>, 2> v{}; // the allowed directions, one per parameter
    for (int i = 0; i < 3; ++i)
      for (const auto& t : mf.value(i)) v[t.parameter][i] = t.coefficient;
    auto cross = [](const std::array<Surd, 3>& a, const std::array<Surd, 3>& b) {
      return std::array<Surd, 3>{a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    };
    if (mf.independent() == 1) {
      const auto c = cross(d, v[0]);
      out.magnetisation_outside_group = !(c[0].is_zero() && c[1].is_zero() && c[2].is_zero());
    } else {
      const auto n = cross(v[0], v[1]);
      out.magnetisation_outside_group = !(d[0] * n[0] + d[1] * n[1] + d[2] * n[2]).is_zero();
    }
  }
  for (std::size_t k = 0; k < res.parts.size(); ++k) {
    const ResponsePart* p = res.parts[k].catalogue_part;
    if (!p) continue;
    if (p->indices == std::vector<std::string>{"g"} && p->spec.rank == 1) out.g_part = k;
    if (p->indices == std::vector<std::string>{"P", "light", "M", "M"}) out.q_part = k;
  }
  if (!out.g_part && !out.q_part)
    fail(spec.bad_value, "the magneto-optic question '" + spec.name + "' finds neither the gyration vector nor the "
         "quadratic term among the responses", spec.where,
         "add magneto-optic-kerr and magnetic-linear-birefringence to responses");
  if (out.g_part) out.kerr = kerr_readings(res.parts[*out.g_part].forms.back());
  if (out.q_part) out.voigt = voigt_readings(res.parts[*out.q_part].forms.back(), field_vector(m));
  return out;
}

// A plane (hkl) or direction [uvw] written in the rhombohedral axes of a
// structure file, in the hexagonal axes the structure is held in (obverse:
// a_h = a_r - b_r, b_h = b_r - c_r, c_h = a_r + b_r + c_r). Plane indices go
// like the axes, (h - k, k - l, h + k + l); directions go inversely,
// [2u - v - w, u + v - 2w, u + v + w] (over 3, dropped with the common factor).
// Four-index or unreadable text is left for the frame builder to judge.
std::string hexagonal_from_rhombohedral(const std::string& text, const std::string& where) {
  if (text.size() < 2) return text;
  const bool plane = text.front() == '(' && text.back() == ')';
  const bool direction = text.front() == '[' && text.back() == ']';
  if (!plane && !direction) return text;
  std::vector<long> v;
  try {
    v = parse_miller_indices(text.substr(1, text.size() - 2), text, where, "");
  } catch (const Error&) {
    return text;
  }
  if (v.size() != 3) return text;
  for (long x : v)
    if (x > 1000000 || x < -1000000) return text;
  std::array<long, 3> h = plane ? std::array<long, 3>{v[0] - v[1], v[1] - v[2], v[0] + v[1] + v[2]}
                                : std::array<long, 3>{2 * v[0] - v[1] - v[2], v[0] + v[1] - 2 * v[2], v[0] + v[1] + v[2]};
  const long g = std::gcd(std::gcd(std::labs(h[0]), std::labs(h[1])), std::labs(h[2]));
  bool wide = false;
  for (long& x : h) {
    if (g > 1) x /= g;
    wide = wide || x > 9 || x < -9;
  }
  std::string body;
  for (int i = 0; i < 3; ++i) body += (i && wide ? "," : "") + std::to_string(h[i]);
  return (plane ? "(" : "[") + body + (plane ? ")" : "]");
}

// Which angle functions each probe shows in which part, per current order: the
// function is keyed by its frequency and kind, and by the field role only when it
// involves the field angles (cos 2φ reads the same for a part in B and in M).
std::vector<BarSeparation> bar_separations(const std::vector<BarPartSignal>& signals) {
  std::set<int> orders;
  for (const auto& s : signals) orders.insert(s.signal.current_order);
  std::vector<BarSeparation> out;
  for (int order : orders)
    for (Probe probe : {Probe::longitudinal, Probe::transverse}) {
      std::map<std::tuple<Frequency, bool, std::string>, std::vector<std::size_t>> who;
      std::set<std::size_t> reading;
      for (const auto& s : signals) {
        if (s.signal.current_order != order) continue;
        const ProbeSignal& p = probe == Probe::longitudinal ? s.signal.longitudinal : s.signal.transverse;
        if (!p.reads()) continue;
        reading.insert(s.part);
        for (const auto& t : p.terms) {
          const bool field_angles =
              t.k[static_cast<int>(Angle::phi_b)] != 0 || t.k[static_cast<int>(Angle::theta_b)] != 0;
          auto& parts = who[{t.k, t.sine, field_angles && s.signal.field_role == "M" ? "M" : ""}];
          if (parts.empty() || parts.back() != s.part) parts.push_back(s.part);
        }
      }
      if (reading.size() < 2) continue;
      BarSeparation sep{order, probe, {}};
      for (auto& [key, parts] : who)
        sep.rows.push_back({std::get<0>(key), std::get<1>(key), std::get<2>(key), std::move(parts)});
      out.push_back(std::move(sep));
    }
  return out;
}

} // namespace

std::vector<SumInput> probe_sum_inputs(const ScenarioResult& res, const std::vector<std::string>& only) {
  const auto& responses = ResponseCatalogue::builtin();
  std::vector<SumInput> out;
  auto add = [&](const std::vector<PartForms>& parts, bool background) {
    for (std::size_t k = 0; k < parts.size(); ++k) {
      const PartForms& p = parts[k];
      if (!p.catalogue_part || !is_bar_part(*p.catalogue_part)) continue;
      if (!background && !only.empty() && std::none_of(only.begin(), only.end(), [&](const std::string& id) {
            return responses.get(id).id == p.response_id;
          }))
        continue;
      out.push_back({k, background, p.response_id, p.response_name, p.catalogue_part, &p.forms.back(), p.sources});
    }
  };
  add(res.parts, false);
  add(res.background, true);
  return out;
}

ScenarioResult run_scenario(const Scenario& given) {
  if (given.steps.size() > given.max_steps) {
    const LoweringStep& first_extra = given.steps[given.max_steps];
    fail(first_extra.bad_value,
         std::to_string(given.steps.size()) + " lowering steps, more than the " + std::to_string(given.max_steps) +
             " a scenario may run (each step repeats every form for every response)",
         first_extra.where.empty() ? given.source : first_extra.where,
         "a shorter chain (a step that changes nothing can go), or a larger limit with --max-steps N on the command "
         "line");
  }
  Scenario sc = given;
  std::string axes_note;
  if (sc.structure && sc.structure->rhombohedral_axes) {
    for (std::string* field : {&sc.cut, &sc.z, &sc.x}) {
      if (field->empty()) continue;
      const std::string hex = hexagonal_from_rhombohedral(*field, sc.source);
      if (hex != *field) axes_note += (axes_note.empty() ? "" : ", ") + *field + " is " + hex;
      *field = hex;
    }
    if (!axes_note.empty())
      axes_note = "indices refer to the file's rhombohedral axes: " + axes_note + " in the hexagonal axes used here";
  }
  ScenarioResult res;
  res.scenario = given;
  LatticeMetric metric = sc.metric;
  Parent parent = parent_group(sc, metric);
  res.parent_note = parent.note + (axes_note.empty() ? "" : "; " + axes_note);
  res.structure_symmetry = parent.symmetry;
  const LatticeKind lattice = parent.group.lattice();
  SampleFrame sf = build_sample_frame({sc.cut, sc.z, sc.x, sc.source}, parent.system, lattice, metric);
  const Vec3 normal = sf.normal;
  res.frame = sf.frame;
  res.sample = sf;
  res.system = parent.system;
  res.metric = metric;
  res.frame_labels = res.frame.labels;
  const auto& cat = GroupCatalogue::builtin();

  auto describe = [&](const std::string& label, const PointGroup& g) {
    ChainStep st;
    st.label = label;
    st.group = g;
    st.id = identify(g, cat);
    st.sample_symbol = sample_symbol(g, st.id, res.frame);
    st.readable_symbol = readable_symbol(g, st.id, st.sample_symbol);
    return st;
  };
  auto push = [&](const std::string& label, const std::string& quantity, PointGroup g) {
    ChainStep st = describe(label, g);
    st.quantity = quantity;
    if (!res.chain.empty())
      for (const auto& op : res.chain.back().group.operations())
        if (!g.contains(op)) st.lost.push_back(op.symbol(lattice));
    st.group = std::move(g);
    res.chain.push_back(std::move(st));
  };
  push("bulk", "", parent.group);
  if (!sc.cut.empty()) {
    QuantityKind k = sc.equivalent_faces ? QuantityKind::line : QuantityKind::polar_even;
    push("cut " + given.cut + (sc.equivalent_faces ? ", slab with equivalent faces" : ", surface or interface"),
         sc.equivalent_faces ? "unoriented normal (both faces alike)" : "polar normal (film side differs from substrate side)",
         stabiliser(parent.group, {k, normal, Mat3::identity()}));
  }
  for (const auto& s : sc.steps) {
    std::string quantity;
    PointGroup g = lower(res.chain.back().group, s, parent.system, metric, &quantity);
    push(step_label(s), quantity, std::move(g));
  }

  const auto& responses = ResponseCatalogue::builtin();
  std::vector<std::string> ids; // "all" and families expanded, each response once
  for (const auto& asked : sc.responses)
    for (const auto& id : responses.expand(asked))
      if (std::find(ids.begin(), ids.end(), id) == ids.end()) ids.push_back(id);
  // Expansion orders asked for: each names a response with an expansion.
  std::map<std::string, int> orders;
  for (const auto& [asked, order] : sc.expansion_orders) {
    const Response& r = responses.get(asked);
    if (!r.expansion) {
      std::vector<std::string> expandable;
      for (const auto& x : responses.responses())
        if (x.expansion) expandable.push_back(x.id);
      fail(sc.expansion_bad_value, "response '" + r.id + "' has no expansion in B or M to set an order for",
           sc.expansion_where, "one of " + join(expandable, ", "));
    }
    orders[r.id] = order;
  }
  auto add_parts = [&](const Response& r, std::vector<PartForms>& into) {
    auto add = [&](const ResponsePart& part, std::shared_ptr<const ResponsePart> owned) {
      PartForms pf;
      pf.response_id = r.id;
      pf.response_name = r.name;
      pf.part_label = part.label;
      pf.catalogue_part = &part;
      pf.generated_part = std::move(owned);
      pf.spec = part.spec;
      pf.excluded = part.excluded;
      into.push_back(std::move(pf));
    };
    auto order = orders.find(r.id);
    if (order == orders.end() || order->second == r.expansion->order) {
      for (const auto& part : r.parts) add(part, nullptr);
      return;
    }
    for (auto& part : expansion_parts(*r.expansion, order->second, sc.expansion_where, sc.expansion_bad_value)) {
      auto owned = std::make_shared<const ResponsePart>(std::move(part));
      add(*owned, owned);
    }
    for (const auto& part : r.parts)
      if (part.expansion_order == 0) add(part, nullptr);
  };
  for (const auto& id : ids) add_parts(responses.get(id), res.parts);
  for (const auto& [id, order] : orders)
    if (std::find(ids.begin(), ids.end(), id) == ids.end())
      fail(sc.expansion_bad_value, "an expansion order is given for '" + id + "', which is not among the responses",
           sc.expansion_where, "add it to responses = [...]");
  // Every bar also reads the Joule-heating background, asked for or not.
  if (!sc.bars.empty() || !sc.layouts.empty()) {
    const Response& joule = responses.get("joule-heating-nernst");
    if (std::find(ids.begin(), ids.end(), joule.id) == ids.end()) add_parts(joule, res.background);
  }
  for (const auto& t : sc.tensors) {
    PartForms pf;
    pf.response_name = "tensor " + t;
    pf.part_label = t;
    pf.spec = parse_tensor_spec(t);
    res.parts.push_back(std::move(pf));
  }

  // Chains that leave out the field (or field and moment) steps, for the
  // parts that are expansions in B (or M).
  auto chain_without = [&](bool skip_moment) {
    std::vector<PointGroup> groups{res.chain[0].group};
    std::vector<bool> skipped{false};
    if (!sc.cut.empty()) {
      groups.push_back(res.chain[1].group);
      skipped.push_back(false);
    }
    for (const auto& s : sc.steps) {
      bool skip = s.kind == LoweringKind::magnetic_field || (skip_moment && s.kind == LoweringKind::moment);
      std::string ignored;
      groups.push_back(skip ? groups.back() : lower(groups.back(), s, parent.system, metric, &ignored));
      skipped.push_back(skip);
    }
    return std::make_pair(groups, skipped);
  };
  // A drive index B or M (not the response index: a moment as the response is no expansion).
  auto has_role = [](const PartForms& p, const char* role) {
    if (!p.catalogue_part || p.catalogue_part->indices.size() < 2) return false;
    const auto& ix = p.catalogue_part->indices;
    return std::find(ix.begin() + 1, ix.end(), role) != ix.end();
  };
  bool any_field_step = std::any_of(sc.steps.begin(), sc.steps.end(), [](const LoweringStep& s) {
    return s.kind == LoweringKind::magnetic_field || s.kind == LoweringKind::moment;
  });
  std::optional<std::pair<std::vector<PointGroup>, std::vector<bool>>> without_b, without_bm;
  std::optional<ChainStep> evaluated_without[2]; // the last group of without_b, without_bm, described
  const bool any_b_step = std::any_of(sc.steps.begin(), sc.steps.end(),
                                      [](const LoweringStep& s) { return s.kind == LoweringKind::magnetic_field; });
  BarMeasurement general; // the most general planar bar: current and field directions free
  const bool magnetic_parent = !res.chain[0].group.is_grey();
  auto fill_forms = [&](PartForms& p) {
    const std::vector<PointGroup>* groups = nullptr;
    const std::vector<bool>* skipped = nullptr;
    if (any_field_step && (has_role(p, "M") || has_role(p, "B"))) {
      auto& alt = has_role(p, "M") ? without_bm : without_b;
      if (!alt) alt = chain_without(has_role(p, "M"));
      groups = &alt->first;
      skipped = &alt->second;
    }
    for (std::size_t i = 0; i < res.chain.size(); ++i) {
      const PointGroup& g = groups ? (*groups)[i] : res.chain[i].group;
      p.forms.push_back(allowed_form(p.spec, g, res.frame));
      p.counts.push_back(p.forms.back().independent() - (p.excluded ? independent_count(*p.excluded, g) : 0));
      p.field_step_skipped.push_back(skipped && (*skipped)[i]);
      PlanarReading pr = PlanarReading::not_a_bar_part;
      if (p.catalogue_part && is_bar_part(*p.catalogue_part)) {
        if (p.counts.back() == 0) pr = PlanarReading::forbidden;
        else pr = bar_signal(*p.catalogue_part, p.forms.back(), general).reads() ? PlanarReading::readable
                                                                                   : PlanarReading::not_readable;
      }
      p.planar.push_back(pr);
    }
    if (skipped && std::find(skipped->begin(), skipped->end(), true) != skipped->end()) {
      auto& described = evaluated_without[has_role(p, "M") ? 1 : 0];
      if (!described) described = describe("without the applied field", groups->back());
      p.evaluated_in = described;
    } else if (any_b_step && p.counts.back() > 0) {
      if (!without_b) without_b = chain_without(false);
      const PointGroup& g = without_b->first.back();
      p.induced_by_field = independent_count(p.spec, g) - (p.excluded ? independent_count(*p.excluded, g) : 0) == 0;
    }
    p.field_induced_hall = p.induced_by_field && p.catalogue_part && p.catalogue_part->hall &&
                           p.catalogue_part->harmonic == 1 && p.spec.time_odd;
    for (std::size_t i = 0; i < p.counts.size(); ++i)
      p.verdicts.push_back(p.planar[i] == PlanarReading::not_a_bar_part ? (p.counts[i] > 0 ? "allowed" : "forbidden")
                                                                        : planar_reading_text(p.planar[i]));
    for (std::size_t i = p.counts.size(); i-- > 1;)
      if (p.counts[i] > 0 && p.counts[i - 1] == 0) {
        p.switched_on_at = i;
        break;
      }
    // The time-odd quantities this part's last form was derived with.
    p.sources.magnetisation = magnetic_parent;
    for (std::size_t i = 0; i < sc.steps.size(); ++i) {
      const std::size_t step = i + (sc.cut.empty() ? 1 : 2);
      if (p.field_step_skipped[step]) continue;
      const LoweringKind k = sc.steps[i].kind;
      if (k == LoweringKind::magnetic_field) p.sources.field = true;
      if (k == LoweringKind::moment || k == LoweringKind::magnetic_group) p.sources.magnetisation = true;
    }
  };
  for (auto& p : res.parts) fill_forms(p);
  for (auto& p : res.background) fill_forms(p);

  for (std::size_t i = 1; i < res.chain.size(); ++i)
    for (std::size_t k = 0; k < res.parts.size(); ++k) {
      StepChange ch = compare(res.parts[k].forms[i - 1], res.parts[k].forms[i]);
      ch.before = res.parts[k].counts[i - 1];
      ch.after = res.parts[k].counts[i];
      ch.step = i;
      ch.part = k;
      res.changes.push_back(std::move(ch));
    }

  if (sc.domains) {
    std::size_t from = sc.cut.empty() ? 0 : 1;
    const PointGroup& top = res.chain[from].group;
    PointGroup h = top;
    std::vector<LabField> fields;
    for (const auto& s : sc.steps) {
      bool applied = s.kind == LoweringKind::magnetic_field || s.kind == LoweringKind::electric_field ||
                     s.kind == LoweringKind::current;
      std::string ignored;
      if (!applied) h = lower(h, s, parent.system, metric, &ignored);
      else
        fields.push_back({s.kind == LoweringKind::magnetic_field ? QuantityKind::axial_odd
                          : s.kind == LoweringKind::current      ? QuantityKind::polar_odd
                                                                 : QuantityKind::polar_even,
                          step_direction(s.along, parent.system, lattice, metric, s.where), step_label(s)});
    }
    const std::size_t n = top.order() / h.order();
    if (!sc.domain_fractions.empty()) {
      if (n == 1)
        fail(ErrorKind::bad_geometry, "domain fractions given, but no spontaneous step breaks the symmetry: one domain",
             sc.fractions_where, "a strain, polar, moment, magnetic-group or tilts step, or no domain_fractions");
      if (sc.domain_fractions.size() != n)
        fail(ErrorKind::bad_geometry,
             std::to_string(sc.domain_fractions.size()) + " domain fractions given for " + std::to_string(n) + " variants",
             sc.fractions_where, std::to_string(n) + " fractions, one per variant in the order of the report");
      Rational sum;
      for (const auto& w : sc.domain_fractions) sum = sum + w;
      if (sum != Rational(1))
        fail(ErrorKind::bad_geometry, "the domain fractions add up to " + sum.str() + ", not 1", sc.fractions_where,
             "volume fractions that add up to 1, e.g. [0.75, 0.25]");
    }
    std::vector<Rational> weights =
        sc.domain_fractions.empty() ? std::vector<Rational>(n, Rational(1, static_cast<std::int64_t>(n))) : sc.domain_fractions;
    const std::string domain_symbol = n > 1 ? identify(h, cat).type->symbol : std::string();
    if (n > 1)
      for (std::size_t k = 0; k < res.parts.size(); ++k) {
        AllowedForm form = allowed_form(res.parts[k].spec, h, res.frame);
        DomainAnalysis a = domain_variants(top, h, form, res.frame);
        if (!sc.domain_fractions.empty()) {
          std::vector<ParamTensor> tensors;
          for (const auto& v : a.variants) tensors.push_back(v.tensor);
          a.average = weighted_sum(tensors, weights);
        }
        DomainReport d{k, from, h, domain_symbol, std::move(form), std::move(a), sc.domain_fractions, {}};
        for (const auto& f : fields) d.in_field.push_back(field_linear_term(top, h, res.parts[k].spec, f, res.frame, weights));
        res.domains.push_back(std::move(d));
      }
  }
  for (const auto& spec : sc.bars) {
    BarResult br;
    br.measurement.name = spec.name;
    br.measurement.where = spec.where;
    set_bar_current(br.measurement, spec.current, sf, parent.system, lattice, metric);
    set_bar_field(br.measurement, spec.field, sf, parent.system, lattice, metric);
    br.measurement.waveform = parse_waveform(spec.waveform, spec.where, spec.bad_value);
    br.measurement.current_rms = spec.current_rms;
    br.measurement.length = spec.length;
    br.measurement.width = spec.width;
    br.measurement.thickness = spec.thickness;
    for (const auto& id : spec.responses) responses.get(id); // unknown ids fail here, with the closest ids
    for (std::size_t k = 0; k < res.parts.size(); ++k) {
      const PartForms& p = res.parts[k];
      if (!p.catalogue_part || !is_bar_part(*p.catalogue_part)) continue;
      if (!spec.responses.empty() &&
          std::find_if(spec.responses.begin(), spec.responses.end(), [&](const std::string& id) {
            return responses.get(id).id == p.response_id;
          }) == spec.responses.end())
        continue;
      br.signals.push_back({k, bar_signal(*p.catalogue_part, p.forms.back(), br.measurement), {}});
      for (const auto& d : res.domains) {
        if (d.part != k) continue;
        auto& averaged = br.signals.back().domain_averaged;
        averaged.push_back({"", d.form, bar_signal(*p.catalogue_part, with_values(d.form, d.analysis.average, d.form),
                                                   br.measurement)});
        if (p.evaluated_in) continue; // an expansion in the field meets it through the bar, not through the lowering
        for (const auto& t : d.in_field)
          averaged.push_back({t.field.label, t.form,
                              bar_signal(*p.catalogue_part, with_values(d.form, t.average, t.form), br.measurement)});
      }
    }
    for (std::size_t k = 0; k < res.parts.size(); ++k) {
      const PartForms& p = res.parts[k];
      if (p.catalogue_part && is_bar_part(*p.catalogue_part)) continue;
      if (!spec.responses.empty() &&
          std::none_of(spec.responses.begin(), spec.responses.end(), [&](const std::string& id) {
            return !p.response_id.empty() && responses.get(id).id == p.response_id;
          }))
        continue;
      br.unread.push_back({k, unread_reason(p)});
    }
    br.sum = probe_sum(probe_sum_inputs(res, spec.responses), br.measurement);
    br.separations = bar_separations(br.signals);
    res.bars.push_back(std::move(br));
  }

  for (const auto& spec : sc.layouts) {
    LayoutResult lr;
    lr.spec = spec;
    std::vector<LayoutCandidate> candidates =
        layout_candidates(spec.directions, spec.rosette, sf, parent.system, lattice, metric, spec.where);
    if (candidates.empty())
      fail(ErrorKind::bad_geometry, "no bar direction to choose from", spec.where,
           "in-plane directions or rosette angles");
    PlanGeometry geometry{&sf, parent.system, lattice, metric, Waveform::sine};
    lr.plan = design_plan(probe_sum_inputs(res, {}), spec.harmonic, candidates, spec.fields, geometry);
    if (spec.response.empty()) {
      res.layouts.push_back(std::move(lr));
      continue;
    }
    const Response& r = responses.get(spec.response);
    for (std::size_t k = 0; k < res.parts.size(); ++k) {
      const PartForms& p = res.parts[k];
      if (p.response_id != r.id || !p.catalogue_part || !is_bar_part(*p.catalogue_part)) continue;
      int order = p.catalogue_part->harmonic;
      bool at_harmonic = spec.harmonic <= order && (order - spec.harmonic) % 2 == 0;
      if (!at_harmonic || p.counts.back() == 0) continue;
      lr.parts.push_back(k);
      lr.designs.push_back(design_layout(*p.catalogue_part, p.forms.back(), candidates, spec.fields, sf,
                                         parent.system, lattice, metric));
    }
    if (std::find(sc.responses.begin(), sc.responses.end(), spec.response) == sc.responses.end() &&
        std::none_of(res.parts.begin(), res.parts.end(), [&](const PartForms& p) { return p.response_id == r.id; }))
      fail(spec.bad_value, "the layout asks for " + r.id + ", which is not among the scenario's responses",
           spec.where, "add it to responses = [...]");
    res.layouts.push_back(std::move(lr));
  }
  for (const auto& spec : sc.shg) res.shg.push_back(run_shg(spec, res, responses));
  for (const auto& spec : sc.kerr) res.kerr.push_back(run_kerr(spec, res, lattice));
  for (const auto& spec : sc.pump_probe) res.pump_probe.push_back(run_pump_probe(spec, res));
  for (const auto& spec : sc.photocurrents) res.photocurrents.push_back(run_photocurrent(spec, res));
  return res;
}

PointGroup apply_lowering_step(const PointGroup& g, const LoweringStep& s, const std::string& system,
                               const LatticeMetric& m) {
  std::string ignored;
  return lower(g, s, system, m, &ignored);
}

Vec3 lowering_direction(const std::string& text, const std::string& system, LatticeKind lattice,
                        const LatticeMetric& m, const std::string& where) {
  return step_direction(text, system, lattice, m, where);
}

std::string lowering_step_label(const LoweringStep& s) { return step_label(s); }

const char* planar_reading_text(PlanarReading r) {
  switch (r) {
  case PlanarReading::readable: return "allowed, read by a planar bar";
  case PlanarReading::not_readable: return "allowed, not readable in a planar bar";
  case PlanarReading::forbidden: return "forbidden";
  case PlanarReading::not_a_bar_part: return "";
  }
  return "";
}

} // namespace ts
