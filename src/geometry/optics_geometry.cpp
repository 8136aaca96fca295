#include "geometry/optics_geometry.hpp"

#include "core/error.hpp"
#include "geometry/component_contraction.hpp"

#include <algorithm>
#include <cmath>
#include <set>

namespace ts {

OpticalMonomial operator*(const OpticalMonomial& a, const OpticalMonomial& b) {
  OpticalMonomial r;
  r.cos_theta = a.cos_theta + b.cos_theta;
  r.sin_theta = a.sin_theta + b.sin_theta;
  for (int i = 0; i < local_field_symbol_count; ++i) r.field[i] = a.field[i] + b.field[i];
  return r;
}

ThetaTrig::ThetaTrig(const TrigPoly& p) { add({}, p); }

// The one-term polynomial 1·m: cos θ, sin θ or one local-field factor.
ThetaTrig ThetaTrig::of(const OpticalMonomial& m) {
  ThetaTrig t;
  t.add(m, TrigPoly::constant(Rational(1)));
  return t;
}

ThetaTrig ThetaTrig::cos_theta() {
  OpticalMonomial m;
  m.cos_theta = 1;
  return of(m);
}

ThetaTrig ThetaTrig::sin_theta() {
  OpticalMonomial m;
  m.sin_theta = 1;
  return of(m);
}

ThetaTrig ThetaTrig::local_field(int symbol) {
  OpticalMonomial m;
  m.field[symbol] = 1;
  return of(m);
}

void ThetaTrig::add(OpticalMonomial key, const TrigPoly& p) {
  if (p.is_zero()) return;
  // sin²θ = 1 - cos²θ keeps sin θ to the first power: the monomials left are
  // linearly independent functions of θ, so an empty map is an exact zero.
  if (key.sin_theta >= 2) {
    key.sin_theta -= 2;
    add(key, p);
    key.cos_theta += 2;
    add(key, p.scaled(Rational(-1)));
    return;
  }
  auto it = terms_.find(key);
  if (it == terms_.end()) {
    terms_.emplace(key, p);
    return;
  }
  it->second = it->second + p;
  if (it->second.is_zero()) terms_.erase(it);
}

ThetaTrig operator+(const ThetaTrig& a, const ThetaTrig& b) {
  ThetaTrig r = a;
  for (const auto& [k, p] : b.terms_) r.add(k, p);
  return r;
}

ThetaTrig operator*(const ThetaTrig& a, const ThetaTrig& b) {
  ThetaTrig r;
  for (const auto& [ka, pa] : a.terms_)
    for (const auto& [kb, pb] : b.terms_) r.add(ka * kb, pa * pb);
  return r;
}

ThetaTrig ThetaTrig::scaled(const Surd& s) const {
  ThetaTrig r;
  for (const auto& [k, p] : terms_) r.add(k, p.scaled(s));
  return r;
}

const char* optics_mode_name(OpticsMode m) { return m == OpticsMode::reflection ? "reflection" : "transmission"; }

namespace {

const char* channel_help = "PP, PS, SP, SS (input-output), or IN-OUT with IN and OUT each P, S or an angle from P "
                           "in degrees (multiple of 15), IN also 'rotating': e.g. rotating-P, 45-S";

Polariser parse_polariser(const std::string& s, bool may_rotate, const std::string& text, const std::string& where) {
  Polariser p;
  if (s == "P" || s == "p") return p;
  if (s == "S" || s == "s") {
    p.degrees = 90;
    return p;
  }
  if (s == "rotating" && may_rotate) {
    p.rotating = true;
    return p;
  }
  // A sign alone ("-S" splits into "-" and "S") is no angle.
  bool digits = !s.empty() && s.size() < 5 && s.find_first_not_of("-0123456789") == std::string::npos &&
                s.find('-', 1) == std::string::npos && s.find_first_of("0123456789") != std::string::npos;
  if (!digits || std::stoi(s) % 15 != 0)
    fail(ErrorKind::bad_geometry, "'" + text + "' is not a polariser-analyser channel", where, channel_help);
  p.degrees = ((std::stoi(s) % 360) + 360) % 360;
  return p;
}

TrigPoly cos_or_var(const Polariser& p, Angle a) {
  return p.rotating ? TrigPoly::cos_of(a) : TrigPoly::constant(cos_degrees(p.degrees));
}
TrigPoly sin_or_var(const Polariser& p, Angle a) {
  return p.rotating ? TrigPoly::sin_of(a) : TrigPoly::constant(sin_degrees(p.degrees));
}

OpticalVector combine(const TrigPoly& a, const OpticalVector& p, const TrigPoly& b, const OpticalVector& s) {
  OpticalVector r;
  for (int i = 0; i < 3; ++i) r[i] = p[i] * ThetaTrig(a) + s[i] * ThetaTrig(b);
  return r;
}

OpticalVector cross(const OpticalVector& a, const OpticalVector& b) {
  const Surd m1 = Rational(-1);
  return {a[1] * b[2] + (a[2] * b[1]).scaled(m1), a[2] * b[0] + (a[0] * b[2]).scaled(m1),
          a[0] * b[1] + (a[1] * b[0]).scaled(m1)};
}

} // namespace

OpticalChannel parse_optical_channel(const std::string& text, const std::string& where) {
  OpticalChannel c;
  c.name = text;
  std::string in, out;
  std::size_t dash = text.find('-', 1); // an angle may start with '-'
  if (dash == std::string::npos) {
    if (text.size() != 2) fail(ErrorKind::bad_geometry, "'" + text + "' is not a polariser-analyser channel", where, channel_help);
    in = text.substr(0, 1);
    out = text.substr(1);
  } else {
    in = text.substr(0, dash);
    out = text.substr(dash + 1);
  }
  c.in = parse_polariser(in, true, text, where);
  c.out = parse_polariser(out, false, text, where);
  return c;
}

namespace {

// Whole degrees, a multiple of 15 (exact cosines), or nullopt for anything else.
std::optional<int> whole_degrees(const std::string& s) {
  std::string t = s;
  if (t.size() > 3 && t.compare(t.size() - 3, 3, "deg") == 0) t.resize(t.size() - 3);
  if (t.empty() || t.size() > 5 || t.find_first_not_of("-0123456789") != std::string::npos ||
      t.find('-', 1) != std::string::npos || t == "-")
    return std::nullopt;
  int v = std::stoi(t);
  if (v % 15 != 0) return std::nullopt;
  return v;
}

} // namespace

OpticalMeasurement make_optical_measurement(const std::string& name, const std::string& geometry,
                                            const std::string& incidence, const std::string& azimuth,
                                            const std::vector<std::string>& channels, const std::string& where) {
  OpticalMeasurement m;
  m.name = name;
  m.where = where;
  if (geometry == "reflection") m.mode = OpticsMode::reflection;
  else if (geometry == "transmission") m.mode = OpticsMode::transmission;
  else fail(ErrorKind::bad_geometry, "unknown optical geometry '" + geometry + "'", where, "reflection or transmission");
  if (incidence != "any") {
    auto v = whole_degrees(incidence);
    if (!v || *v < 0 || *v > 75)
      fail(ErrorKind::bad_geometry, "angle of incidence '" + incidence + "' is not usable", where,
           "\"any\" (a variable θ) or whole degrees from the normal, a multiple of 15 from 0 to 75");
    m.incidence_deg = *v;
  }
  if (azimuth != "rotating") {
    auto v = whole_degrees(azimuth);
    if (!v)
      fail(ErrorKind::bad_geometry, "sample azimuth '" + azimuth + "' is not usable", where,
           "\"rotating\" or whole degrees, a multiple of 15 (exact cosines)");
    m.azimuth_rotating = false;
    m.azimuth_deg = ((*v % 360) + 360) % 360;
  }
  std::vector<std::string> names = channels.empty() ? std::vector<std::string>{"PP", "PS", "SP", "SS"} : channels;
  for (const auto& c : names) m.channels.push_back(parse_optical_channel(c, where));
  return m;
}

void apply_local_field(OpticalMeasurement& m, const std::optional<RefractiveIndices>& indices, const std::string& where) {
  if (m.mode != OpticsMode::reflection)
    fail(ErrorKind::bad_geometry, "local-field factors are modelled for reflection only", where,
         "the reflection geometry with the factors (geometry = \"reflection\", --shg reflection:45), or "
         "transmission without them");
  m.local_field.applied = true;
  if (!indices) return;
  if (!m.incidence_deg)
    fail(ErrorKind::bad_geometry, "refractive indices need a fixed angle of incidence (the factors depend on it)", where,
         "a fixed angle 0, 15, ..., 75 (incidence = 45, --shg reflection:45); or the factors as symbols only "
         "(local_field = true or --shg-local-field, without indices)");
  m.local_field.indices = indices;
  m.local_field.values = local_field_values(*indices, *m.incidence_deg, where);
}

ChannelVectors channel_vectors(const OpticalMeasurement& m, const OpticalChannel& c) {
  ThetaTrig cth, sth;
  if (m.incidence_deg) {
    cth = TrigPoly::constant(cos_degrees(*m.incidence_deg));
    sth = TrigPoly::constant(sin_degrees(*m.incidence_deg));
  } else {
    cth = ThetaTrig::cos_theta();
    sth = ThetaTrig::sin_theta();
  }
  const ThetaTrig zero, one = TrigPoly::constant(Rational(1));
  const Surd m1 = Rational(-1);
  const OpticalVector s_lab{zero, one, zero};
  const OpticalVector p_in{cth, zero, sth};
  const OpticalVector k_in{sth, zero, cth.scaled(m1)};
  const bool refl = m.mode == OpticsMode::reflection;
  const OpticalVector p_out = refl ? OpticalVector{cth.scaled(m1), zero, sth} : p_in;
  const OpticalVector k_out = refl ? OpticalVector{sth, zero, cth} : k_in;
  ChannelVectors lab;
  lab.e_in = combine(cos_or_var(c.in, Angle::polariser), p_in, sin_or_var(c.in, Angle::polariser), s_lab);
  lab.e_out = combine(cos_or_var(c.out, Angle::analyser), p_out, sin_or_var(c.out, Angle::analyser), s_lab);
  lab.k_in = k_in;
  lab.k_out = k_out;
  if (m.local_field.applied) {
    // At normal incidence S and P are the same wave turned by 90° about the
    // normal, so the in-plane factors are one: L_y = L_x. Independent symbols
    // would let a channel that cancels between x and y (a 45° polariser) radiate.
    const bool normal = m.incidence_deg && *m.incidence_deg == 0;
    for (int i = 0; i < 3; ++i) {
      const int axis = normal && i == 1 ? 0 : i;
      lab.e_in[i] = lab.e_in[i] * ThetaTrig::local_field(axis);
      lab.e_out[i] = lab.e_out[i] * ThetaTrig::local_field(3 + axis);
    }
  }
  // The sample turned by +φ about n: lab vectors seen in the sample frame are turned by -φ.
  TrigPoly cp, sp;
  if (m.azimuth_rotating) {
    cp = TrigPoly::cos_of(Angle::phi);
    sp = TrigPoly::sin_of(Angle::phi);
  } else {
    cp = TrigPoly::constant(cos_degrees(m.azimuth_deg));
    sp = TrigPoly::constant(sin_degrees(m.azimuth_deg));
  }
  auto to_sample = [&](const OpticalVector& v) {
    return OpticalVector{v[0] * ThetaTrig(cp) + v[1] * ThetaTrig(sp),
                         v[0] * ThetaTrig(sp.scaled(m1)) + v[1] * ThetaTrig(cp), v[2]};
  };
  return {to_sample(lab.e_in), to_sample(lab.e_out), to_sample(lab.k_in), to_sample(lab.k_out)};
}

bool is_shg_part(const ResponsePart& part) {
  if (part.harmonic != 2 || part.indices.empty()) return false;
  const std::string& first = part.indices.front();
  if (first != "P" && first != "M" && first != "Q") return false;
  // Two factors of the driving light: E E, or E and its magnetic field H.
  int drives = 0;
  for (const auto& r : part.indices) {
    if (r == "light" || r == "H") ++drives;
    else if (r != "P" && r != "M" && r != "Q" && r != "k") return false;
  }
  return drives == 2;
}

bool is_dipole_shg_part(const ResponsePart& part) {
  return is_shg_part(part) && part.indices == std::vector<std::string>{"P", "light", "light"};
}

bool ChannelAmplitude::radiates() const {
  return std::any_of(per_parameter.begin(), per_parameter.end(), [](const ThetaTrig& f) { return !f.is_zero(); });
}

ChannelAmplitude shg_amplitude(const ResponsePart& part, const AllowedForm& form, const ChannelVectors& v) {
  if (!is_shg_part(part)) fail(ErrorKind::internal, "shg_amplitude called for a part that is not an SH source: " + part.label);
  const OpticalVector m_probe = cross(v.k_out, v.e_out), h_in = cross(v.k_in, v.e_in);
  std::vector<const OpticalVector*> vectors;
  bool first_q = true;
  for (const auto& r : part.indices) {
    if (r == "P") vectors.push_back(&v.e_out);
    else if (r == "M") vectors.push_back(&m_probe);
    else if (r == "Q") {
      vectors.push_back(first_q ? &v.e_out : &v.k_out);
      first_q = false;
    } else if (r == "light") vectors.push_back(&v.e_in);
    else if (r == "H") vectors.push_back(&h_in);
    else vectors.push_back(&v.k_in); // k
  }
  ChannelAmplitude out;
  out.per_parameter.resize(form.independent());
  contract_components(form, vectors, [&](int p, const Surd& c, const ThetaTrig& product) {
    out.per_parameter[p] = out.per_parameter[p] + product.scaled(c);
  });
  return out;
}

namespace {

bool canonical(const Frequency& k) {
  for (int v : k)
    if (v != 0) return v > 0;
  return true;
}

int total_order(const Frequency& k) {
  int s = 0;
  for (int v : k) s += std::abs(v);
  return s;
}

// The real form of a real trigonometric polynomial: (harmonic, coefficient).
std::vector<std::pair<Harmonic, Surd>> real_form(const TrigPoly& p) {
  std::vector<std::pair<Harmonic, Surd>> out;
  for (const auto& [k, c] : p.terms()) {
    if (!canonical(k)) continue;
    if (k == Frequency{}) {
      if (!c.re.is_zero()) out.push_back({{k, false}, c.re});
      continue;
    }
    Surd cc = c.re * Surd(Rational(2)), sc = -(c.im * Surd(Rational(2)));
    if (!cc.is_zero()) out.push_back({{k, false}, cc});
    if (!sc.is_zero()) out.push_back({{k, true}, sc});
  }
  return out;
}

bool display_order(const Harmonic& a, const Harmonic& b) {
  if (total_order(a.k) != total_order(b.k)) return total_order(a.k) < total_order(b.k);
  if (a.k != b.k) return a.k > b.k;
  return !a.sine && b.sine;
}

} // namespace

std::vector<OpticalTerm> optical_terms(const ChannelAmplitude& a) {
  std::map<Harmonic, std::map<OpticalMonomial, std::map<int, Surd>>> acc;
  for (std::size_t j = 0; j < a.per_parameter.size(); ++j)
    for (const auto& [key, poly] : a.per_parameter[j].terms())
      for (const auto& [h, c] : real_form(poly)) acc[h][key][static_cast<int>(j)] += c;
  std::vector<OpticalTerm> out;
  for (const auto& [h, by_key] : acc) {
    OpticalTerm t{h.k, h.sine, {}};
    for (const auto& [key, by_p] : by_key) {
      Combination comb;
      for (const auto& [p, c] : by_p)
        if (!c.is_zero()) comb.push_back({p, c});
      if (!comb.empty()) t.by_theta[key] = comb;
    }
    if (!t.by_theta.empty()) out.push_back(t);
  }
  std::stable_sort(out.begin(), out.end(), [](const OpticalTerm& x, const OpticalTerm& y) {
    return display_order({x.k, x.sine}, {y.k, y.sine});
  });
  return out;
}

std::vector<Harmonic> product_harmonics(const ChannelAmplitude& a, const ChannelAmplitude& b) {
  std::set<Harmonic> found;
  for (const auto& f : a.per_parameter) {
    if (f.is_zero()) continue;
    for (const auto& g : b.per_parameter) {
      if (g.is_zero()) continue;
      ThetaTrig prod = f * g;
      for (const auto& [key, poly] : prod.terms())
        for (const auto& [h, c] : real_form(poly)) found.insert(h);
    }
  }
  std::vector<Harmonic> out(found.begin(), found.end());
  std::sort(out.begin(), out.end(), display_order);
  return out;
}

std::string harmonic_text(const Harmonic& h, bool latex) {
  FourierTerm t;
  t.k = h.k;
  t.sine = h.sine;
  return angle_function_text(t, latex);
}

Complex theta_trig_value(const ThetaTrig& f, double theta, const std::array<double, angle_count>& radians,
                         const std::array<Complex, local_field_symbol_count>& factors) {
  Complex sum = 0;
  for (const auto& [key, poly] : f.terms()) {
    Complex mono = std::pow(std::cos(theta), key.cos_theta) * std::pow(std::sin(theta), key.sin_theta);
    for (int i = 0; i < local_field_symbol_count; ++i) mono *= std::pow(factors[i], key.field[i]);
    double v = 0;
    for (const auto& [k, c] : poly.terms()) {
      double arg = 0;
      for (int i = 0; i < angle_count; ++i) arg += k[i] * radians[i];
      v += c.re.to_double() * std::cos(arg) - c.im.to_double() * std::sin(arg);
    }
    sum += mono * v;
  }
  return sum;
}

} // namespace ts
