// Which bars to pattern: for one response part, the smallest set of bar
// orientations (and field directions) whose longitudinal and transverse
// readings determine every parameter that a planar bar can read. Each bar at
// a fixed direction gives, per probe and field direction, one linear equation
// in the free parameters with exact coefficients; the design is the smallest
// subset of candidate bars whose equations have the rank of all candidates
// together, the best conditioned among those (Eigen's SVD).
#pragma once

#include "geometry/bar_signal.hpp"

#include <string>
#include <vector>

namespace ts {

struct LayoutCandidate {
  std::string label;      // "[110]" or "30° from x"
  int azimuth_deg = 0;    // angle from sample x, rounded, for the table
  std::string azimuth;    // exact angle from sample x in words ("45°", "atan(1/2) = 26.57°")
  BarMeasurement bar;     // current fixed; the field set per row
};

struct LayoutRow {
  std::size_t candidate = 0;
  std::string field;      // field geometry label of this row
  Probe probe = Probe::longitudinal;
  std::vector<Surd> coefficients; // one per parameter of the form
};

struct LayoutDesign {
  const ResponsePart* part = nullptr;
  int parameters = 0;                     // independent parameters of the part
  std::vector<std::string> unreadable;    // parameters no candidate reads at all
  int rank_all = 0;                       // rank of every candidate together
  std::vector<LayoutCandidate> candidates;
  std::vector<LayoutRow> rows;
  std::vector<std::size_t> chosen;        // candidate indices of the design
  int rank_chosen = 0;
  double condition = 0;                   // σ_max/σ_min of the design's rows (nonzero σ)
  std::vector<std::string> fields;        // field geometries used per bar
  bool exhaustive = true;                 // minimality proven by trying every smaller subset
  // Combinations some candidate reads but no set of these candidates separates.
  int inseparable() const { return parameters - static_cast<int>(unreadable.size()) - rank_all; }
};

// `fields` are field geometries (field_geometry names, [uvw] or in-plane:ANGLE); parts
// without field indices use none.
LayoutDesign design_layout(const ResponsePart& part, const AllowedForm& form, std::vector<LayoutCandidate> candidates,
                           const std::vector<std::string>& fields, const SampleFrame& sf, const std::string& system,
                           LatticeKind lattice, const LatticeMetric& metric);

// Candidates: the given directions, or rosette angles, or every in-plane
// direction [uvw] with |u|, |v|, |w| <= 2 (one of each ± pair).
std::vector<LayoutCandidate> layout_candidates(const std::vector<std::string>& directions,
                                               const std::vector<int>& rosette, const SampleFrame& sf,
                                               const std::string& system, LatticeKind lattice,
                                               const LatticeMetric& metric, const std::string& where);

} // namespace ts
