#include "geometry/sample_frame.hpp"

#include "core/error.hpp"

#include <tuple>

namespace ts {

namespace {

Vec3 direction_vector(const std::string& text, const std::string& system, LatticeKind lattice,
                      const LatticeMetric& m, const std::string& where) {
  return metric_direction(parse_direction(text, where), system, lattice, m, where);
}

// The first low-index direction perpendicular to z, else z × (a crystal axis).
std::pair<Vec3, std::string> default_x(const Vec3& z, const std::string& system, LatticeKind lattice,
                                       const LatticeMetric& m) {
  static const std::array<long, 3> prefs[] = {{1, 0, 0},  {0, 0, 1}, {0, 1, 0}, {1, -1, 0}, {1, 1, 0},
                                              {1, 0, -1}, {0, 1, -1}, {1, 2, 0}, {1, -2, 0}, {2, -1, 0},
                                              {1, 1, -2}, {1, -2, 1}, {-2, 1, 1}};
  for (const auto& p : prefs) {
    LatticeDirection d;
    d.uvw = p;
    d.text = direction_str(p);
    bool mixed = lattice == LatticeKind::hexagonal && p[2] != 0 && (p[0] || p[1]);
    if (mixed && !m.c) continue;
    bool oblique_low_symmetry = (system == "monoclinic" || system == "triclinic") &&
                                (p[0] != 0) + (p[1] != 0) + (p[2] != 0) > 1;
    if (oblique_low_symmetry) continue;
    if (system == "orthorhombic" && (p[0] != 0) + (p[1] != 0) + (p[2] != 0) > 1 && !(m.a && m.b && m.c)) continue;
    if ((system == "tetragonal" || lattice == LatticeKind::hexagonal) && p[2] != 0 && (p[0] || p[1]) && !m.c) continue;
    Vec3 v = metric_direction(d, system, lattice, m, "default x");
    if (dot(v, z).is_zero()) return {v, d.text};
  }
  for (Vec3 e : {Vec3{QSqrt3(0), QSqrt3(0), QSqrt3(1)}, Vec3{QSqrt3(1), QSqrt3(0), QSqrt3(0)}})
    if (!parallel(e, z)) {
      Vec3 x = cross(e, z);
      return {x, lattice_direction_label(x, lattice, m)};
    }
  return {};
}

} // namespace

SampleFrame build_sample_frame(const FrameRequest& rq, const std::string& system, LatticeKind lattice,
                               const LatticeMetric& m) {
  SampleFrame sf;
  if (rq.cut.empty() && rq.z.empty()) {
    if (!rq.x.empty())
      fail(ErrorKind::bad_geometry, "sample x given without a cut or z", rq.where, "cut = \"(001)\" or z = \"[001]\"");
    sf.frame.labels = {"[100]", lattice == LatticeKind::hexagonal ? "[120]" : "[010]", "[001]"};
    // No cut: the sample is the crystal in its own axes, and a bar lies in its xy plane.
    sf.normal = {QSqrt3(0), QSqrt3(0), QSqrt3(1)};
    sf.normal_label = "sample z = [001]";
    return sf;
  }
  if (!rq.cut.empty() && !rq.z.empty())
    fail(ErrorKind::bad_geometry, "give either a cut or z, not both", rq.where,
         "cut = \"(110)\" for a film, z = \"[110]\" for a bulk sample");
  Vec3 z;
  if (!rq.cut.empty()) {
    CutNormal cn = parse_cut(rq.cut, system, lattice, m, rq.where + (rq.where.empty() ? "cut" : ": cut"));
    z = cn.normal;
    // " = [uvw]" only when the normal has integer indices that fit in 64 bits.
    const std::optional<std::string> uvw = lattice_direction_indices(z, lattice, m);
    sf.normal_label = cn.plane ? "normal of " + cn.text + (uvw ? " = " + *uvw : "") : cn.text;
  } else {
    z = direction_vector(rq.z, system, lattice, m, rq.where + (rq.where.empty() ? "z" : ": z"));
    sf.normal_label = parse_direction(rq.z, rq.where).text;
  }
  sf.has_normal = true;
  sf.normal = z;
  Vec3 x;
  std::string x_label;
  if (!rq.x.empty()) {
    std::string where = rq.where + (rq.where.empty() ? "x" : ": x");
    x = direction_vector(rq.x, system, lattice, m, where);
    x_label = parse_direction(rq.x, where).text;
    if (!dot(x, z).is_zero())
      fail(ErrorKind::bad_geometry,
           "sample x " + x_label + " does not lie in the sample plane (it is not perpendicular to " + sf.normal_label +
               ")",
           where, "a direction perpendicular to the normal");
  } else {
    std::tie(x, x_label) = default_x(z, system, lattice, m);
  }
  sf.frame.axes = {x, cross(z, x), z};
  sf.frame.labels = {x_label, lattice_direction_label(sf.frame.axes[1], lattice, m), sf.normal_label};
  sf.frame.validate();
  return sf;
}

} // namespace ts
