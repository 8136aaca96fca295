#include "geometry/local_field.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace ts {

std::string local_field_symbol_name(int symbol, bool latex) {
  static const char* axes[] = {"x", "y", "z"};
  const char* axis = axes[symbol % 3];
  const bool second = symbol >= 3;
  if (latex) return std::string("L_{") + axis + "}(" + (second ? "2\\omega" : "\\omega") + ")";
  return std::string("L") + axis + (second ? "_2w" : "_w");
}

namespace {

const char* index_help = "a number or a complex number n' + n''i with n' > 0 and n'' >= 0 (absorption), "
                         "e.g. 1.5, \"2.2+0.01i\", \"0.2+3.4i\"";

// One real number at s[pos...]: digits with an optional point and exponent. Advances pos.
bool read_real(const std::string& s, std::size_t& pos, double& out) {
  std::size_t start = pos;
  if (pos < s.size() && (s[pos] == '+' || s[pos] == '-')) ++pos;
  std::size_t digits = 0;
  while (pos < s.size() && (std::isdigit(static_cast<unsigned char>(s[pos])) || s[pos] == '.')) {
    if (s[pos] != '.') ++digits;
    ++pos;
  }
  if (digits == 0) return false;
  if (pos < s.size() && (s[pos] == 'e' || s[pos] == 'E')) {
    ++pos;
    if (pos < s.size() && (s[pos] == '+' || s[pos] == '-')) ++pos;
    std::size_t exp_digits = 0;
    while (pos < s.size() && std::isdigit(static_cast<unsigned char>(s[pos]))) ++pos, ++exp_digits;
    if (exp_digits == 0) return false;
  }
  std::string token = s.substr(start, pos - start);
  if (std::count(token.begin(), token.end(), '.') > 1) return false;
  char* end = nullptr;
  out = std::strtod(token.c_str(), &end);
  return end == token.c_str() + token.size() && std::isfinite(out);
}

} // namespace

RefractiveIndex parse_refractive_index(const std::string& text, bool ambient, ErrorKind kind, const std::string& where) {
  std::string s;
  for (char c : text)
    if (c != ' ') s += c;
  std::size_t pos = 0;
  double re = 0, im = 0;
  bool ok = s.size() < 64 && read_real(s, pos, re);
  if (ok && pos < s.size()) {
    if (s[pos] == 'i' && pos + 1 == s.size()) { // "0.5i": the whole number is imaginary
      im = re;
      re = 0;
    } else if (s[pos] == '+' || s[pos] == '-') {
      ok = read_real(s, pos, im) && pos + 1 == s.size() && s[pos] == 'i';
    } else {
      ok = false;
    }
  }
  if (!ok) fail(kind, "'" + text + "' is not a refractive index", where, index_help);
  if (!(re > 0)) fail(kind, "refractive index '" + text + "' has a real part that is not positive", where, index_help);
  if (im < 0)
    fail(kind, "refractive index '" + text + "' has a negative imaginary part (gain)", where,
         std::string(index_help) + "; with fields as exp(i(kz - wt)) an absorbing medium has n'' > 0");
  if (ambient && im != 0)
    fail(kind, "the ambient index '" + text + "' is complex", where,
         "a real index > 0: the light arrives through a transparent medium (air 1, a prism 1.5)");
  return {text, Complex(re, im)};
}

FresnelTransmission fresnel_transmission(Complex n1, Complex n2, double theta) {
  const double c = std::cos(theta), s = std::sin(theta);
  const Complex kz1 = n1 * c;
  Complex kz2 = std::sqrt(n2 * n2 - n1 * n1 * s * s);
  // The physical branch: the transmitted wave decays (or runs) into medium 2.
  if (kz2.imag() < 0 || (kz2.imag() == 0 && kz2.real() < 0)) kz2 = -kz2;
  FresnelTransmission t;
  t.t_s = 2.0 * kz1 / (kz1 + kz2);
  t.t_p = 2.0 * n1 * n2 * c / (n2 * n2 * c + n1 * kz2);
  t.cos_refracted = kz2 / n2;
  return t;
}

std::array<Complex, 3> interface_local_field(Complex n1, Complex n2, double theta) {
  const FresnelTransmission t = fresnel_transmission(n1, n2, theta);
  // The x and z components of a P wave scale with cos θ and sin θ on either side.
  return {t.t_p * t.cos_refracted / std::cos(theta), t.t_s, t.t_p * n1 / n2};
}

std::array<Complex, local_field_symbol_count> local_field_values(const RefractiveIndices& n, int incidence_deg,
                                                                 const std::string& where) {
  constexpr double pi = 3.14159265358979323846;
  const double theta = incidence_deg * pi / 180;
  const auto at_omega = interface_local_field(n.ambient.value, n.omega.value, theta);
  const auto at_two_omega = interface_local_field(n.ambient.value, n.two_omega.value, theta);
  std::array<Complex, local_field_symbol_count> out{};
  for (int i = 0; i < 3; ++i) {
    out[i] = at_omega[i];
    out[3 + i] = at_two_omega[i];
  }
  for (int i = 0; i < local_field_symbol_count; ++i)
    if (!(std::abs(out[i]) > 1e-6) || !std::isfinite(out[i].real()) || !std::isfinite(out[i].imag()))
      fail(ErrorKind::bad_geometry,
           "the factor " + local_field_symbol_name(i) + " vanishes at the angle of incidence " +
               std::to_string(incidence_deg) + "° (the light is refracted along the surface: the critical angle)",
           where, "another angle of incidence, or indices with n_ambient sin(theta) != n");
  return out;
}

std::string complex_text(Complex z) {
  char buf[64];
  const double re = std::abs(z.real()) < 5e-5 ? 0.0 : z.real(), im = std::abs(z.imag()) < 5e-5 ? 0.0 : z.imag();
  if (im == 0) std::snprintf(buf, sizeof buf, "%.4f", re);
  else std::snprintf(buf, sizeof buf, "%.4f%c%.4fi", re, im < 0 ? '-' : '+', std::abs(im));
  return buf;
}

} // namespace ts
