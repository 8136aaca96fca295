#include "figure/figure_draw.hpp"

#include "core/error.hpp"
#include "core/output_file.hpp"

#include <cairo-pdf.h>
#include <cairo-svg.h>
#include <cairo.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <functional>

namespace ts {

namespace {

constexpr double pi = 3.14159265358979323846;

struct Rgb {
  double r, g, b;
};

// Okabe and Ito, "Color universal design" (2008): distinguishable with every
// common colour-vision deficiency; paired with dash patterns for greyscale.
const Rgb palette[] = {{0, 0, 0},
                       {0.0, 0.447, 0.698},   // blue
                       {0.835, 0.369, 0.0},   // vermillion
                       {0.0, 0.620, 0.451},   // bluish green
                       {0.800, 0.475, 0.655}, // reddish purple
                       {0.902, 0.624, 0.0},   // orange
                       {0.337, 0.706, 0.914}}; // sky blue
constexpr int palette_size = 7;

void set_curve_style(cairo_t* cr, int index) {
  const Rgb& c = palette[index % palette_size];
  cairo_set_source_rgb(cr, c.r, c.g, c.b);
  cairo_set_line_width(cr, 1.4);
  static const double dash1[] = {5, 2.5}, dash2[] = {1.5, 2}, dash3[] = {6, 2, 1.5, 2};
  switch (index % 4) {
  case 0: cairo_set_dash(cr, nullptr, 0, 0); break;
  case 1: cairo_set_dash(cr, dash1, 2, 0); break;
  case 2: cairo_set_dash(cr, dash2, 2, 0); break;
  default: cairo_set_dash(cr, dash3, 4, 0); break;
  }
}

// A measured point: a small filled circle in the current colour.
void marker(cairo_t* cr, double x, double y) {
  cairo_new_sub_path(cr);
  cairo_arc(cr, x, y, 2.2, 0, 2 * pi);
  cairo_fill(cr);
}

void set_axis_style(cairo_t* cr, double grey = 0, double width = 0.8) {
  cairo_set_source_rgb(cr, grey, grey, grey);
  cairo_set_line_width(cr, width);
  cairo_set_dash(cr, nullptr, 0, 0);
}

void font(cairo_t* cr, double size, bool bold = false) {
  cairo_select_font_face(cr, "DejaVu Sans", CAIRO_FONT_SLANT_NORMAL, bold ? CAIRO_FONT_WEIGHT_BOLD : CAIRO_FONT_WEIGHT_NORMAL);
  cairo_set_font_size(cr, size);
}

// Text anchored at (x, y): ax = 0 left, 0.5 centre, 1 right; the baseline at y.
void text(cairo_t* cr, const std::string& s, double x, double y, double ax = 0) {
  cairo_text_extents_t e;
  cairo_text_extents(cr, s.c_str(), &e);
  cairo_move_to(cr, x - ax * e.x_advance, y);
  cairo_show_text(cr, s.c_str());
}

double text_width(cairo_t* cr, const std::string& s) {
  cairo_text_extents_t e;
  cairo_text_extents(cr, s.c_str(), &e);
  return e.x_advance;
}

// Tick values 0, ±step, ... covering [lo, hi] with a 1-2-5 step.
std::vector<double> nice_ticks(double lo, double hi) {
  double span = hi - lo;
  if (!(span > 0)) span = 1;
  double raw = span / 4, mag = std::pow(10.0, std::floor(std::log10(raw))), step = mag;
  for (double m : {1.0, 2.0, 5.0, 10.0})
    if (m * mag >= raw) {
      step = m * mag;
      break;
    }
  std::vector<double> t;
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + 1e-9 * step; v += step) t.push_back(std::abs(v) < 1e-12 * step ? 0 : v);
  return t;
}

std::string tick_text(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%g", v);
  return buf;
}

struct Size {
  double w, h;
};

Size figure_size(const FigureData& f) {
  switch (f.kind) {
  case FigureKind::polar: {
    const int n = static_cast<int>(f.panels.size()), cols = std::min(n, 4), rows = (n + cols - 1) / cols;
    return {std::max(40.0 + cols * 200.0, 420.0), 70.0 + rows * 190.0};
  }
  case FigureKind::line: return {460, 320};
  case FigureKind::rosette: return {360, 380};
  }
  return {400, 300};
}

void draw_header(cairo_t* cr, const FigureData& f, Size s) {
  set_axis_style(cr);
  font(cr, 11, true);
  // A long title is set smaller rather than cut off.
  const double width = text_width(cr, f.title);
  if (width > s.w - 20) font(cr, std::max(6.0, 11 * (s.w - 20) / width), true);
  text(cr, f.title, s.w / 2, 20, 0.5);
  font(cr, 8);
  cairo_set_source_rgb(cr, 0.25, 0.25, 0.25);
  text(cr, f.note, s.w / 2, s.h - 10, 0.5);
}

void draw_polar(cairo_t* cr, const FigureData& f, Size s) {
  double peak = 0;
  for (const auto& panel : f.panels)
    for (const auto& c : panel)
      for (double v : c.y) peak = std::max(peak, std::abs(v));
  if (!(peak > 0)) peak = 1;
  const int n = static_cast<int>(f.panels.size()), cols = std::min(n, 4);
  const double left = (s.w - cols * 200.0) / 2;
  for (int p = 0; p < n; ++p) {
    const double cx = left + (p % cols) * 200.0 + 100, cy = 40 + (p / cols) * 190.0 + 100, radius = 70;
    set_axis_style(cr, 0.6, 0.5);
    for (double frac : {0.5, 1.0}) {
      cairo_new_path(cr);
      cairo_arc(cr, cx, cy, radius * frac, 0, 2 * pi);
      cairo_stroke(cr);
    }
    for (int a = 0; a < 360; a += 90) {
      cairo_move_to(cr, cx, cy);
      cairo_line_to(cr, cx + radius * std::cos(a * pi / 180), cy - radius * std::sin(a * pi / 180));
      cairo_stroke(cr);
    }
    set_axis_style(cr);
    font(cr, 7.5);
    text(cr, "0°", cx + radius + 3, cy + 3);
    text(cr, "90°", cx, cy - radius - 3, 0.5);
    text(cr, "180°", cx - radius - 3, cy + 3, 1);
    text(cr, "270°", cx, cy + radius + 10, 0.5);
    font(cr, 10, true);
    text(cr, f.panel_titles[p], cx - radius, cy - radius - 6);
    for (std::size_t k = 0; k < f.panels[p].size(); ++k) {
      const Curve& c = f.panels[p][k];
      // A panel of a fit holds several curves: each its own style.
      set_curve_style(cr, f.panels[p].size() > 1 ? static_cast<int>(k) : p + 1);
      cairo_new_path(cr);
      for (std::size_t i = 0; i < c.x.size(); ++i) {
        const double r = radius * std::abs(c.y[i]) / peak, a = c.x[i] * pi / 180;
        const double x = cx + r * std::cos(a), y = cy - r * std::sin(a);
        if (c.points) marker(cr, x, y);
        else if (i == 0) cairo_move_to(cr, x, y);
        else cairo_line_to(cr, x, y);
      }
      if (!c.points) cairo_stroke(cr);
    }
  }
  set_axis_style(cr);
  font(cr, 8);
  text(cr, f.x_label + " counterclockwise from 0°; radius: " + f.y_label + ", common scale", s.w / 2, s.h - 22, 0.5);
}

void draw_line(cairo_t* cr, const FigureData& f, Size s) {
  const double x0 = 70, x1 = s.w - 20, y0 = s.h - 60, y1 = 58;
  double lo = 0, hi = 0;
  for (const auto& c : f.panels[0])
    for (double v : c.y) {
      lo = std::min(lo, v);
      hi = std::max(hi, v);
    }
  if (hi - lo < 1e-12) {
    lo -= 1;
    hi += 1;
  }
  std::vector<double> yt = nice_ticks(lo, hi);
  lo = std::min(lo, yt.front());
  hi = std::max(hi, yt.back());
  auto X = [&](double x) { return x0 + (x1 - x0) * x / 360.0; };
  auto Y = [&](double y) { return y0 - (y0 - y1) * (y - lo) / (hi - lo); };
  set_axis_style(cr);
  cairo_move_to(cr, x0, y1);
  cairo_line_to(cr, x0, y0);
  cairo_line_to(cr, x1, y0);
  cairo_stroke(cr);
  font(cr, 8.5);
  for (int t = 0; t <= 360; t += 90) {
    cairo_move_to(cr, X(t), y0);
    cairo_line_to(cr, X(t), y0 + 4);
    cairo_stroke(cr);
    text(cr, std::to_string(t), X(t), y0 + 14, 0.5);
  }
  for (double t : yt) {
    cairo_move_to(cr, x0 - 4, Y(t));
    cairo_line_to(cr, x0, Y(t));
    cairo_stroke(cr);
    text(cr, tick_text(t), x0 - 6, Y(t) + 3, 1);
  }
  if (lo < 0 && hi > 0) {
    set_axis_style(cr, 0.6, 0.5);
    cairo_move_to(cr, x0, Y(0));
    cairo_line_to(cr, x1, Y(0));
    cairo_stroke(cr);
  }
  set_axis_style(cr);
  font(cr, 9.5);
  text(cr, f.x_label, (x0 + x1) / 2, y0 + 30, 0.5);
  cairo_save(cr);
  cairo_translate(cr, 18, (y0 + y1) / 2);
  cairo_rotate(cr, -pi / 2);
  text(cr, f.y_label, 0, 0, 0.5);
  cairo_restore(cr);
  // Legend in one row under the title.
  double lx = x0;
  font(cr, 8.5);
  for (std::size_t k = 0; k < f.panels[0].size(); ++k) {
    const Curve& c = f.panels[0][k];
    set_curve_style(cr, static_cast<int>(k) + 1);
    if (c.points) {
      marker(cr, lx + 11, 38);
    } else {
      cairo_move_to(cr, lx, 38);
      cairo_line_to(cr, lx + 22, 38);
      cairo_stroke(cr);
    }
    set_axis_style(cr);
    text(cr, c.label, lx + 26, 41);
    lx += 40 + text_width(cr, c.label);
  }
  for (std::size_t k = 0; k < f.panels[0].size(); ++k) {
    const Curve& c = f.panels[0][k];
    set_curve_style(cr, static_cast<int>(k) + 1);
    cairo_new_path(cr);
    for (std::size_t i = 0; i < c.x.size(); ++i) {
      if (c.points) marker(cr, X(c.x[i]), Y(c.y[i]));
      else if (i == 0) cairo_move_to(cr, X(c.x[i]), Y(c.y[i]));
      else cairo_line_to(cr, X(c.x[i]), Y(c.y[i]));
    }
    if (!c.points) cairo_stroke(cr);
  }
}

void draw_rosette(cairo_t* cr, const FigureData& f, Size s) {
  const double cx = s.w / 2, cy = s.h / 2 + 5, half = 120;
  set_axis_style(cr, 0.4, 0.8);
  cairo_rectangle(cr, cx - half, cy - half, 2 * half, 2 * half);
  cairo_stroke(cr);
  for (std::size_t k = 0; k < f.bars.size(); ++k) {
    const double a = f.bars[k].azimuth * pi / 180;
    cairo_save(cr);
    cairo_translate(cr, cx, cy);
    cairo_rotate(cr, -a);
    const Rgb& c = palette[(k + 1) % palette_size];
    cairo_set_source_rgb(cr, c.r, c.g, c.b);
    cairo_rectangle(cr, -0.7 * half, -5, 1.4 * half, 10);
    cairo_fill(cr);
    cairo_restore(cr);
    set_axis_style(cr);
    font(cr, 8.5);
    const double lx = cx + 0.82 * half * std::cos(a), ly = cy - 0.82 * half * std::sin(a);
    text(cr, f.bars[k].label, lx, ly + 3, std::cos(a) < -0.3 ? 1 : (std::cos(a) > 0.3 ? 0 : 0.5));
  }
  // Sample axes with their crystal directions, lower left.
  const double ox = cx - half + 12, oy = cy + half - 12;
  set_axis_style(cr, 0, 1.0);
  auto arrow = [&](double dx, double dy) {
    cairo_move_to(cr, ox, oy);
    cairo_line_to(cr, ox + dx, oy + dy);
    cairo_stroke(cr);
    const double len = std::hypot(dx, dy), ux = dx / len, uy = dy / len;
    cairo_move_to(cr, ox + dx, oy + dy);
    cairo_line_to(cr, ox + dx - 6 * ux + 3 * uy, oy + dy - 6 * uy - 3 * ux);
    cairo_line_to(cr, ox + dx - 6 * ux - 3 * uy, oy + dy - 6 * uy + 3 * ux);
    cairo_close_path(cr);
    cairo_fill(cr);
  };
  arrow(40, 0);
  arrow(0, -40);
  font(cr, 8.5);
  text(cr, "x ∥ " + f.axis_labels[0], ox + 44, oy + 3);
  text(cr, "y ∥ " + f.axis_labels[1], ox - 4, oy - 46);
}

void draw(cairo_t* cr, const FigureData& f, Size s) {
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_paint(cr);
  draw_header(cr, f, s);
  switch (f.kind) {
  case FigureKind::polar: draw_polar(cr, f, s); break;
  case FigureKind::line: draw_line(cr, f, s); break;
  case FigureKind::rosette: draw_rosette(cr, f, s); break;
  }
}

cairo_status_t append_bytes(void* closure, const unsigned char* data, unsigned int length) {
  static_cast<std::string*>(closure)->append(reinterpret_cast<const char*>(data), length);
  return CAIRO_STATUS_SUCCESS;
}

void check(cairo_status_t st, const std::string& what) {
  if (st != CAIRO_STATUS_SUCCESS)
    fail(ErrorKind::internal, "cairo could not draw " + what + ": " + cairo_status_to_string(st));
}

} // namespace

