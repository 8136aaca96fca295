// The statistics of a fit comparison, in double precision: upper tail of the
// χ² distribution, of Fisher's F distribution, and the information criteria.
// Fits are floating point by nature; nothing here decides a symmetry zero.
#pragma once

namespace ts {

// P(χ²_dof >= chi2): the probability of a χ² at least this large if the model holds.
double chi2_upper_tail(double chi2, int dof);
// P(F(d1, d2) >= f).
double f_upper_tail(double f, int d1, int d2);

// The regularised incomplete functions behind them (Abramowitz & Stegun 6.5, 26.5).
double regularized_gamma_q(double a, double x);
double regularized_beta(double a, double b, double x);

} // namespace ts
