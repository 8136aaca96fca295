// Fresnel / local-field factors of second-harmonic polarimetry. With the
// factors on, the field that drives the source and the field that the
// source radiates are weighted per lab axis: the amplitude becomes
//   A = Σ e_out,i L_i(2ω) χ_ijk L_j(ω) e_in,j L_k(ω) e_in,k
// (Sipe, "New Green-function formalism for surface optics", J. Opt. Soc.
// Am. B 4, 481 (1987); Heinz, "Second-order nonlinear optical effects at
// surfaces and interfaces", in Nonlinear Surface Electromagnetic Phenomena,
// 1991). The six factors enter the exact amplitudes as symbols, so they
// never decide a zero; the numbers computed here from refractive indices
// are for display and for the illustrative curves only.
//
// The numeric model is the two-medium one: a transparent ambient of index
// n1 above a substrate or thick film of complex index n2 = n' + i n''
// (n'' ≥ 0 absorbs, fields going as exp(i(k·r - ωt))), the source sitting
// just inside medium 2. With k_z1 = n1 cos θ and k_z2 = sqrt(n2² - n1² sin²θ)
// on the branch Im k_z2 ≥ 0 (a wave that decays into medium 2; under total
// internal reflection k_z2 is imaginary), from the Fresnel transmission
// coefficients t_s = 2 k_z1 / (k_z1 + k_z2) and t_p = 2 n1 n2 cos θ / (n2² cos θ + n1 k_z2):
//   L_x = t_p cos θ2 / cos θ = 2 n1 k_z2 / (n2² cos θ + n1 k_z2)
//   L_y = t_s
//   L_z = t_p n1 / n2       = 2 n1² cos θ / (n2² cos θ + n1 k_z2)
// at ω with n2(ω) and at 2ω with n2(2ω); in reflection the second harmonic
// leaves at θ again (the ambient is taken without dispersion), and by
// reciprocity its factors have the same form.
#pragma once

#include "core/error.hpp"

#include <array>
#include <complex>
#include <string>

namespace ts {

using Complex = std::complex<double>;

// The six symbols, in the order of OpticalMonomial::field.
enum class LocalFieldSymbol { x_omega, y_omega, z_omega, x_two_omega, y_two_omega, z_two_omega };
constexpr int local_field_symbol_count = 6;
// "Lx_w", "Lz_2w" (plain text, a valid identifier) or "L_{x}(\omega)" (LaTeX).
std::string local_field_symbol_name(int symbol, bool latex = false);

// A refractive index as written by the user and as a number.
struct RefractiveIndex {
  std::string text;
  Complex value;
};

// "2.2", "2.2+0.01i", "2.2 - 0.01i", "1": a complex index with a real part > 0
// and an imaginary part ≥ 0 (absorption). `ambient`: the imaginary part must be
// zero. Throws Error(kind) naming `where` and the valid forms.
RefractiveIndex parse_refractive_index(const std::string& text, bool ambient, ErrorKind kind, const std::string& where);

struct RefractiveIndices {
  RefractiveIndex ambient{"1", Complex(1, 0)}, omega, two_omega;
};

// t_s, t_p and cos θ2 of light entering medium 2 from medium 1 at the angle θ
// (radians) on the physical branch (Im n2 cos θ2 ≥ 0).
struct FresnelTransmission {
  Complex t_s, t_p, cos_refracted;
};
FresnelTransmission fresnel_transmission(Complex n1, Complex n2, double theta);

// L_x, L_y, L_z of the two-medium model at one frequency.
std::array<Complex, 3> interface_local_field(Complex n1, Complex n2, double theta);

// All six values, in symbol order, for the indices at the angle of incidence
// (degrees). Throws Error(bad_geometry) naming `where` when a factor vanishes
// (light refracted along the surface at the critical angle).
std::array<Complex, local_field_symbol_count> local_field_values(const RefractiveIndices& n, int incidence_deg,
                                                                 const std::string& where);

// "0.5312+0.0021i" with four decimals, for reports.
std::string complex_text(Complex z);

} // namespace ts
