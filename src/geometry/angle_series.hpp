// Exact Fourier series in the angles of a measurement. A Hall-bar signal is a
// polynomial in cos and sin of the current azimuth φ, the field azimuth φ_B,
// the field polar angle θ_B and the drive phase ωt; written with
// cos x = (e^{ix} + e^{-ix})/2 and sin x = (e^{ix} - e^{-ix})/2i it becomes a
// finite sum Σ_k c_k e^{i k·angles} whose coefficients are exact complex
// surds. Products of radicals are canonical in Surd (√2·√3 = √6), so a
// harmonic is reported only when its coefficient is provably nonzero.
// GiNaC is used to write the result (signal_expression.hpp), never to decide
// a zero.
#pragma once

#include "core/surd.hpp"
#include "tensor/param_tensor.hpp"

#include <array>
#include <map>
#include <string>
#include <vector>

namespace ts {

// The angles a signal may depend on, in this order in a frequency vector. An
// optical measurement uses phi for the sample azimuth and the polariser and
// analyser angles (measured from P towards S, optics_geometry.hpp).
enum class Angle { phi = 0, phi_b = 1, theta_b = 2, drive = 3, polariser = 4, analyser = 5 };
constexpr int angle_count = 6;
using Frequency = std::array<int, angle_count>;
const char* angle_symbol(Angle a, bool latex = false); // "phi", "\\varphi_B", ...

struct ComplexSurd {
  Surd re, im;
  bool is_zero() const { return re.is_zero() && im.is_zero(); }
  friend ComplexSurd operator+(const ComplexSurd& a, const ComplexSurd& b) { return {a.re + b.re, a.im + b.im}; }
  friend ComplexSurd operator*(const ComplexSurd& a, const ComplexSurd& b) {
    // Most coefficients are real or imaginary (cos and sin of the angles): skip the
    // products that are exactly zero.
    const bool a_real = a.im.is_zero(), b_real = b.im.is_zero();
    if (a_real && b_real) return {a.re * b.re, Surd()};
    if (a_real) return {a.re * b.re, a.re * b.im};
    if (b_real) return {a.re * b.re, a.im * b.re};
    if (a.re.is_zero() && b.re.is_zero()) return {-(a.im * b.im), Surd()};
    return {a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re};
  }
  friend bool operator==(const ComplexSurd& a, const ComplexSurd& b) { return a.re == b.re && a.im == b.im; }
};

// A numeric trigonometric polynomial: the component of a direction vector, a
// product of such components, or a drive waveform.
class TrigPoly {
public:
  TrigPoly() = default;
  static TrigPoly constant(const Surd& s);
  static TrigPoly cos_of(Angle a);
  static TrigPoly sin_of(Angle a);
  bool is_zero() const { return terms_.empty(); }
  const std::map<Frequency, ComplexSurd>& terms() const { return terms_; }
  friend TrigPoly operator+(const TrigPoly& a, const TrigPoly& b);
  friend TrigPoly operator*(const TrigPoly& a, const TrigPoly& b);
  TrigPoly scaled(const Surd& s) const;

private:
  void add(const Frequency& k, const ComplexSurd& c);
  std::map<Frequency, ComplexSurd> terms_; // no zero coefficients
};

// A signal linear in the free parameters of an allowed form:
// Σ_k Σ_j p_j c_{kj} e^{i k·angles}.
class SignalSeries {
public:
  void add_term(int parameter, const Surd& coefficient, const TrigPoly& angles);
  void add(const SignalSeries& other, const Surd& factor);
  bool is_zero() const { return terms_.empty(); }
  const std::map<Frequency, std::map<int, ComplexSurd>>& terms() const { return terms_; }
  // ∂/∂φ (the current azimuth): multiplies each term by i·k_φ.
  SignalSeries derivative_phi() const;
  // The part of the series at drive frequency ±n (n >= 0), with the drive angle removed.
  SignalSeries at_drive_harmonic(int n) const;

private:
  std::map<Frequency, std::map<int, ComplexSurd>> terms_;
};

// One real Fourier term: coefficient · cos(k·angles) (or sin), the
// coefficient an exact combination of parameters. k is canonical: its first
// nonzero entry is positive; k = 0 is the constant term (a cosine).
struct FourierTerm {
  Frequency k{};
  bool sine = false;
  Combination coefficient; // sorted by parameter
};

// The real form of a real signal (c_{-k} = conj(c_k) holds for every
// contraction of a real tensor with real directions).
std::vector<FourierTerm> real_fourier_terms(const SignalSeries& s);

// "cos(3φ)", "sin(φ - φ_B)", "1" for the angle function of a term.
std::string angle_function_text(const FourierTerm& t, bool latex = false);

// Exact value of a term's angle function at angles that are multiples of 15°
// (given in degrees); throws Error(internal) for other angles.
Surd angle_function_value(const FourierTerm& t, const std::array<int, angle_count>& degrees);
// cos and sin of a multiple of 15°, exactly.
Surd cos_degrees(int degrees);
Surd sin_degrees(int degrees);
double angle_function_double(const FourierTerm& t, const std::array<double, angle_count>& radians);

} // namespace ts
