#include "geometry/sample_frame.hpp"

#include "core/error.hpp"

namespace ts {

Frame frame_from_vectors(const Vec3& z, const std::string& z_label, const Vec3& x, const std::string& x_label,
                         LatticeKind lattice, const std::string& where) {
  if (!dot(z, x).is_zero())
    fail(ErrorKind::bad_geometry, "x " + x_label + " is not perpendicular to z " + z_label, where,
         "an x direction in the plane perpendicular to z");
  Frame f;
  Vec3 y = cross(z, x);
  f.axes = {x, y, z};
  std::array<long, 3> uvw{};
  std::string y_label = cartesian_to_lattice_direction(y, lattice, &uvw) ? direction_str(uvw) : vec_str(y);
  f.labels = {x_label, y_label, z_label};
  f.validate();
  return f;
}

Frame frame_from_directions(const std::string& z, const std::string& x, LatticeKind lattice, const std::string& where) {
  LatticeDirection dz = parse_direction(z, where), dx = parse_direction(x, where);
  return frame_from_vectors(direction_vector(dz, lattice, where), dz.text, direction_vector(dx, lattice, where),
                            dx.text, lattice, where);
}

} // namespace ts
