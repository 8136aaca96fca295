#include "core/error.hpp"
#include "figure/image_ink.hpp"

#include <cairo.h>

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

ImageInk png_ink(const std::string& png_bytes, const std::string& what) {
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
  for (int y = 0; y < out.height; ++y)
    for (int x = 0; x < out.width; ++x) {
      const std::uint32_t v = pixel(x, y);
      int diff = 0;
      for (int c = 0; c < 3; ++c) diff += std::abs(static_cast<int>((v >> (8 * c)) & 0xff) - static_cast<int>((background >> (8 * c)) & 0xff));
      if (diff > 48) ++inked;
      const int r = (v >> 16) & 0xff, g = (v >> 8) & 0xff, b = v & 0xff;
      if (std::abs(r - g) > 40 || std::abs(g - b) > 40 || std::abs(r - b) > 40) ++coloured;
    }
  const double n = static_cast<double>(out.width) * out.height;
  out.ink = inked / n;
  out.coloured = coloured / n;
  cairo_surface_destroy(s);
  return out;
}

} // namespace ts
