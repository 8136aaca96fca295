// What a Hall bar reads from one response part: the exact signal of the
// longitudinal and the transverse probe as a Fourier series in the angles of
// the measurement, its order in the current and in the field, the lock-in
// readings at each harmonic for the drive waveform, and the split of the
// transverse signal into the part that follows from the longitudinal one
// (dissipative) and a dissipationless Hall part.
//
// Contraction (docs/hall-bars.md): for a part E_a = T_{a b...} j_b ... B_d ...
// (drive = current) the probe along p reads p·E with every current index
// contracted with u and every field (or magnetisation) index with b. A Hall-
// vector index h (E = h × j) is contracted with u × p, so only the transverse
// probe sees it, through n·h. A part written for a driving field
// (j = sigma·E ...) is contracted the same way, with j = E × h for a Hall
// vector; a current-driven bar reads it through the resistivity, to leading
// order E^(n) = -rho0^(n+1) sigma^(n) j^n for an isotropic rho0 and a small Hall
// angle, which keeps the angle dependence and flips the sign.
#pragma once

#include "geometry/angle_series.hpp"
#include "geometry/bar_measurement.hpp"
#include "response/response_catalogue.hpp"

#include <string>
#include <vector>

namespace ts {

enum class Probe { longitudinal = 0, transverse = 1 };
const char* probe_name(Probe p); // "longitudinal (∥)", "transverse (⊥)"

struct ProbeSignal {
  Probe probe = Probe::longitudinal;
  SignalSeries series;             // S_p: E_p per power j^n, in the part's own convention
  std::vector<FourierTerm> terms;  // its real Fourier terms
  // Transverse probe, current rotating and the field not tied to it: the exact
  // split T = L'/(n+1) + H (docs/hall-bars.md).
  std::vector<FourierTerm> gradient_terms, hall_terms;
  // Current azimuths (multiples of 15°, 0-345) at which this probe reads zero
  // for every parameter value; filled when the current rotates and the signal
  // depends on no other angle.
  std::vector<int> zero_azimuths;
  // Current azimuths (degrees, 0 <= φ < 360) at which |signal| is largest, when
  // the signal is one harmonic of φ alone (otherwise they depend on the parameters).
  std::vector<double> largest_azimuths;
  bool reads() const { return !terms.empty(); }
};

// Lock-in reading of V = R_n I^n at harmonic k of the drive (k = 0: DC):
// X = x·R_n·I_rms^n, Y = y·R_n·I_rms^n, exact factors.
struct HarmonicFactor {
  int harmonic = 0;
  Surd x, y; // for k = 0, x is the DC factor and y is zero
};
std::vector<HarmonicFactor> lock_in_factors(int order, Waveform w);

struct PartSignal {
  const ResponsePart* part = nullptr;
  int current_order = 0;        // n: the power of the current (harmonics n, n-2, ...)
  int joule_order = 0;          // joule indices: the heat gradient along the normal, each ∝ I²
  int field_order = 0;          // powers of B or M
  std::string field_role;       // "B", "M" or empty
  bool needs_field = false;     // field_order > 0 but the measurement has no field
  bool hall_split = false;      // gradient_terms / hall_terms are filled
  ProbeSignal longitudinal, transverse;
  std::vector<HarmonicFactor> harmonics;
  bool reads() const { return longitudinal.reads() || transverse.reads(); }
  // Powers of the current's direction: n less the two of each joule index.
  int direction_order() const { return current_order - 2 * joule_order; }
};

// Whether a part meets a Hall bar at all (a transport part with a drive kind).
bool is_bar_part(const ResponsePart& part);

// `form` is the part's allowed form in the sample frame (z = film normal).
PartSignal bar_signal(const ResponsePart& part, const AllowedForm& form, const BarMeasurement& m);

} // namespace ts