FigureFormat parse_figure_format(const std::string& name, const std::string& where) {
  if (name == "svg") return FigureFormat::svg;
  if (name == "pdf") return FigureFormat::pdf;
  if (name == "png") return FigureFormat::png;
  fail(ErrorKind::usage, "unknown figure format '" + name + "'", where, "svg, pdf or png");
}

const char* figure_extension(FigureFormat f) {
  switch (f) {
  case FigureFormat::svg: return "svg";
  case FigureFormat::pdf: return "pdf";
  case FigureFormat::png: return "png";
  }
  return "";
}

std::string render_figure(const FigureData& f, FigureFormat format) {
  const Size s = figure_size(f);
  std::string bytes;
  cairo_surface_t* surface = nullptr;
  switch (format) {
  case FigureFormat::svg: surface = cairo_svg_surface_create_for_stream(append_bytes, &bytes, s.w, s.h); break;
  case FigureFormat::pdf: surface = cairo_pdf_surface_create_for_stream(append_bytes, &bytes, s.w, s.h); break;
  case FigureFormat::png:
    // 2 pixels per point: sharp enough for slides and screens.
    surface = cairo_image_surface_create(CAIRO_FORMAT_RGB24, static_cast<int>(2 * s.w), static_cast<int>(2 * s.h));
    break;
  }
  check(cairo_surface_status(surface), f.stem);
  cairo_t* cr = cairo_create(surface);
  if (format == FigureFormat::png) cairo_scale(cr, 2, 2);
  draw(cr, f, s);
  cairo_status_t st = cairo_status(cr);
  cairo_destroy(cr);
  if (format == FigureFormat::png && st == CAIRO_STATUS_SUCCESS) st = cairo_surface_write_to_png_stream(surface, append_bytes, &bytes);
  cairo_surface_finish(surface);
  if (st == CAIRO_STATUS_SUCCESS) st = cairo_surface_status(surface);
  cairo_surface_destroy(surface);
  check(st, f.stem);
  return bytes;
}

std::vector<std::string> write_figures(const std::vector<FigureData>& figures, const std::string& directory,
                                       const std::vector<FigureFormat>& formats) {
  namespace fs = std::filesystem;
  std::error_code ec;
  fs::create_directories(directory, ec);
  if (ec || !fs::is_directory(directory))
    fail(ErrorKind::bad_file, "cannot create the figure directory " + directory, "--figures",
         "a directory path that can be created and written");
  std::vector<std::string> written;
  for (const auto& f : figures) {
    for (FigureFormat fmt : formats) {
      const std::string path = (fs::path(directory) / (f.stem + "." + figure_extension(fmt))).string();
      write_output(path, render_figure(f, fmt));
      written.push_back(path);
    }
    const std::string caption = (fs::path(directory) / (f.stem + ".caption.txt")).string();
    write_output(caption, f.title + "\n\n" + f.caption + "\n");
    written.push_back(caption);
  }
  return written;
}

} // namespace ts
