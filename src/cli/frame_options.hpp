// The frame options shared by `form` and `response`: --z and --x (x defaults
// to a low-index direction perpendicular to z) and the lattice parameters that oblique directions need.
#pragma once

#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "geometry/sample_frame.hpp"
#include "report/form_report.hpp"

#include <CLI/CLI.hpp>

#include <string>

namespace ts::cli {

struct FrameOptions {
  std::string z, x, a, b, c;
};

inline void add_frame_options(CLI::App& cmd, FrameOptions& o) {
  cmd.add_option("--z", o.z, "report components in a frame with z along this crystal direction, e.g. [110]");
  cmd.add_option("--x", o.x, "x axis of that frame (perpendicular to z; default: a low-index direction), e.g. [001]");
  cmd.add_option("--a", o.a, "lattice parameter a (needed where a direction depends on axis ratios)");
  cmd.add_option("--b", o.b, "lattice parameter b");
  cmd.add_option("--c", o.c, "lattice parameter c");
}

inline std::optional<Rational> length_option(const std::string& s, const char* name) {
  if (s.empty()) return std::nullopt;
  return decimal_length(s, std::string("--") + name, ErrorKind::usage);
}

inline LatticeMetric metric_option(const FrameOptions& o) {
  LatticeMetric m;
  m.a = length_option(o.a, "a");
  m.b = length_option(o.b, "b");
  m.c = length_option(o.c, "c");
  if (!m.a && (m.b || m.c)) fail(ErrorKind::usage, "give a together with b or c", "--a", "--a 3.9 --c 4.1");
  return m;
}

// The frame x, y = z × x, z in the group's crystal axes, with the metric applied to
// the directions: [110] of an orthorhombic crystal is a + b, not the Cartesian (1,1,0).
inline Frame frame_from_options(const FrameOptions& o, const NamedGroup& g, FrameContext* fc) {
  const LatticeKind lattice = g.group.lattice();
  if (o.z.empty() && !o.x.empty())
    fail(ErrorKind::usage, "--x needs --z (the frame's z axis)", "--x", "--z [110] --x [001]");
  Frame frame = build_sample_frame({"", o.z, o.x, "--z/--x"}, g.crystal->system, lattice, metric_option(o)).frame;
  if (o.z.empty()) {
    if (lattice == LatticeKind::hexagonal) fc->axes = {"[100]", "[120]", "[001]"};
    return frame;
  }
  fc->axes = frame.labels;
  fc->crystal_frame = false;
  return frame;
}

} // namespace ts::cli
