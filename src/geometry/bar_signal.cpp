#include "geometry/bar_signal.hpp"

#include "core/error.hpp"
#include "geometry/component_contraction.hpp"

#include <algorithm>
#include <map>
#include <mutex>
#include <utility>

namespace ts {

const char* probe_name(Probe p) { return p == Probe::longitudinal ? "longitudinal (∥)" : "transverse (⊥)"; }

bool is_bar_part(const ResponsePart& part) { return part.drive != DriveKind::none; }

namespace {

std::vector<HarmonicFactor> expand_lock_in_factors(int n, Waveform w) {
  // I(t)^n = (√2 I_rms)^n s(ωt)^n with s = sin or cos, expanded exactly.
  TrigPoly s = w == Waveform::sine ? TrigPoly::sin_of(Angle::drive) : TrigPoly::cos_of(Angle::drive);
  TrigPoly p = TrigPoly::constant(Rational(1));
  Surd amp = Rational(1);
  const Surd r2 = Surd::sqrt_of(Rational(2));
  for (int i = 0; i < n; ++i) {
    p = p * s;
    amp = amp * r2;
  }
  SignalSeries series;
  series.add_term(0, amp, p);
  std::vector<HarmonicFactor> out;
  const Surd inv_r2 = Surd::sqrt_of(Rational(1, 2));
  for (int k = n; k >= 0; k -= 2) {
    HarmonicFactor h;
    h.harmonic = k;
    Surd a, b; // V_k(t) = a cos kωt + b sin kωt (per R_n I_rms^n)
    for (const auto& t : real_fourier_terms(series.at_drive_harmonic(k)))
      for (const auto& lt : t.coefficient) (t.sine ? b : a) += lt.coefficient;
    if (k == 0) {
      h.x = a;
    } else if (w == Waveform::sine) {
      // Reference sin kωt: V = √2 V_rms sin(kωt + θ), X = V_rms cos θ, Y = V_rms sin θ.
      h.x = b * inv_r2;
      h.y = a * inv_r2;
    } else {
      // Reference cos kωt: V = √2 V_rms cos(kωt + θ).
      h.x = a * inv_r2;
      h.y = -(b * inv_r2);
    }
    out.push_back(h);
  }
  std::sort(out.begin(), out.end(), [](const HarmonicFactor& x, const HarmonicFactor& y) { return x.harmonic < y.harmonic; });
  return out;
}

} // namespace

std::vector<HarmonicFactor> lock_in_factors(int n, Waveform w) {
  // The same few expansions are asked for by every bar part of a run, and by every
  // thread of a screening: expand each once.
  static std::mutex mutex;
  static std::map<std::pair<int, Waveform>, std::vector<HarmonicFactor>> expanded;
  const std::lock_guard<std::mutex> lock(mutex);
  auto it = expanded.find({n, w});
  if (it == expanded.end()) it = expanded.emplace(std::make_pair(n, w), expand_lock_in_factors(n, w)).first;
  return it->second;
}

namespace {

TrigVector cross(const TrigVector& a, const TrigVector& b) {
  return {a[1] * b[2] + (a[2] * b[1]).scaled(Rational(-1)), a[2] * b[0] + (a[0] * b[2]).scaled(Rational(-1)),
          a[0] * b[1] + (a[1] * b[0]).scaled(Rational(-1))};
}

SignalSeries contract(const AllowedForm& form, const std::vector<const TrigVector*>& vectors) {
  SignalSeries out;
  contract_components(form, vectors, [&](int p, const Surd& c, const TrigPoly& product) { out.add_term(p, c, product); });
  return out;
}

bool depends_on_other_angles(const SignalSeries& s) {
  for (const auto& [k, byp] : s.terms())
    for (int i = 1; i < angle_count; ++i)
      if (k[i] != 0) return true;
  return false;
}

std::vector<int> zero_azimuths(const std::vector<FourierTerm>& terms, int parameters) {
  std::vector<int> out;
  for (int deg = 0; deg < 360; deg += 15) {
    std::vector<Surd> value(parameters);
    for (const auto& t : terms) {
      Surd f = angle_function_value(t, {deg, 0, 0, 0});
      for (const auto& lt : t.coefficient) value[lt.parameter] += lt.coefficient * f;
    }
    if (std::all_of(value.begin(), value.end(), [](const Surd& v) { return v.is_zero(); })) out.push_back(deg);
  }
  return out;
}

// One term a·cos(nφ) or a·sin(nφ): |signal| peaks where nφ is a multiple of 180° (cos) or 90° off it (sin).
std::vector<double> largest_azimuths(const std::vector<FourierTerm>& terms) {
  if (terms.size() != 1) return {};
  const FourierTerm& t = terms[0];
  const int n = t.k[static_cast<int>(Angle::phi)];
  for (int i = 1; i < angle_count; ++i)
    if (t.k[i] != 0) return {};
  if (n == 0) return {};
  std::vector<double> out;
  for (int m = 0; m < 2 * n; ++m) out.push_back(((t.sine ? 90.0 : 0.0) + 180.0 * m) / n);
  return out;
}

} // namespace

PartSignal bar_signal(const ResponsePart& part, const AllowedForm& form, const BarMeasurement& m) {
  if (!is_bar_part(part))
    fail(ErrorKind::internal, "bar_signal called for a part without a drive kind: " + part.label);
  PartSignal ps;
  ps.part = &part;
  ps.longitudinal.probe = Probe::longitudinal;
  ps.transverse.probe = Probe::transverse;
  ps.current_order = part.harmonic;
  for (const auto& r : part.indices) {
    if (r == "B" || r == "M") {
      ++ps.field_order;
      ps.field_role = r;
    }
    if (r == "joule") ++ps.joule_order;
  }
  ps.harmonics = lock_in_factors(ps.current_order, m.waveform);
  if (ps.field_order > 0 && m.field == FieldGeometry::none) {
    ps.needs_field = true;
    return ps;
  }
  const TrigVector u = current_vector(m), v = transverse_vector(m), b = field_vector(m);
  // Joule heating warms the film from within and the substrate takes the heat away,
  // so its gradient is along the normal whichever way the current runs.
  const TrigVector normal{TrigPoly(), TrigPoly(), TrigPoly::constant(Rational(1))};
  const std::string drive_role = part.drive == DriveKind::current ? "j" : "E";
  const bool has_hall_vector = std::find(part.indices.begin(), part.indices.end(), "h") != part.indices.end();
  for (Probe probe : {Probe::longitudinal, Probe::transverse}) {
    const TrigVector& p = probe == Probe::longitudinal ? u : v;
    // E = h × j: p·(h × u) = h·(u × p); j = E × h: p·(u × h) = h·(p × u).
    TrigVector hall_probe = part.drive == DriveKind::current ? cross(u, p) : cross(p, u);
    std::vector<const TrigVector*> vectors;
    for (std::size_t i = 0; i < part.indices.size(); ++i) {
      const std::string& r = part.indices[i];
      if (r == "h") vectors.push_back(&hall_probe);
      else if (i == 0 && !has_hall_vector) vectors.push_back(&p);
      else if (r == drive_role) vectors.push_back(&u);
      else if (r == "joule") vectors.push_back(&normal);
      else vectors.push_back(&b); // B or M
    }
    ProbeSignal& out = probe == Probe::longitudinal ? ps.longitudinal : ps.transverse;
    out.series = contract(form, vectors);
    out.terms = real_fourier_terms(out.series);
    if (m.rotating && !depends_on_other_angles(out.series)) {
      out.zero_azimuths = zero_azimuths(out.terms, form.independent());
      out.largest_azimuths = largest_azimuths(out.terms);
    }
  }
  // The Hall test needs the current azimuth as a variable of its own.
  bool tied = m.field == FieldGeometry::along_current || m.field == FieldGeometry::across_current;
  if (m.rotating && !tied) {
    ps.hall_split = true;
    SignalSeries gradient;
    // S_⊥ = S_∥'/(d+1) + H for a response of degree d in the current's direction.
    gradient.add(ps.longitudinal.series.derivative_phi(), Rational(1, ps.direction_order() + 1));
    SignalSeries hall = ps.transverse.series;
    hall.add(gradient, Rational(-1));
    ps.transverse.gradient_terms = real_fourier_terms(gradient);
    ps.transverse.hall_terms = real_fourier_terms(hall);
  }
  return ps;
}

} // namespace ts
