// The sample frame, built in one place for every command: z along the film
// normal (a cut (hkl) or a direction [uvw]), x along a chosen in-plane crystal
// direction (or the default of the trade), y = z × x. Bulk samples without a
// normal keep the crystal frame.
#pragma once

#include "geometry/lattice_metric.hpp"

#include <string>

namespace ts {

struct FrameRequest {
  std::string cut;   // "(110)", "(11-20)" or "[111]"; empty: no cut
  std::string z;     // sample z as a direction, only without a cut
  std::string x;     // in-plane direction; empty: the default below
  std::string where; // option or file, for messages
};

struct SampleFrame {
  Frame frame;
  bool has_normal = false;  // a cut or z was given
  Vec3 normal{};            // exact, unnormalised (frame.axes[2]); [001] without a cut or z
  std::string normal_label; // "normal of (001) = [001]", "[111]"
};

// Defaults for x (common practice): (001) x ∥ [100]; (110) x ∥ [001];
// (111) x ∥ [1-10]; otherwise the first low-index direction in the plane.
// Refused (bad_geometry) when x is not perpendicular to the normal, when x is
// given without a normal, or when a direction needs lattice parameters that
// are missing.
SampleFrame build_sample_frame(const FrameRequest& request, const std::string& system, LatticeKind lattice,
                               const LatticeMetric& metric);

} // namespace ts
