#include "scenario/observation_run.hpp"

#include "core/error.hpp"
#include "core/text.hpp"
#include "geometry/signal_observation.hpp"
#include "response/response_catalogue.hpp"

namespace ts {

namespace {

struct Target {
  std::string what;
  TensorSpec spec;
  const ResponsePart* part = nullptr; // null for a tensor spec
};

Target observed_tensor(const ObservationRequest& o, TimeParity parity) {
  if (!o.tensor.empty()) return {"tensor " + o.tensor, parse_tensor_spec(o.tensor)};
  const Response& r = ResponseCatalogue::builtin().get(o.response);
  std::string parts;
  for (std::size_t i = 0; i < r.parts.size(); ++i)
    parts += (i ? ", " : "") + std::to_string(i + 1) + " = " + r.parts[i].label + " (" + r.parts[i].spec.name + ")";
  const ResponsePart* chosen = nullptr;
  if (!o.part.empty()) {
    // At most 9 digits: a longer number is no part, and would not fit the conversion.
    const bool number = o.part.size() <= 9 && o.part.find_first_not_of("0123456789") == std::string::npos;
    const std::size_t k = number ? std::stoul(o.part) : 0;
    if (k < 1 || k > r.parts.size())
      fail(ErrorKind::usage, r.id + " has no part " + o.part, o.where, "a part number: " + parts);
    chosen = &r.parts[k - 1];
  } else {
    // The part whose tensor carries the name the components are written with.
    const std::string& first = o.components.empty() ? std::string() : o.components.front();
    std::string prefix = first.substr(0, first.find('_'));
    // Of parts with that name, the one of the asked time parity (a response may list both).
    const bool want_odd = parity == TimeParity::c_type;
    const bool any_parity = parity == TimeParity::either;
    for (const auto& p : r.parts)
      if (first.find('_') != std::string::npos && p.spec.name == prefix &&
          (!chosen || (!any_parity && chosen->spec.time_odd != want_odd && p.spec.time_odd == want_odd)))
        chosen = &p;
    if (!chosen && r.parts.size() == 1) chosen = &r.parts.front();
    if (!chosen)
      fail(ErrorKind::usage, "cannot tell which part of " + r.id + " the components '" + first + "' belong to", o.where,
           "components named after a part's tensor, or a part number (part = N, --part N; a bar signal needs it): " + parts);
  }
  return {r.name + " [" + r.id + "]: " + chosen->label, chosen->spec, chosen};
}

// The label of ±v whose first nonzero index is positive: d and -d have the same
// stabiliser, and a plane normal has no sign, so reports do not depend on which came out.
std::string unsigned_label(const Vec3& v, LatticeKind lattice, const LatticeMetric& m) {
  std::string label = lattice_direction_label(v, lattice, m);
  std::size_t first = label.find_first_of("123456789");
  if (first != std::string::npos && first > 0 && label[first - 1] == '-') return lattice_direction_label(-v, lattice, m);
  return label;
}

std::string direction_words(const Producer& p, LatticeKind lattice, const LatticeMetric& m) {
  if (p.free_dimensions == 1) return "∥ " + unsigned_label(p.direction, lattice, m);
  if (p.free_dimensions == 2)
    return "along a general direction in the plane ⊥ " + unsigned_label(p.plane_normal, lattice, m) + " (e.g. " +
           unsigned_label(p.direction, lattice, m) + ")";
  return "along a general direction (e.g. " + unsigned_label(p.direction, lattice, m) + ")";
}

// "e_xx = e_yy, e_zz, e_xy = -e_xz (sample frame)": components equal to ± one
// parameter, grouped by parameter; anything else is left to `form`.
std::string strain_form_words(const AllowedForm& f) {
  std::vector<std::string> groups(f.independent());
  bool other = false;
  for (int r = 0; r < f.symmetry->size(); ++r) {
    const auto& v = f.components[r];
    if (v.empty()) continue;
    const bool plus = v.size() == 1 && v[0].coefficient == Surd(Rational(1));
    const bool minus = v.size() == 1 && v[0].coefficient == Surd(Rational(-1));
    if (!plus && !minus) {
      other = true;
      continue;
    }
    std::string& g = groups[v[0].parameter];
    g += (g.empty() ? "" : minus ? " = -" : " = ") + f.component_name(f.symmetry->rep_code(r));
  }
  std::vector<std::string> shown;
  for (const auto& g : groups)
    if (!g.empty()) shown.push_back(g);
  return join(shown, ", ") + (other ? " and further components (see `tensorsieve form`)" : "") + " (sample frame)";
}

} // namespace

std::string producer_words(const Producer& p, const PointGroup& h, const Frame& frame, LatticeKind lattice,
                           const LatticeMetric& m) {
  switch (p.kind) {
  case QuantityKind::polar_even: return "polar displacement (or electric field) " + direction_words(p, lattice, m);
  case QuantityKind::axial_odd: return "magnetisation (or magnetic field) " + direction_words(p, lattice, m);
  case QuantityKind::polar_odd: return "current " + direction_words(p, lattice, m);
  case QuantityKind::axial_even:
    return "axial time-even vector (a rotation of rigid units) " + direction_words(p, lattice, m);
  case QuantityKind::strain: {
    return "strain or shear of the form " + strain_form_words(allowed_form(parse_tensor_spec("e_ab: sym(ab)"), h, frame));
  }
  case QuantityKind::line: break;
  }
  return "";
}

void answer_observation(const PointGroup& parent, const Frame& frame, const LatticeMetric& metric,
                        const Observation& observation, ObservationAnswer& a) {
  const LatticeKind lattice = parent.lattice();
  const auto& cat = GroupCatalogue::builtin();
  a.search = find_minimal_breaking(parent, observation);
  if (a.search.allowed_in_parent && observation.readings_in) a.parent_versions = observation.readings_in(parent);
  for (const auto& m : a.search.maximal) {
    ObservationSolution s;
    s.breaking = m;
    s.id = identify(m.group, cat);
    s.sample_symbol = sample_symbol(m.group, s.id, frame);
    s.readable_symbol = readable_symbol(m.group, s.id, s.sample_symbol, true);
    for (const auto& op : m.group.operations()) s.operations.push_back(op.symbol(lattice));
    for (const auto& p : m.producers) s.producers.push_back(producer_words(p, m.group, frame, lattice, metric));
    if (observation.readings_in) s.versions = observation.readings_in(m.group);
    a.solutions.push_back(std::move(s));
  }
}

ObservationRun run_observations(const Scenario& sc) {
  if (sc.observations.empty())
    fail(ErrorKind::usage, "no observation given", sc.source,
         "--component chi_xxx with --response or --tensor, or an [[observation]] table (docs/scenarios.md)");
  ObservationRun run;
  run.scenario = run_scenario(sc);
  const ScenarioResult& res = run.scenario;
  const PointGroup& parent = res.chain.back().group;
  for (const auto& o : sc.observations) {
    ObservationAnswer a;
    a.request = o;
    a.parity = parse_time_parity(o.parity, o.where);
    Target t = observed_tensor(o, a.parity);
    a.what = t.what;
    a.spec = t.spec;
    if (o.match != "any" && o.match != "all")
      fail(ErrorKind::usage, "match '" + o.match + "' is neither any nor all", o.where,
           "any (at least one component nonzero) or all (each of them)");
    if (!o.signal.empty()) {
      if (!t.part || !is_bar_part(*t.part))
        fail(ErrorKind::usage, a.what + " is not read by a Hall bar", o.where,
             "a transport response (conductivity, second-order-conductivity, ...) for a bar signal");
      SignalObservation so;
      so.part = *t.part;
      so.parity = a.parity;
      so.frame = res.frame;
      parse_signal_observation(o.signal, so, o.where);
      BarSpec bs = parse_bar_option(o.bar, o.where + ": bar");
      so.bar.where = bs.where;
      set_bar_current(so.bar, bs.current, res.sample, res.system, parent.lattice(), res.metric);
      set_bar_field(so.bar, bs.field, res.sample, res.system, parent.lattice(), res.metric);
      a.components = {o.signal + " (bar: current " + so.bar.current_label + ", field " + so.bar.field_label + ")"};
      answer_observation(parent, res.frame, res.metric, observation_of(so), a);
      run.answers.push_back(std::move(a));
      continue;
    }
    ComponentObservation c{t.spec, {}, component_codes(t.spec, o.components, o.where), a.parity, o.match == "all",
                           res.frame};
    AllowedForm names = allowed_form(t.spec, PointGroup());
    for (int code : c.codes) c.names.push_back(names.component_name(code));
    a.components = c.names;
    answer_observation(parent, res.frame, sc.metric, observation_of(c), a);
    run.answers.push_back(std::move(a));
  }
  return run;
}

} // namespace ts
