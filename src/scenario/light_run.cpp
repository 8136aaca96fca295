#include "scenario/light_run.hpp"

#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "tensor/tensor_spec.hpp"

#include <algorithm>

namespace ts {

namespace {

const char* axis_names[] = {"x", "y", "z"};

VectorTerms vector_terms(const std::array<SignalSeries, 3>& v) {
  return {real_fourier_terms(v[0]), real_fourier_terms(v[1]), real_fourier_terms(v[2])};
}

std::string part_title(const PartForms& p) { return p.response_id + ": " + p.part_label; }

// The order vector of a phase in the sample frame: a crystal direction along
// one sample axis, or the direction of the phase's last moment step.
void place_order(PumpPhase& ph, const PumpPhaseSpec& spec, const ScenarioResult& res, const PointGroup& group,
                 Vec3* order) {
  std::string text = spec.order;
  if (text.empty()) {
    for (auto it = spec.steps.rbegin(); it != spec.steps.rend() && text.empty(); ++it)
      if (it->kind == LoweringKind::moment) text = it->along;
    for (auto it = res.scenario.steps.rbegin(); it != res.scenario.steps.rend() && text.empty(); ++it)
      if (it->kind == LoweringKind::moment) text = it->along;
  }
  if (text.empty())
    fail(ErrorKind::bad_geometry, "the phase '" + ph.label + "' names no order vector", spec.where,
         "order = \"[100]\" (the Néel vector or moment the pump turns), or a moment lowering step");
  *order = lowering_direction(text, res.system, group.lattice(), res.metric, spec.where);
  for (int i = 0; i < 3; ++i) {
    const Vec3& axis = res.frame.axes[static_cast<std::size_t>(i)];
    if (!parallel(*order, axis)) continue;
    ph.order_axis = i;
    ph.order_sign = dot(*order, axis).sign() > 0 ? 1 : -1;
    ph.order_label = text + " = " + (ph.order_sign > 0 ? "+" : "-") + axis_names[i];
    int k = 0;
    for (int j = 0; j < 3; ++j)
      if (j != i) ph.deviation_axes[static_cast<std::size_t>(k++)] = j;
    return;
  }
  fail(ErrorKind::bad_geometry, "the order vector " + text + " of the phase '" + ph.label + "' is not along a sample axis",
       spec.where, "a direction along sample x, y or z (" + res.frame.labels[0] + ", " + res.frame.labels[1] + ", " +
                       res.frame.labels[2] + ")");
}

// (l0 × H)·e_b for the order vector s·e_a: ε_bac s H_c.
SignalSeries torque_along(const std::array<SignalSeries, 3>& h, int a, int sign, int b) {
  SignalSeries out;
  const int c = 3 - a - b;
  // ε_bac = +1 for (b, a, c) an even permutation of (0, 1, 2).
  const bool even = (b == 0 && a == 1) || (b == 1 && a == 2) || (b == 2 && a == 0);
  out.add(h[static_cast<std::size_t>(c)], Rational(even ? sign : -sign));
  return out;
}

PumpPhase run_phase(const PumpProbeSpec& spec, const PumpPhaseSpec& phase_spec, const PumpSetup& setup,
                    const ScenarioResult& res) {
  PumpPhase ph;
  ph.label = phase_spec.label;
  ph.where = phase_spec.where;
  PointGroup group = res.chain.back().group;
  for (const auto& s : phase_spec.steps) group = apply_lowering_step(group, s, res.system, res.metric);
  const Identification id = identify(group, GroupCatalogue::builtin());
  const std::string sample = sample_symbol(group, id, res.frame);
  ph.group = readable_symbol(group, id, sample);
  std::vector<const ResponsePart*> parts;
  bool asked = false;
  for (const auto& p : res.parts) {
    if (!p.catalogue_part || !is_pump_part(*p.catalogue_part) || p.catalogue_part->indices[0] != "H") continue;
    asked = true;
    AllowedForm form = allowed_form(p.spec, group, res.frame);
    if (form.independent() == 0) continue; // forbidden in the phase: it drives nothing
    parts.push_back(p.catalogue_part);
    ph.part_titles.push_back(part_title(p));
    ph.helicity_odd.push_back(is_helicity_part(*p.catalogue_part));
    ph.forms.push_back(std::move(form));
  }
  if (!asked)
    fail(spec.bad_value, "the pump-probe question '" + spec.name + "' finds no effective-field part among the responses",
         spec.where, "add inverse-faraday to responses");
  Vec3 order{};
  place_order(ph, phase_spec, res, group, &order);
  const PointGroup twisted = order_parameter_group(group, order, phase_spec.where);
  ph.k_order = allowed_form(parse_tensor_spec("K_ab: polar, time-odd"), twisted, res.frame);
  ph.k_moment = allowed_form(parse_tensor_spec("K_ab: polar, time-even"), group, res.frame);

  for (const auto& pol : setup.polarisations) {
    const PumpField field = pump_field(setup, pol);
    PumpDrive d;
    d.polarisation = pol.name;
    for (std::size_t k = 0; k < parts.size(); ++k) {
      const std::array<SignalSeries, 3> h = pump_response(*parts[k], ph.forms[k], field);
      d.field.push_back(vector_terms(h));
      std::array<std::vector<FourierTerm>, 2> tq;
      for (int u = 0; u < 2; ++u) {
        tq[static_cast<std::size_t>(u)] =
            real_fourier_terms(torque_along(h, ph.order_axis, ph.order_sign, ph.deviation_axes[static_cast<std::size_t>(u)]));
        d.drives[static_cast<std::size_t>(u)] = d.drives[static_cast<std::size_t>(u)] || !tq[static_cast<std::size_t>(u)].empty();
      }
      d.torque.push_back(tq);
    }
    ph.drives.push_back(std::move(d));
  }

  const std::array<TrigVector, 3> lab = pump_lab_axes(setup);
  const std::pair<const char*, const char*> probes[] = {
      {"Faraday (transmission along n)", "n·g"},
      {"polar Kerr", "n·g"},
      {"longitudinal Kerr", "p·g, p in the plane of incidence"},
      {"transverse Kerr", "(n × p)·g, as a change of the P reflectance"}};
  const int vector_of[] = {0, 0, 1, 2};
  for (int k = 0; k < 4; ++k) {
    ProbeView v;
    v.probe = probes[k].first;
    v.reads = probes[k].second;
    const TrigVector& w = lab[static_cast<std::size_t>(vector_of[k])];
    for (int u = 0; u < 2; ++u) {
      // δl along u comes with the dynamic moment l0 × δl, along the other deviation axis.
      const int axis = ph.deviation_axes[static_cast<std::size_t>(u)], other = ph.deviation_axes[static_cast<std::size_t>(1 - u)];
      v.order[static_cast<std::size_t>(u)] = !probe_reading(ph.k_order, w, axis).is_zero();
      v.moment[static_cast<std::size_t>(u)] = !probe_reading(ph.k_moment, w, other).is_zero();
    }
    for (const auto& d : ph.drives) {
      bool sees = false;
      for (std::size_t u = 0; u < 2; ++u) sees = sees || (d.drives[u] && (v.order[u] || v.moment[u]));
      v.sees.push_back(sees);
    }
    ph.probes.push_back(std::move(v));
  }
  return ph;
}

} // namespace

PumpProbeResult run_pump_probe(const PumpProbeSpec& spec, const ScenarioResult& res) {
  PumpProbeResult out;
  out.setup = make_pump_setup(spec.name, spec.incidence, spec.azimuth, spec.polarisations, spec.where, spec.bad_value);
  std::vector<PumpPhaseSpec> phases = spec.phases;
  if (phases.empty()) {
    PumpPhaseSpec last;
    last.label = res.chain.back().label;
    last.where = spec.where;
    phases.push_back(last);
  }
  for (const auto& p : phases) out.phases.push_back(run_phase(spec, p, out.setup, res));
  return out;
}

PhotocurrentResult run_photocurrent(const PhotocurrentSpec& spec, const ScenarioResult& res) {
  PhotocurrentResult out;
  out.setup = make_pump_setup(spec.name, spec.incidence, spec.azimuth, spec.polarisations, spec.where, spec.bad_value);
  bool asked = false;
  for (std::size_t k = 0; k < res.parts.size(); ++k) {
    const PartForms& p = res.parts[k];
    if (!p.catalogue_part || !is_pump_part(*p.catalogue_part) || p.catalogue_part->indices[0] != "j") continue;
    asked = true;
    if (p.forms.back().independent() == 0) continue; // forbidden in the final group: no current
    out.parts.push_back(k);
    out.helicity_odd.push_back(is_helicity_part(*p.catalogue_part));
  }
  if (!asked)
    fail(spec.bad_value, "the photocurrent question '" + spec.name + "' finds no photocurrent part among the responses",
         spec.where, "add photogalvanic to responses");
  for (const auto& pol : out.setup.polarisations) {
    const PumpField field = pump_field(out.setup, pol);
    PhotocurrentRow row;
    row.polarisation = pol.name;
    for (std::size_t k = 0; k < out.parts.size(); ++k) {
      const PartForms& p = res.parts[out.parts[k]];
      const VectorTerms j = vector_terms(pump_response(*p.catalogue_part, p.forms.back(), field));
      for (std::size_t a = 0; a < 2; ++a) {
        row.pair_reads[a] = row.pair_reads[a] || !j[a].empty();
        if (out.helicity_odd[k]) row.odd_pair_reads[a] = row.odd_pair_reads[a] || !j[a].empty();
      }
      row.current.push_back(j);
    }
    out.rows.push_back(std::move(row));
  }
  return out;
}

} // namespace ts
