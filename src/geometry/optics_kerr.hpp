// Linear magneto-optics of a face: which Kerr geometries a magnetic group
// allows and which quadratic (Voigt-type) terms a magnetisation direction
// brings (docs/optics.md).
//
// The antisymmetric part of the dielectric tensor, eps^a_ij = i eps_ijk g_k,
// is carried by the gyration vector g, a time-odd axial vector with the
// symmetry of a ferromagnetic moment. With the plane of incidence at the
// azimuth ψ from sample x (in-plane unit vector p = (cos ψ, sin ψ, 0)):
//   polar Kerr (and Faraday rotation at normal incidence) reads n·g = g_z,
//   longitudinal Kerr reads p·g = g_x cos ψ + g_y sin ψ,
//   transverse Kerr (a change of the P reflectance, no rotation) reads
//   (n × p)·g = -g_x sin ψ + g_y cos ψ.
// The part even in the magnetisation, Δeps_ij = q_ijkl m_k m_l with q i-type
// (allowed in every grey group), is the magnetic linear birefringence; the same
// form holds for the Néel vector of a collinear antiferromagnet.
#pragma once

#include "geometry/bar_measurement.hpp"

#include <string>
#include <vector>

namespace ts {

struct KerrReading {
  std::string geometry;           // "polar", "longitudinal", "transverse"
  std::string reads;              // "n·g" ...
  std::vector<FourierTerm> terms; // in ψ (the phi slot): azimuth of the plane of incidence
  bool allowed() const { return !terms.empty(); }
};

// `g_form`: the allowed form of the gyration vector (rank 1) in the sample frame.
std::vector<KerrReading> kerr_readings(const AllowedForm& g_form);

struct VoigtReading {
  std::string indices;            // "xx-yy" (the normal-incidence linear birefringence), "xy", "xx", ...
  std::vector<FourierTerm> terms; // in the angles of the magnetisation direction
};

// `q_form`: the allowed form of q_ijkl (indices P, light, M, M) in the sample
// frame; `m`: the magnetisation direction as a vector of the measurement angles.
std::vector<VoigtReading> voigt_readings(const AllowedForm& q_form, const TrigVector& m);

} // namespace ts
