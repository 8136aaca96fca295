#include "geometry/angle_series.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <cmath>

namespace ts {

const char* angle_symbol(Angle a, bool latex) {
  switch (a) {
  case Angle::phi: return latex ? "\\varphi" : "phi";
  case Angle::phi_b: return latex ? "\\varphi_B" : "phiB";
  case Angle::theta_b: return latex ? "\\theta_B" : "thetaB";
  case Angle::drive: return latex ? "\\omega t" : "wt";
  case Angle::polariser: return latex ? "\\alpha_\\mathrm{in}" : "alpha_in";
  case Angle::analyser: return latex ? "\\alpha_\\mathrm{out}" : "alpha_out";
  }
  return "";
}

void TrigPoly::add(const Frequency& k, const ComplexSurd& c) {
  if (c.is_zero()) return;
  auto it = terms_.find(k);
  if (it == terms_.end()) {
    terms_.emplace(k, c);
    return;
  }
  it->second = it->second + c;
  if (it->second.is_zero()) terms_.erase(it);
}

TrigPoly TrigPoly::constant(const Surd& s) {
  TrigPoly p;
  p.add(Frequency{}, {s, Surd()});
  return p;
}

TrigPoly TrigPoly::cos_of(Angle a) {
  TrigPoly p;
  Frequency k{};
  k[static_cast<int>(a)] = 1;
  p.add(k, {Rational(1, 2), Surd()});
  k[static_cast<int>(a)] = -1;
  p.add(k, {Rational(1, 2), Surd()});
  return p;
}

TrigPoly TrigPoly::sin_of(Angle a) {
  // sin x = (e^{ix} - e^{-ix}) / 2i = -i/2 e^{ix} + i/2 e^{-ix}
  TrigPoly p;
  Frequency k{};
  k[static_cast<int>(a)] = 1;
  p.add(k, {Surd(), Rational(-1, 2)});
  k[static_cast<int>(a)] = -1;
  p.add(k, {Surd(), Rational(1, 2)});
  return p;
}

TrigPoly operator+(const TrigPoly& a, const TrigPoly& b) {
  TrigPoly r = a;
  for (const auto& [k, c] : b.terms_) r.add(k, c);
  return r;
}

TrigPoly operator*(const TrigPoly& a, const TrigPoly& b) {
  TrigPoly r;
  for (const auto& [ka, ca] : a.terms_)
    for (const auto& [kb, cb] : b.terms_) {
      Frequency k;
      for (int i = 0; i < angle_count; ++i) k[i] = ka[i] + kb[i];
      r.add(k, ca * cb);
    }
  return r;
}

TrigPoly TrigPoly::scaled(const Surd& s) const {
  TrigPoly r;
  for (const auto& [k, c] : terms_) r.add(k, {c.re * s, c.im * s});
  return r;
}

void SignalSeries::add_term(int parameter, const Surd& coefficient, const TrigPoly& angles) {
  if (coefficient.is_zero()) return;
  for (const auto& [k, c] : angles.terms()) {
    ComplexSurd v{c.re * coefficient, c.im * coefficient};
    auto& byp = terms_[k];
    auto it = byp.find(parameter);
    if (it == byp.end()) byp.emplace(parameter, v);
    else {
      it->second = it->second + v;
      if (it->second.is_zero()) byp.erase(it);
    }
    if (byp.empty()) terms_.erase(k);
  }
}

void SignalSeries::add(const SignalSeries& other, const Surd& factor) {
  for (const auto& [k, byp] : other.terms_) {
    auto& dst = terms_[k];
    for (const auto& [p, c] : byp) {
      ComplexSurd v = dst[p] + ComplexSurd{c.re * factor, c.im * factor};
      if (v.is_zero()) dst.erase(p);
      else dst[p] = v;
    }
    if (dst.empty()) terms_.erase(k);
  }
}

SignalSeries SignalSeries::derivative_phi() const {
  SignalSeries d;
  for (const auto& [k, byp] : terms_) {
    int n = k[static_cast<int>(Angle::phi)];
    if (n == 0) continue;
    for (const auto& [p, c] : byp) d.terms_[k][p] = ComplexSurd{-c.im * Surd(Rational(n)), c.re * Surd(Rational(n))};
  }
  return d;
}

SignalSeries SignalSeries::at_drive_harmonic(int n) const {
  SignalSeries s;
  const int slot = static_cast<int>(Angle::drive);
  for (const auto& [k, byp] : terms_)
    if (k[slot] == n || k[slot] == -n) {
      s.terms_[k] = byp;
    }
  return s;
}

namespace {

bool canonical(const Frequency& k) {
  for (int v : k)
    if (v != 0) return v > 0;
  return true; // k = 0
}

Combination combination_of(const std::map<int, Surd>& m) {
  Combination c;
  for (const auto& [p, s] : m)
    if (!s.is_zero()) c.push_back({p, s});
  return c;
}

} // namespace

std::vector<FourierTerm> real_fourier_terms(const SignalSeries& s) {
  std::vector<FourierTerm> out;
  for (const auto& [k, byp] : s.terms()) {
    if (!canonical(k)) continue;
    bool zero = k == Frequency{};
    std::map<int, Surd> cosc, sinc;
    for (const auto& [p, c] : byp) {
      if (zero) {
        cosc[p] = c.re; // the imaginary part of c_0 cancels for a real signal
      } else {
        cosc[p] = c.re * Surd(Rational(2));
        sinc[p] = -(c.im * Surd(Rational(2)));
      }
    }
    FourierTerm tc{k, false, combination_of(cosc)};
    if (!tc.coefficient.empty()) out.push_back(tc);
    FourierTerm ts{k, true, combination_of(sinc)};
    if (!ts.coefficient.empty()) out.push_back(ts);
  }
  // Lowest total order first, then by frequency, cosine before sine.
  std::stable_sort(out.begin(), out.end(), [](const FourierTerm& a, const FourierTerm& b) {
    auto order = [](const Frequency& k) {
      int total = 0;
      for (int v : k) total += std::abs(v);
      return total;
    };
    if (order(a.k) != order(b.k)) return order(a.k) < order(b.k);
    if (a.k != b.k) return a.k > b.k;
    return !a.sine && b.sine;
  });
  return out;
}

std::string angle_function_text(const FourierTerm& t, bool latex) {
  std::string arg;
  for (int i = 0; i < angle_count; ++i) {
    int n = t.k[i];
    if (n == 0) continue;
    std::string sym = angle_symbol(static_cast<Angle>(i), latex);
    // "3*phi", not "3phi": the plain text is an expression sympy and Python parse as it stands.
    std::string mag = std::abs(n) == 1 ? sym : std::to_string(std::abs(n)) + (latex ? "" : "*") + sym;
    if (arg.empty()) arg = (n < 0 ? "-" : "") + mag;
    else arg += (n < 0 ? " - " : " + ") + mag;
  }
  if (arg.empty()) return "1";
  if (latex) return std::string(t.sine ? "\\sin" : "\\cos") + "(" + arg + ")";
  return std::string(t.sine ? "sin" : "cos") + "(" + arg + ")";
}

Surd cos_degrees(int degrees) {
  int d = ((degrees % 360) + 360) % 360;
  if (d % 15 != 0) fail(ErrorKind::internal, "exact cosine of " + std::to_string(degrees) + "° requested");
  // cos of 0, 15, ..., 90 degrees.
  const Surd s2 = Surd::sqrt_of(Rational(2)), s3 = Surd::sqrt_of(Rational(3)), s6 = Surd::sqrt_of(Rational(6));
  auto first_quadrant = [&](int a) -> Surd {
    switch (a) {
    case 0: return Rational(1);
    case 15: return (s6 + s2) * Surd(Rational(1, 4));
    case 30: return s3 * Surd(Rational(1, 2));
    case 45: return s2 * Surd(Rational(1, 2));
    case 60: return Rational(1, 2);
    case 75: return (s6 - s2) * Surd(Rational(1, 4));
    default: return Surd();
    }
  };
  if (d <= 90) return first_quadrant(d);
  if (d <= 180) return -first_quadrant(180 - d);
  if (d <= 270) return -first_quadrant(d - 180);
  return first_quadrant(360 - d);
}

Surd sin_degrees(int degrees) { return cos_degrees(90 - degrees); }

Surd angle_function_value(const FourierTerm& t, const std::array<int, angle_count>& degrees) {
  long arg = 0;
  for (int i = 0; i < angle_count; ++i) arg += static_cast<long>(t.k[i]) * degrees[i];
  int a = static_cast<int>(((arg % 360) + 360) % 360);
  return t.sine ? sin_degrees(a) : cos_degrees(a);
}

double angle_function_double(const FourierTerm& t, const std::array<double, angle_count>& radians) {
  double arg = 0;
  for (int i = 0; i < angle_count; ++i) arg += t.k[i] * radians[i];
  return t.sine ? std::sin(arg) : std::cos(arg);
}

} // namespace ts
