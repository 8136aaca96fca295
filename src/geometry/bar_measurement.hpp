// A Hall-bar measurement: the current direction u in the film plane (fixed, or
// rotating with the azimuth φ from sample x), the probes (longitudinal along
// u, transverse along v = n × u), the direction of the applied field or of the
// saturated magnetisation, the drive waveform, and optionally the bar's size
// and the current. Sign conventions: V_∥ = φ(upstream) - φ(downstream) =
// L u·E, V_⊥ = φ(-v edge) - φ(+v edge) = w v·E (docs/hall-bars.md).
#pragma once

#include "geometry/angle_series.hpp"
#include "geometry/sample_frame.hpp"

#include <optional>
#include <string>

namespace ts {

enum class FieldGeometry {
  none,           // no field: parts with B or M indices are not read
  in_plane,       // in the film plane at the azimuth φ_B from sample x
  normal,         // along the film normal n
  any,            // polar angle θ_B from n and azimuth φ_B: every direction
  along_current,  // b = u
  across_current, // b = v = n × u
  fixed,          // a given direction (crystal [uvw], or in plane at a given angle)
};
const char* field_geometry_name(FieldGeometry g);

enum class Waveform { sine, cosine };

struct BarMeasurement {
  std::string name;
  bool rotating = true;       // the current azimuth φ is a variable
  std::array<Surd, 3> u{};    // fixed current direction (unit, sample frame)
  std::string current_label;  // "[100]", "30° from x", "rotating (φ from x)"
  FieldGeometry field = FieldGeometry::any;
  std::array<Surd, 3> b{};    // fixed field direction (unit, sample frame)
  std::string field_label;
  Waveform waveform = Waveform::sine;
  std::optional<double> current_rms, length, width, thickness; // A, m (optional, for numbers)
  std::string where;
  // j_rms = I_rms/(w t) in A/m², when the current and the cross-section are given.
  std::optional<double> current_density_rms() const {
    if (!current_rms || !width || !thickness) return std::nullopt;
    return *current_rms / (*width * *thickness);
  }
};

// "rotating", "[uvw]" (a crystal direction in the plane), or an angle from
// sample x in degrees that is a multiple of 15 ("30", "30deg").
void set_bar_current(BarMeasurement& m, const std::string& text, const SampleFrame& sf, const std::string& system,
                     LatticeKind lattice, const LatticeMetric& metric);
// "none", "in-plane", "normal", "any", "along-current", "across-current",
// "[uvw]", or "in-plane:45" (an in-plane angle from sample x, multiple of 15°).
void set_bar_field(BarMeasurement& m, const std::string& text, const SampleFrame& sf, const std::string& system,
                   LatticeKind lattice, const LatticeMetric& metric);
Waveform parse_waveform(const std::string& text, const std::string& where, ErrorKind bad_value);

using TrigVector = std::array<TrigPoly, 3>;
TrigVector current_vector(const BarMeasurement& m);    // u
TrigVector transverse_vector(const BarMeasurement& m); // v = n × u
TrigVector field_vector(const BarMeasurement& m);      // b (zero vector for none)

// The unit vector of a crystal direction in the sample frame, exactly.
std::array<Surd, 3> sample_unit_vector(const Vec3& crystal_vector, const Frame& frame, const std::string& where);

} // namespace ts
