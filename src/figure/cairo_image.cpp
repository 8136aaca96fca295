#include "core/error.hpp"
#include "figure/image_ink.hpp"

#include <cairo.h>

#include <algorithm>
#include <cstdint>
#include <cstdlib>
#include <cstring>

namespace ts {

namespace {

struct Reader {
  const std::string* bytes;
  std::size_t at = 0;
};

cairo_status_t read_bytes(void* closure, unsigned char* data, unsigned int length) {
  auto* r = static_cast<Reader*>(closure);
  if (r->at + length > r->bytes->size()) return CAIRO_STATUS_READ_ERROR;
  std::memcpy(data, r->bytes->data() + r->at, length);
  r->at += length;
  return CAIRO_STATUS_SUCCESS;
}

} // namespace

ImageInk png_ink(const std::string& png_bytes, const std::string& what) { return png_ink(png_bytes, what, 0, 0, 1, 1); }

ImageInk png_ink(const std::string& png_bytes, const std::string& what, double fx0, double fy0, double fx1, double fy1) {
  Reader reader{&png_bytes};
  cairo_surface_t* s = cairo_image_surface_create_from_png_stream(read_bytes, &reader);
  if (cairo_surface_status(s) != CAIRO_STATUS_SUCCESS) {
    cairo_surface_destroy(s);
    fail(ErrorKind::bad_file, what + " is not a readable PNG image");
  }
  cairo_surface_flush(s);
  ImageInk out;
  out.width = cairo_image_surface_get_width(s);
  out.height = cairo_image_surface_get_height(s);
  const int stride = cairo_image_surface_get_stride(s);
  const unsigned char* data = cairo_image_surface_get_data(s);
  const cairo_format_t format = cairo_image_surface_get_format(s);
  if (!data || (format != CAIRO_FORMAT_ARGB32 && format != CAIRO_FORMAT_RGB24) || out.width == 0 || out.height == 0) {
    cairo_surface_destroy(s);
    fail(ErrorKind::bad_file, what + " has no pixels in an RGB format");
  }
  auto pixel = [&](int x, int y) {
    std::uint32_t v;
    std::memcpy(&v, data + static_cast<std::size_t>(y) * stride + 4 * x, 4);
    return v;
  };
  const std::uint32_t background = pixel(0, 0);
  long inked = 0, coloured = 0;
  const int xa = static_cast<int>(fx0 * out.width), xb = static_cast<int>(fx1 * out.width);
  const int ya = static_cast<int>(fy0 * out.height), yb = static_cast<int>(fy1 * out.height);
  for (int y = std::max(0, ya); y < std::min(out.height, yb); ++y)
    for (int x = std::max(0, xa); x < std::min(out.width, xb); ++x) {
      const std::uint32_t v = pixel(x, y);
      int diff = 0;
      for (int c = 0; c < 3; ++c) diff += std::abs(static_cast<int>((v >> (8 * c)) & 0xff) - static_cast<int>((background >> (8 * c)) & 0xff));
      if (diff > 48) ++inked;
      const int r = (v >> 16) & 0xff, g = (v >> 8) & 0xff, b = v & 0xff;
      if (std::abs(r - g) > 40 || std::abs(g - b) > 40 || std::abs(r - b) > 40) ++coloured;
    }
  const double n = std::max(1.0, static_cast<double>(std::min(out.width, xb) - std::max(0, xa)) *
                                      (std::min(out.height, yb) - std::max(0, ya)));
  out.ink = inked / n;
  out.coloured = coloured / n;
  cairo_surface_destroy(s);
  return out;
}

} // namespace ts
