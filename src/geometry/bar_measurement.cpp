#include "geometry/bar_measurement.hpp"

#include "core/error.hpp"

#include <cctype>

namespace ts {

const char* field_geometry_name(FieldGeometry g) {
  switch (g) {
  case FieldGeometry::none: return "none";
  case FieldGeometry::in_plane: return "in-plane";
  case FieldGeometry::normal: return "normal";
  case FieldGeometry::any: return "any";
  case FieldGeometry::along_current: return "along-current";
  case FieldGeometry::across_current: return "across-current";
  case FieldGeometry::fixed: return "fixed";
  }
  return "";
}

namespace {

const char* current_help = "rotating, an in-plane crystal direction such as [110], or an angle from sample x in "
                           "degrees that is a multiple of 15 (e.g. 30)";
const char* field_help = "none, in-plane, normal, any, along-current, across-current, a crystal direction such as "
                         "[001], or in-plane:ANGLE with the angle from sample x a multiple of 15 degrees";

Surd to_surd(const QSqrt3& q) { return Surd(q); }

// An angle in degrees, a multiple of 15 so that cos and sin stay exact.
std::optional<int> parse_degrees(std::string t) {
  if (t.size() > 3 && t.compare(t.size() - 3, 3, "deg") == 0) t.resize(t.size() - 3);
  else if (t.size() > 2 && t.compare(t.size() - 2, 2, "°") == 0) t.resize(t.size() - 2);
  if (t.empty() || t.size() > 6) return std::nullopt;
  std::size_t i = t[0] == '-' ? 1 : 0;
  if (i == t.size()) return std::nullopt;
  for (std::size_t j = i; j < t.size(); ++j)
    if (!std::isdigit(static_cast<unsigned char>(t[j]))) return std::nullopt;
  return std::stoi(t);
}

std::array<Surd, 3> in_plane_at(int degrees) { return {cos_degrees(degrees), sin_degrees(degrees), Surd()}; }

std::array<Surd, 3> crystal_direction_in_sample(const std::string& text, const SampleFrame& sf,
                                                const std::string& system, LatticeKind lattice,
                                                const LatticeMetric& metric, const std::string& where) {
  Vec3 d = metric_direction(parse_direction(text, where), system, lattice, metric, where);
  return sample_unit_vector(d, sf.frame, where);
}

TrigVector constant_vector(const std::array<Surd, 3>& v) {
  return {TrigPoly::constant(v[0]), TrigPoly::constant(v[1]), TrigPoly::constant(v[2])};
}

} // namespace

std::array<Surd, 3> sample_unit_vector(const Vec3& d, const Frame& frame, const std::string& where) {
  QSqrt3 dd = dot(d, d);
  if (!dd.is_rational() || dd.rational_part() <= Rational(0))
    fail(ErrorKind::bad_geometry, "direction " + vec_str(d) + " has no exact length", where,
         "a lattice direction of the crystal");
  std::array<Surd, 3> out;
  for (int i = 0; i < 3; ++i) {
    Rational aa = dot(frame.axes[i], frame.axes[i]).rational_part();
    out[i] = to_surd(dot(frame.axes[i], d)) * Surd::sqrt_of(Rational(1) / (aa * dd.rational_part()));
  }
  return out;
}

void set_bar_current(BarMeasurement& m, const std::string& raw, const SampleFrame& sf, const std::string& system,
                     LatticeKind lattice, const LatticeMetric& metric) {
  std::string text;
  for (char c : raw)
    if (c != ' ') text += c;
  if (text.empty() || text == "rotating") {
    m.rotating = true;
    m.current_label = "rotating: φ from sample x";
    return;
  }
  m.rotating = false;
  if (text.front() == '[') {
    m.u = crystal_direction_in_sample(text, sf, system, lattice, metric, m.where);
    if (!m.u[2].is_zero())
      fail(ErrorKind::bad_geometry, "current direction " + text + " does not lie in the film plane (normal " +
                                        sf.normal_label + ")",
           m.where, "an in-plane direction: perpendicular to the normal");
    m.current_label = parse_direction(text, m.where).text;
    return;
  }
  auto deg = parse_degrees(text);
  if (!deg || *deg % 15 != 0)
    fail(ErrorKind::bad_geometry, "'" + raw + "' is not a current direction", m.where, current_help);
  m.u = in_plane_at(*deg);
  m.current_label = std::to_string(*deg) + "° from sample x";
}

void set_bar_field(BarMeasurement& m, const std::string& raw, const SampleFrame& sf, const std::string& system,
                   LatticeKind lattice, const LatticeMetric& metric) {
  std::string text;
  for (char c : raw)
    if (c != ' ') text += c;
  static const std::pair<const char*, FieldGeometry> names[] = {
      {"none", FieldGeometry::none},
      {"in-plane", FieldGeometry::in_plane},
      {"normal", FieldGeometry::normal},
      {"any", FieldGeometry::any},
      {"along-current", FieldGeometry::along_current},
      {"across-current", FieldGeometry::across_current}};
  for (const auto& [n, g] : names)
    if (text == n) {
      m.field = g;
      m.field_label = text == "in-plane"         ? "in plane, φ_B from sample x"
                      : text == "any"            ? "any direction: θ_B from the normal, φ_B from sample x"
                      : text == "normal"         ? "along the normal n"
                      : text == "along-current"  ? "in plane along the current (φ_B = φ)"
                      : text == "across-current" ? "in plane across the current (φ_B = φ + 90°)"
                                                 : "none";
      return;
    }
  m.field = FieldGeometry::fixed;
  if (!text.empty() && text.front() == '[') {
    m.b = crystal_direction_in_sample(text, sf, system, lattice, metric, m.where);
    m.field_label = "along " + parse_direction(text, m.where).text;
    return;
  }
  if (text.rfind("in-plane:", 0) == 0) {
    auto deg = parse_degrees(text.substr(9));
    if (deg && *deg % 15 == 0) {
      m.b = in_plane_at(*deg);
      m.field_label = "in plane, " + std::to_string(*deg) + "° from sample x";
      return;
    }
  }
  fail(ErrorKind::bad_geometry, "'" + raw + "' is not a field direction", m.where, field_help);
}

Waveform parse_waveform(const std::string& text, const std::string& where, ErrorKind bad_value) {
  if (text == "sine" || text == "sin") return Waveform::sine;
  if (text == "cosine" || text == "cos") return Waveform::cosine;
  fail(bad_value, "unknown drive waveform '" + text + "'", where, "sine (I = I0 sin ωt) or cosine");
}

TrigVector current_vector(const BarMeasurement& m) {
  if (!m.rotating) return constant_vector(m.u);
  return {TrigPoly::cos_of(Angle::phi), TrigPoly::sin_of(Angle::phi), TrigPoly{}};
}

TrigVector transverse_vector(const BarMeasurement& m) {
  TrigVector u = current_vector(m);
  // v = n × u with n = z: (-u_y, u_x, 0).
  return {u[1].scaled(Rational(-1)), u[0], TrigPoly{}};
}

TrigVector field_vector(const BarMeasurement& m) {
  switch (m.field) {
  case FieldGeometry::none: return {};
  case FieldGeometry::in_plane: return {TrigPoly::cos_of(Angle::phi_b), TrigPoly::sin_of(Angle::phi_b), TrigPoly{}};
  case FieldGeometry::normal: return constant_vector({Surd(), Surd(), Rational(1)});
  case FieldGeometry::any: {
    TrigPoly s = TrigPoly::sin_of(Angle::theta_b);
    return {s * TrigPoly::cos_of(Angle::phi_b), s * TrigPoly::sin_of(Angle::phi_b), TrigPoly::cos_of(Angle::theta_b)};
  }
  case FieldGeometry::along_current: return current_vector(m);
  case FieldGeometry::across_current: return transverse_vector(m);
  case FieldGeometry::fixed: return constant_vector(m.b);
  }
  return {};
}

} // namespace ts
