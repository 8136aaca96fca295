// Second-harmonic polarimetry on a film or crystal face: which polariser /
// analyser channels radiate light at 2ω, as the sample turns about its normal
// (rotational anisotropy) or as the polariser turns in front of a fixed
// analyser. The lab frame has the sample normal along +z and the plane of
// incidence xz; the light arrives at the angle of incidence θ from the normal
// (docs/optics.md):
//   k_in = (sin θ, 0, -cos θ),  P_in = (cos θ, 0, sin θ),   S = (0, 1, 0),
//   reflection:   k_out = (sin θ, 0, cos θ),   P_out = (-cos θ, 0, sin θ),
//   transmission: k_out = k_in,                P_out = P_in.
// A polarisation at angle α is cos α P + sin α S (α = 0: P, α = 90°: S).
// Turning the sample by the azimuth φ (counterclockwise seen from +n) is the
// same as turning every lab vector by -φ in the sample frame, where the
// allowed forms live.
//
// Each source part of the catalogue meets the light through the roles of its
// indices: P (polarisation at 2ω) is read along the analyser ê_out, M (a
// magnetic dipole at 2ω) along k_out × ê_out, a quadrupole pair Q Q along
// ê_out and k_out, the driving field "light" along ê_in, its magnetic field H
// along k_in × ê_in and a gradient k along k_in. The amplitude of a channel is
// then linear in the free parameters of the form, and each parameter carries
// an exact function of θ, φ and the polarisation angles. Only the angular
// dependence and the zeros are claimed: the prefactors of the different
// source kinds (ω/c, refractive indices, the film thickness) are not.
//
// θ is kept as a variable (powers of cos θ and sin θ, with sin²θ = 1 - cos²θ
// so that a zero is a zero) or fixed at a multiple of 15°; the other angles
// are exact Fourier series (angle_series.hpp).
#pragma once

#include "geometry/angle_series.hpp"
#include "geometry/local_field.hpp"
#include "response/response_catalogue.hpp"

#include <array>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace ts {

// cos^a θ sin^b θ times a product of powers of the local-field symbols
// (local_field.hpp; all powers zero when no factors are applied).
struct OpticalMonomial {
  int cos_theta = 0, sin_theta = 0;
  std::array<int, local_field_symbol_count> field{};
  friend bool operator<(const OpticalMonomial& a, const OpticalMonomial& b) {
    if (a.cos_theta != b.cos_theta) return a.cos_theta < b.cos_theta;
    if (a.sin_theta != b.sin_theta) return a.sin_theta < b.sin_theta;
    return a.field < b.field;
  }
  friend OpticalMonomial operator*(const OpticalMonomial& a, const OpticalMonomial& b);
};

// A trigonometric polynomial that also depends on θ through cos^a θ sin^b θ,
// b = 0 or 1 (sin²θ is rewritten as 1 - cos²θ, so the representation is
// canonical and is_zero() is exact), and polynomially on the local-field
// symbols, which are independent of everything else: a zero is exact for
// every value of the factors.
class ThetaTrig {
public:
  ThetaTrig() = default;
  ThetaTrig(const TrigPoly& p); // NOLINT: a polynomial without θ
  static ThetaTrig of(const OpticalMonomial& m); // the one-term polynomial 1·m
  static ThetaTrig cos_theta();
  static ThetaTrig sin_theta();
  static ThetaTrig local_field(int symbol); // one factor L (local_field.hpp)
  bool is_zero() const { return terms_.empty(); }
  const std::map<OpticalMonomial, TrigPoly>& terms() const { return terms_; }
  friend ThetaTrig operator+(const ThetaTrig& a, const ThetaTrig& b);
  friend ThetaTrig operator*(const ThetaTrig& a, const ThetaTrig& b);
  ThetaTrig scaled(const Surd& s) const;

private:
  void add(OpticalMonomial key, const TrigPoly& p);
  std::map<OpticalMonomial, TrigPoly> terms_;
};

using OpticalVector = std::array<ThetaTrig, 3>;

enum class OpticsMode { reflection, transmission };
const char* optics_mode_name(OpticsMode m);

// A polariser or analyser: fixed at an angle from P (multiple of 15°), or turning.
struct Polariser {
  bool rotating = false;
  int degrees = 0; // 0: P, 90: S
};

struct OpticalChannel {
  std::string name; // "PP" (in-out), "PS", "SP", "SS", "45-P", "rotating-P"
  Polariser in, out;
};

