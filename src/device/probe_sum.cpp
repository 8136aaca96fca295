#include "device/probe_sum.hpp"

#include "device/surd_echelon.hpp"

#include <algorithm>
#include <map>
#include <set>
#include <tuple>

namespace ts {

const char* parity_text(Parity p) {
  switch (p) {
  case Parity::even: return "even";
  case Parity::odd: return "odd";
  case Parity::only_together: return "odd with B and M together";
  }
  return "";
}

const char* quadrature_text(Quadrature q) {
  switch (q) {
  case Quadrature::x: return "X";
  case Quadrature::y: return "Y";
  case Quadrature::both: return "X and Y";
  }
  return "";
}

const char* handle_text(Handle h) {
  switch (h) {
  case Handle::field_reversal: return "field reversal";
  case Handle::magnetisation_reversal: return "magnetisation reversal";
  case Handle::bar_angle: return "bar angle harmonic";
  case Handle::field_angle: return "field angle harmonic";
  case Handle::other_probe: return "the other probe (Hall test)";
  case Handle::current_scaling: return "current scaling";
  case Handle::none: return "indistinguishable by symmetry";
  }
  return "";
}

void set_parities(SumMechanism& m, const TimeOddSources& sources) {
  const auto& ix = m.signal.part->indices;
  m.field_order = static_cast<int>(std::count(ix.begin() + 1, ix.end(), "B"));
  m.magnetisation_order = static_cast<int>(std::count(ix.begin() + 1, ix.end(), "M"));
  m.onsager_form = !m.signal.part->spec.onsager.empty();
  m.c_type = m.signal.part->spec.time_odd && !m.onsager_form;
  m.thermal = std::find(ix.begin(), ix.end(), "joule") != ix.end();
  m.field_driven = m.signal.part->drive == DriveKind::field;
  auto power = [](int p) { return p % 2 ? Parity::odd : Parity::even; };
  auto flip = [](Parity p) { return p == Parity::odd ? Parity::even : Parity::odd; };
  m.field_parity = power(m.field_order);
  m.magnetisation_parity = power(m.magnetisation_order);
  if (!m.c_type) return;
  // A c-type coefficient is odd in the time-odd quantity that allowed it.
  if (sources.field && sources.magnetisation) {
    m.field_parity = m.magnetisation_parity = Parity::only_together;
  } else if (sources.field) {
    m.field_parity = flip(m.field_parity);
  } else {
    m.magnetisation_parity = flip(m.magnetisation_parity);
  }
}

FunctionSpace function_space(const std::vector<FourierTerm>& terms) {
  FunctionSpace fs;
  std::map<int, std::size_t> row_of; // parameter -> vector
  std::vector<int> params;
  for (const auto& t : terms) {
    fs.basis.emplace_back(t.k, t.sine);
    for (const auto& lt : t.coefficient)
      if (!row_of.count(lt.parameter)) {
        row_of[lt.parameter] = params.size();
        params.push_back(lt.parameter);
      }
  }
  fs.vectors.assign(params.size(), std::vector<Surd>(terms.size()));
  for (std::size_t b = 0; b < terms.size(); ++b)
    for (const auto& lt : terms[b].coefficient) fs.vectors[row_of[lt.parameter]][b] = lt.coefficient;
  return fs;
}

namespace {

// Both spaces written over the union of their basis functions.
std::pair<std::vector<SurdRow>, std::vector<SurdRow>> on_common_basis(const FunctionSpace& a, const FunctionSpace& b,
                                                                    int* columns) {
  std::vector<std::pair<Frequency, bool>> basis = a.basis;
  for (const auto& f : b.basis)
    if (std::find(basis.begin(), basis.end(), f) == basis.end()) basis.push_back(f);
  *columns = static_cast<int>(basis.size());
  auto lift = [&](const FunctionSpace& s) {
    std::vector<SurdRow> out;
    for (const auto& v : s.vectors) {
      SurdRow row(basis.size());
      for (std::size_t i = 0; i < s.basis.size(); ++i)
        row[std::find(basis.begin(), basis.end(), s.basis[i]) - basis.begin()] = v[i];
      out.push_back(std::move(row));
    }
    return out;
  };
  return {lift(a), lift(b)};
}

std::set<std::pair<int, bool>> bar_harmonics(const std::vector<FourierTerm>& terms) {
  std::set<std::pair<int, bool>> out;
  for (const auto& t : terms) out.insert({t.k[static_cast<int>(Angle::phi)], t.sine});
  return out;
}

// The signals of a mechanism on both probes as rows over a common basis of
// (probe, frequency, sine) functions, one row per parameter.
std::vector<SurdRow> both_probe_rows(const PartSignal& s, std::vector<std::tuple<int, Frequency, bool>>& basis) {
  std::map<int, std::map<std::tuple<int, Frequency, bool>, Surd>> by_param;
  for (const ProbeSignal* p : {&s.longitudinal, &s.transverse})
    for (const auto& t : p->terms) {
      const auto key = std::make_tuple(static_cast<int>(p->probe), t.k, t.sine);
      if (std::find(basis.begin(), basis.end(), key) == basis.end()) basis.push_back(key);
      for (const auto& lt : t.coefficient) by_param[lt.parameter][key] = lt.coefficient;
    }
  std::vector<SurdRow> rows;
  for (const auto& [param, entries] : by_param) {
    SurdRow row;
    for (const auto& [key, value] : entries) {
      const std::size_t at = std::find(basis.begin(), basis.end(), key) - basis.begin();
      if (row.size() <= at) row.resize(at + 1);
      row[at] = value;
    }
    rows.push_back(std::move(row));
  }
  return rows;
}

bool separated_by_both_probes(const SumMechanism& a, const SumMechanism& b) {
  std::vector<std::tuple<int, Frequency, bool>> basis;
  std::vector<SurdRow> ra = both_probe_rows(a.signal, basis), rb = both_probe_rows(b.signal, basis);
  for (auto* rows : {&ra, &rb})
    for (auto& r : *rows) r.resize(basis.size());
  const int cols = static_cast<int>(basis.size());
  std::vector<SurdRow> all = ra;
  all.insert(all.end(), rb.begin(), rb.end());
  return surd_rank(all, cols) == surd_rank(ra, cols) + surd_rank(rb, cols);
}

bool is_nonlinear_conductivity(const SumMechanism& m) {
  return m.current_order == 2 && m.field_order == 0 && m.magnetisation_order == 0 && !m.thermal;
}

std::string non_symmetry_handle(const SumMechanism& a, const SumMechanism& b) {
  if (a.thermal || b.thermal)
    return "drive frequency and the thermal path: a thermal voltage rolls off above the inverse thermal time of film "
           "and substrate and scales with the substrate's heat conductance (Avci et al., PRB 90, 224427 (2014), "
           "title checked)";
  if (is_nonlinear_conductivity(a) && is_nonlinear_conductivity(b) && !a.c_type && !b.c_type)
    return "scaling with the longitudinal conductivity σ_xx (or with temperature): a Berry-curvature dipole and "
           "skew or side-jump scattering enter with different powers of the relaxation time (Du et al., Nat. "
           "Commun. 10, 3047 (2019); Kang et al., Nat. Mater. 18, 324 (2019), both title checked)";
  if (is_nonlinear_conductivity(a) && is_nonlinear_conductivity(b) && a.c_type && b.c_type)
    return "scaling with σ_xx: the intrinsic term goes as τ⁰ and the nonlinear Drude term as τ² (Watanabe & "
           "Yanase, Phys. Rev. Research 2, 043081 (2020), title checked)";
  if (a.magnetisation_order > 0 && b.magnetisation_order > 0)
    return "the strength of the applied field: in the macrospin model a torque term goes as 1/(H - H_k) or 1/H "
           "while a magnetoresistive term saturates with m (Hayashi et al., PRB 89, 144425 (2014), title checked)";
  return "scaling with σ_xx, temperature, film thickness or field strength (common practice)";
}

Separation separate(const std::vector<SumMechanism>& ms, std::size_t ia, std::size_t ib, const SumTerm& ta,
                    const SumTerm& tb, bool rotating) {
  const SumMechanism &a = ms[ia], &b = ms[ib];
  Separation s;
  s.a = ia;
  s.b = ib;
  auto definite = [](Parity p) { return p != Parity::only_together; };
  s.same_parities = a.field_parity == b.field_parity && a.magnetisation_parity == b.magnetisation_parity;
  int cols = 0;
  auto [ra, rb] = on_common_basis(function_space(ta.terms), function_space(tb.terms), &cols);
  const int rank_a = surd_rank(ra, cols), rank_b = surd_rank(rb, cols);
  std::vector<SurdRow> both = ra;
  both.insert(both.end(), rb.begin(), rb.end());
  const int rank_ab = surd_rank(both, cols);
  s.same_angle_functions = rank_a == rank_ab && rank_b == rank_ab;
  const bool angles_separate = rank_ab == rank_a + rank_b;
  if (definite(a.field_parity) && definite(b.field_parity) && a.field_parity != b.field_parity) {
    s.handle = Handle::field_reversal;
    s.detail = std::string(parity_text(a.field_parity)) + " vs " + parity_text(b.field_parity) + " in B";
  } else if (definite(a.magnetisation_parity) && definite(b.magnetisation_parity) &&
             a.magnetisation_parity != b.magnetisation_parity) {
    s.handle = Handle::magnetisation_reversal;
    s.detail = std::string(parity_text(a.magnetisation_parity)) + " vs " + parity_text(b.magnetisation_parity) + " in M";
  } else if (angles_separate) {
    const bool by_bar = rotating && bar_harmonics(ta.terms) != bar_harmonics(tb.terms);
    s.handle = by_bar ? Handle::bar_angle : Handle::field_angle;
    s.detail = "their angle functions share no combination";
  } else if (separated_by_both_probes(a, b)) {
    s.handle = Handle::other_probe;
    s.detail = "together with the other probe's reading their angle functions share no combination";
  } else if (a.current_order != b.current_order) {
    s.handle = Handle::current_scaling;
    s.detail = "I^" + std::to_string(a.current_order) + " vs I^" + std::to_string(b.current_order);
  } else {
    s.handle = Handle::none;
    s.angles_overlap_partly = !s.same_angle_functions;
    s.detail = s.same_angle_functions ? "same parities and the same angle functions"
                                      : "same parities; their angle functions overlap, so angles separate them only in part";
    s.other_handle = non_symmetry_handle(a, b);
  }
  return s;
}

} // namespace

ProbeSum probe_sum(const std::vector<SumInput>& inputs, const BarMeasurement& bar) {
  ProbeSum out;
  bool any_b = false, any_m = false;
  for (const auto& in : inputs) {
    const ResponsePart& part = *in.catalogue_part;
    const std::string label = in.response_id + ": " + part.label;
    if (!part.summed || !is_bar_part(part)) continue;
    if (in.form->independent() == 0) continue;
    SumMechanism m;
    m.part = in.part;
    m.background = in.background;
    m.response_id = in.response_id;
    m.label = label;
    m.mechanism = part.mechanism;
    m.signal = bar_signal(part, *in.form, bar);
    m.current_order = m.signal.current_order;
    set_parities(m, in.sources);
    if (m.signal.needs_field) {
      out.silent.push_back(label + ": needs a field (or magnetisation) direction in the bar");
      continue;
    }
    if (!m.signal.reads()) {
      out.silent.push_back(label + ": allowed, but both probes of this bar read zero");
      continue;
    }
    any_b = any_b || m.field_order > 0;
    any_m = any_m || m.magnetisation_order > 0;
    out.mechanisms.push_back(std::move(m));
  }
  out.magnetisation_follows_field = any_b && any_m;
  std::set<int> harmonics;
  for (const auto& m : out.mechanisms)
    for (const auto& h : m.signal.harmonics) harmonics.insert(h.harmonic);
  for (auto it = harmonics.rbegin(); it != harmonics.rend(); ++it)
    for (Probe probe : {Probe::longitudinal, Probe::transverse}) {
      const int k = *it;
      ProbeReading r;
      r.probe = probe;
      r.harmonic = k;
      for (std::size_t i = 0; i < out.mechanisms.size(); ++i) {
        const SumMechanism& m = out.mechanisms[i];
        const ProbeSignal& ps = probe == Probe::longitudinal ? m.signal.longitudinal : m.signal.transverse;
        if (!ps.reads()) continue;
        for (const auto& h : m.signal.harmonics) {
          if (h.harmonic != k || (h.x.is_zero() && h.y.is_zero())) continue;
          SumTerm t;
          t.mechanism = i;
          t.x = h.x;
          t.y = h.y;
          t.quadrature = h.y.is_zero() ? Quadrature::x : h.x.is_zero() ? Quadrature::y : Quadrature::both;
          t.terms = ps.terms;
          r.terms.push_back(std::move(t));
        }
      }
      if (r.terms.empty()) continue;
      if (k == 0) {
        // Even powers of I give DC beside their 2ω, 4ω...: when every DC term has a
        // reading at another harmonic with the same mechanisms, that reading says it.
        bool merged = false;
        for (auto& other : out.readings) {
          if (other.probe != probe || other.harmonic == 0 || other.terms.size() != r.terms.size()) continue;
          bool same = true;
          for (std::size_t i = 0; i < r.terms.size(); ++i) same = same && other.terms[i].mechanism == r.terms[i].mechanism;
          if (!same) continue;
          other.with_dc = true;
          for (std::size_t i = 0; i < r.terms.size(); ++i) other.terms[i].dc = r.terms[i].x;
          merged = true;
          break;
        }
        if (merged) continue;
      }
      for (std::size_t a = 0; a < r.terms.size(); ++a)
        for (std::size_t b = a + 1; b < r.terms.size(); ++b)
          r.separations.push_back(
              separate(out.mechanisms, r.terms[a].mechanism, r.terms[b].mechanism, r.terms[a], r.terms[b], bar.rotating));
      out.readings.push_back(std::move(r));
    }
  // People read the harmonics upwards: DC (if alone), 1ω, 2ω, ...
  std::stable_sort(out.readings.begin(), out.readings.end(),
                   [](const ProbeReading& a, const ProbeReading& b) { return a.harmonic < b.harmonic; });
  return out;
}

} // namespace ts
