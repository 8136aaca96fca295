// How much of a rendered picture is not background: used to check that a
// renderer (librsvg, poppler, a browser) drew something, not a blank page.
#pragma once

#include <string>

namespace ts {

struct ImageInk {
  int width = 0, height = 0;
  double ink = 0;      // fraction of pixels that differ clearly from the top-left pixel
  double coloured = 0; // fraction of pixels whose channels differ (not grey)
};

// A PNG image given as bytes; throws Error(bad_file) naming `what` when it is not a PNG.
ImageInk png_ink(const std::string& png_bytes, const std::string& what);
// The same for a rectangle of the image given as fractions of its width and height
// (0 0 1 1 is the whole image); width and height are still the whole image's.
ImageInk png_ink(const std::string& png_bytes, const std::string& what, double x0, double y0, double x1, double y1);

} // namespace ts