// "PP", "PS", "SP", "SS"; "IN-OUT" with IN, OUT each P, S, an angle from P in
// degrees (multiple of 15) or "rotating" (the polariser only), e.g.
// "rotating-P", "45-S".
OpticalChannel parse_optical_channel(const std::string& text, const std::string& where);

// Fresnel / local-field factors of a setup (local_field.hpp): off, as
// symbols only, or as symbols with numbers from refractive indices.
struct LocalFieldSetting {
  bool applied = false;
  std::optional<RefractiveIndices> indices;
  std::array<Complex, local_field_symbol_count> values{}; // when indices are given
};

struct OpticalMeasurement {
  std::string name;
  OpticsMode mode = OpticsMode::reflection;
  std::optional<int> incidence_deg; // empty: θ is a variable
  bool azimuth_rotating = true;     // the sample turns about its normal
  int azimuth_deg = 0;              // fixed azimuth otherwise (multiple of 15)
  std::vector<OpticalChannel> channels;
  LocalFieldSetting local_field;
  std::string where;
};

// From the words of a scenario table or option: geometry "reflection" or
// "transmission"; incidence "any" or degrees 0-75 (multiple of 15); azimuth
// "rotating" or degrees (multiple of 15); channels (empty: PP, PS, SP, SS).
// Throws Error(bad_geometry) naming `where` and the valid values.
OpticalMeasurement make_optical_measurement(const std::string& name, const std::string& geometry,
                                            const std::string& incidence, const std::string& azimuth,
                                            const std::vector<std::string>& channels, const std::string& where);

// Turns the factors on for a measurement, as symbols, and with numbers when
// indices are given. The two-medium model is one of reflection at a fixed
// angle of incidence, so transmission, a variable θ with indices, or a
// factor that vanishes throw Error(bad_geometry) naming `where`.
void apply_local_field(OpticalMeasurement& m, const std::optional<RefractiveIndices>& indices, const std::string& where);

// The unit vectors of one channel, in the sample frame. With local-field
// factors, e_in carries L(ω) and e_out L(2ω) on their lab components (the
// wave vectors carry none: only electric-dipole sources take factors).
struct ChannelVectors {
  OpticalVector e_in, e_out, k_in, k_out;
};
ChannelVectors channel_vectors(const OpticalMeasurement& m, const OpticalChannel& c);

// Whether a catalogue part radiates at 2ω from the driving light (SHG sources).
bool is_shg_part(const ResponsePart& part);

// The amplitude of one channel from one part: one function per free parameter.
struct ChannelAmplitude {
  std::vector<ThetaTrig> per_parameter;
  bool radiates() const;
};
ChannelAmplitude shg_amplitude(const ResponsePart& part, const AllowedForm& form, const ChannelVectors& v);

// One real Fourier term of an optical signal in the Fourier angles (φ,
// polariser, analyser): Σ over θ monomials of cos^a θ sin^b θ times an exact
// combination of parameters.
struct OpticalTerm {
  Frequency k{};
  bool sine = false;
  std::map<OpticalMonomial, Combination> by_theta;
};
std::vector<OpticalTerm> optical_terms(const ChannelAmplitude& a);

// The harmonics (canonical frequency vectors, as cos/sin terms) of the
// intensity Σ p_j p_l* f_j f_l for independent complex parameters, and of the
// interference Σ p_j q_l* f_j g_l between two sources: a harmonic is listed
// when some product f_j g_l has it, which is exact.
struct Harmonic {
  Frequency k{};
  bool sine = false;
  friend bool operator<(const Harmonic& a, const Harmonic& b) {
    return a.k != b.k ? a.k < b.k : a.sine < b.sine;
  }
  friend bool operator==(const Harmonic& a, const Harmonic& b) { return a.k == b.k && a.sine == b.sine; }
};
std::vector<Harmonic> product_harmonics(const ChannelAmplitude& a, const ChannelAmplitude& b);
std::string harmonic_text(const Harmonic& h, bool latex = false); // "1", "cos(6*phi)"

// The value of one parameter's function at given angles (θ, then the Fourier
// angles in radians) and values of the local-field factors, for sampling curves.
Complex theta_trig_value(const ThetaTrig& f, double theta, const std::array<double, angle_count>& radians,
                         const std::array<Complex, local_field_symbol_count>& factors);
// Whether a part is an electric-dipole source (roles P, light, light), the one
// kind the local-field factors are defined for here.
bool is_dipole_shg_part(const ResponsePart& part);

} // namespace ts
