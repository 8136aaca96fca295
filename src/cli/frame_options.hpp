// The --z/--x options shared by `form` and `response`: both or neither.
#pragma once

#include "core/error.hpp"
#include "geometry/sample_frame.hpp"
#include "report/form_report.hpp"

#include <string>

namespace ts::cli {

inline Frame frame_from_options(const std::string& z, const std::string& x, LatticeKind lattice, FrameContext* fc) {
  if (z.empty() && x.empty()) {
    if (lattice == LatticeKind::hexagonal) fc->axes = {"[100]", "[120]", "[001]"};
    return Frame{};
  }
  if (z.empty() || x.empty()) fail(ErrorKind::usage, "a frame needs both --z and --x", "--z/--x", "--z [110] --x [001]");
  Frame frame = frame_from_directions(z, x, lattice, "--z/--x");
  fc->axes = frame.labels;
  fc->crystal_frame = false;
  return frame;
}

} // namespace ts::cli
