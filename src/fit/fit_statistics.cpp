#include "fit/fit_statistics.hpp"

#include <cmath>
#include <limits>

namespace ts {

namespace {

constexpr int kIterations = 500;
constexpr double kEps = 1e-15;
constexpr double kTiny = 1e-300;

// Series for P(a, x), good for x < a + 1 (A&S 6.5.29).
double gamma_p_series(double a, double x) {
  double sum = 1.0 / a, term = sum, ap = a;
  for (int n = 0; n < kIterations; ++n) {
    ap += 1.0;
    term *= x / ap;
    sum += term;
    if (std::fabs(term) < std::fabs(sum) * kEps) break;
  }
  return sum * std::exp(-x + a * std::log(x) - std::lgamma(a));
}

// Continued fraction for Q(a, x), good for x >= a + 1 (modified Lentz).
double gamma_q_fraction(double a, double x) {
  double b = x + 1.0 - a, c = 1.0 / kTiny, d = 1.0 / b, h = d;
  for (int i = 1; i < kIterations; ++i) {
    const double an = -i * (i - a);
    b += 2.0;
    d = an * d + b;
    if (std::fabs(d) < kTiny) d = kTiny;
    c = b + an / c;
    if (std::fabs(c) < kTiny) c = kTiny;
    d = 1.0 / d;
    const double del = d * c;
    h *= del;
    if (std::fabs(del - 1.0) < kEps) break;
  }
  return std::exp(-x + a * std::log(x) - std::lgamma(a)) * h;
}

// Continued fraction of the incomplete beta function (A&S 26.5.8, Lentz).
double beta_fraction(double a, double b, double x) {
  const double qab = a + b, qap = a + 1.0, qam = a - 1.0;
  double c = 1.0, d = 1.0 - qab * x / qap;
  if (std::fabs(d) < kTiny) d = kTiny;
  d = 1.0 / d;
  double h = d;
  for (int m = 1; m < kIterations; ++m) {
    const int m2 = 2 * m;
    double aa = m * (b - m) * x / ((qam + m2) * (a + m2));
    d = 1.0 + aa * d;
    if (std::fabs(d) < kTiny) d = kTiny;
    c = 1.0 + aa / c;
    if (std::fabs(c) < kTiny) c = kTiny;
    d = 1.0 / d;
    h *= d * c;
    aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
    d = 1.0 + aa * d;
    if (std::fabs(d) < kTiny) d = kTiny;
    c = 1.0 + aa / c;
    if (std::fabs(c) < kTiny) c = kTiny;
    d = 1.0 / d;
    const double del = d * c;
    h *= del;
    if (std::fabs(del - 1.0) < kEps) break;
  }
  return h;
}

} // namespace

double regularized_gamma_q(double a, double x) {
  if (x <= 0) return 1.0;
  if (x < a + 1.0) return 1.0 - gamma_p_series(a, x);
  return gamma_q_fraction(a, x);
}

double regularized_beta(double a, double b, double x) {
  if (x <= 0) return 0.0;
  if (x >= 1) return 1.0;
  const double front =
      std::exp(std::lgamma(a + b) - std::lgamma(a) - std::lgamma(b) + a * std::log(x) + b * std::log1p(-x));
  if (x < (a + 1.0) / (a + b + 2.0)) return front * beta_fraction(a, b, x) / a;
  return 1.0 - front * beta_fraction(b, a, 1.0 - x) / b;
}

double chi2_upper_tail(double chi2, int dof) {
  if (dof <= 0) return std::numeric_limits<double>::quiet_NaN();
  return regularized_gamma_q(0.5 * dof, 0.5 * chi2);
}

double f_upper_tail(double f, int d1, int d2) {
  if (d1 <= 0 || d2 <= 0) return std::numeric_limits<double>::quiet_NaN();
  if (f <= 0) return 1.0;
  return regularized_beta(0.5 * d2, 0.5 * d1, d2 / (d2 + d1 * f));
}

} // namespace ts
