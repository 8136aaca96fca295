#include "figure/figure_draw.hpp"

#include "core/error.hpp"
#include "core/markup.hpp"
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

void set_axis_style(cairo_t* cr, double grey = 0, double width = 0.6) {
  cairo_set_source_rgb(cr, grey, grey, grey);
  cairo_set_line_width(cr, width);
  cairo_set_dash(cr, nullptr, 0, 0);
}

// SVG keeps its text as <text> elements (searchable, editable, restyled by a journal)
// rather than cairo's glyph outlines: while an SVG is drawn, text() records each string
// with its position, size, weight, colour and rotation, and render_figure writes them.
struct SvgText {
  std::string text;
  double x, y, size, angle_deg, r, g, b;
  bool bold;
};
thread_local std::vector<SvgText>* svg_text = nullptr;
thread_local double font_size = 8;
thread_local bool font_bold = false;

void font(cairo_t* cr, double size, bool bold = false) {
  cairo_select_font_face(cr, "DejaVu Sans", CAIRO_FONT_SLANT_NORMAL, bold ? CAIRO_FONT_WEIGHT_BOLD : CAIRO_FONT_WEIGHT_NORMAL);
  cairo_set_font_size(cr, size);
  // Unhinted metrics on every surface: the layout measured once fits SVG, PDF and PNG alike.
  cairo_font_options_t* options = cairo_font_options_create();
  cairo_font_options_set_hint_metrics(options, CAIRO_HINT_METRICS_OFF);
  cairo_set_font_options(cr, options);
  cairo_font_options_destroy(options);
  font_size = size;
  font_bold = bold;
}

double text_width(cairo_t* cr, const std::string& s) {
  cairo_text_extents_t e;
  cairo_text_extents(cr, s.c_str(), &e);
  return e.x_advance;
}

// Text anchored at (x, y): ax = 0 left, 0.5 centre, 1 right; the baseline at y.
void text(cairo_t* cr, const std::string& s, double x, double y, double ax = 0) {
  const double left = x - ax * text_width(cr, s);
  if (!svg_text) {
    cairo_move_to(cr, left, y);
    cairo_show_text(cr, s.c_str());
    return;
  }
  double dx = left, dy = y;
  cairo_user_to_device(cr, &dx, &dy);
  cairo_matrix_t m;
  cairo_get_matrix(cr, &m);
  double r = 0, g = 0, b = 0, a = 1;
  cairo_pattern_get_rgba(cairo_get_source(cr), &r, &g, &b, &a);
  svg_text->push_back({s, dx, dy, font_size, std::atan2(m.yx, m.xx) * 180 / pi, r, g, b, font_bold});
}

// `s` in lines no wider than `width` at the current font, broken at spaces.
std::vector<std::string> wrap(cairo_t* cr, const std::string& s, double width) {
  std::vector<std::string> lines;
  std::string line;
  std::size_t start = 0;
  while (start <= s.size()) {
    std::size_t end = s.find(' ', start);
    const std::string word = s.substr(start, end == std::string::npos ? std::string::npos : end - start);
    const std::string joined = line.empty() ? word : line + " " + word;
    if (!line.empty() && text_width(cr, joined) > width) {
      lines.push_back(line);
      line = word;
    } else {
      line = joined;
    }
    if (end == std::string::npos) break;
    start = end + 1;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
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
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

// Journal columns (common practice: about 3.4 in single, 7 in double), in points;
// the text on the figure is set at 7 to 9 pt, the sizes journals ask for at print size.
constexpr double kSingle = 246, kDouble = 504;
constexpr double kTitle = 9, kLabel = 8, kTick = 7, kNote = 7, kLine = 8.6;

struct Layout {
  double w = kSingle, h = 0;
  std::vector<std::string> title, note; // wrapped lines
  double top = 0;                       // below the title
  int cols = 1, rows = 1;               // polar panels
  double legend_height = 0;
};

int polar_columns(const FigureData& f, double w) {
  const int n = static_cast<int>(f.panels.size());
  return std::max(1, std::min(n, w > kSingle ? 4 : 2));
}

double sketch_height(const FigureData& f) { return f.sketch.present ? 78 : 0; }

// Legend entries of a line plot in rows that fit the width: returns the row of each entry.
std::vector<int> legend_rows(cairo_t* cr, const FigureData& f, double x0, double x1) {
  std::vector<int> row;
  double lx = x0;
  int r = 0;
  font(cr, kTick);
  for (const auto& c : f.panels[0]) {
    const double w = 24 + text_width(cr, c.label) + 10;
    if (lx > x0 && lx + w > x1) {
      ++r;
      lx = x0;
    }
    row.push_back(r);
    lx += w;
  }
  return row;
}

Layout layout_of(cairo_t* cr, const FigureData& f) {
  Layout l;
  const bool wide = f.column == FigureColumn::double_column ||
                    (f.column == FigureColumn::automatic && f.kind == FigureKind::polar && f.panels.size() > 2);
  l.w = wide ? kDouble : kSingle;
  font(cr, kTitle, true);
  l.title = wrap(cr, f.title, l.w - 12);
  l.top = 6 + 11 * static_cast<double>(l.title.size());
  font(cr, kNote);
  std::string note = f.note;
  if (f.kind == FigureKind::polar)
    note = f.x_label + " counterclockwise from 0°; radius: " + f.y_label +
           (f.own_scales ? ", each panel to its own maximum (printed)" : ", one scale for all panels") + ". " + note;
  l.note = wrap(cr, note, l.w - 12);
  const double footer = 6 + kLine * static_cast<double>(l.note.size());
  switch (f.kind) {
  case FigureKind::polar: {
    l.cols = polar_columns(f, l.w);
    l.rows = (static_cast<int>(f.panels.size()) + l.cols - 1) / l.cols;
    const double pw = (l.w - 10) / l.cols, radius = std::min(44.0, 0.34 * pw);
    l.h = l.top + l.rows * (2 * radius + 44) + footer;
    break;
  }
  case FigureKind::line: {
    const std::vector<int> rows = legend_rows(cr, f, 40, l.w - 8);
    l.legend_height = 10 * (rows.empty() ? 1 : rows.back() + 1);
    l.h = l.top + l.legend_height + 4 + 130 + 30 + sketch_height(f) + footer;
    break;
  }
  case FigureKind::rosette: l.h = l.top + 2 * 96 + 14 + footer; break;
  }
  return l;
}

void draw_header(cairo_t* cr, const FigureData& f, const Layout& l) {
  (void)f;
  set_axis_style(cr);
  font(cr, kTitle, true);
  for (std::size_t i = 0; i < l.title.size(); ++i) text(cr, l.title[i], l.w / 2, 14 + 11 * static_cast<double>(i), 0.5);
  font(cr, kNote);
  cairo_set_source_rgb(cr, 0.25, 0.25, 0.25);
  const double first = l.h - 4 - kLine * static_cast<double>(l.note.size() - 1);
  for (std::size_t i = 0; i < l.note.size(); ++i) text(cr, l.note[i], l.w / 2, first + kLine * static_cast<double>(i), 0.5);
}

void arrow(cairo_t* cr, double x0, double y0, double x1, double y1, double head = 4) {
  cairo_move_to(cr, x0, y0);
  cairo_line_to(cr, x1, y1);
  cairo_stroke(cr);
  const double len = std::hypot(x1 - x0, y1 - y0);
  if (len <= 0) return;
  const double ux = (x1 - x0) / len, uy = (y1 - y0) / len;
  cairo_move_to(cr, x1, y1);
  cairo_line_to(cr, x1 - head * ux + 0.5 * head * uy, y1 - head * uy - 0.5 * head * ux);
  cairo_line_to(cr, x1 - head * ux - 0.5 * head * uy, y1 - head * uy + 0.5 * head * ux);
  cairo_close_path(cr);
  cairo_fill(cr);
}

// A Hall bar centred at (cx, cy) along `deg` from sample x: the stripe, a current pad
// at each end, two voltage probes on each edge, and the current arrow beside it.
void draw_bar(cairo_t* cr, double cx, double cy, double length, double width, double deg, const Rgb& c,
              const std::string& current_label) {
  cairo_save(cr);
  cairo_translate(cr, cx, cy);
  cairo_rotate(cr, -deg * pi / 180);
  cairo_set_source_rgb(cr, c.r, c.g, c.b);
  cairo_rectangle(cr, -length / 2, -width / 2, length, width);
  cairo_fill(cr);
  cairo_set_source_rgb(cr, 0.35, 0.35, 0.35);
  const double pad = 1.6 * width;
  for (double end : {-1.0, 1.0}) // current pads
    cairo_rectangle(cr, end * length / 2 - (end < 0 ? pad : 0), -pad / 2, pad, pad);
  for (double along : {-0.22, 0.22}) // voltage probes: arms with a pad on each edge
    for (double side : {-1.0, 1.0}) {
      cairo_rectangle(cr, along * length - width / 4, side > 0 ? width / 2 : -width / 2 - width, width / 2, width);
      cairo_rectangle(cr, along * length - width / 2, side > 0 ? 1.5 * width : -2.5 * width, width, width);
    }
  cairo_fill(cr);
  if (!current_label.empty()) {
    set_axis_style(cr, 0, 0.7);
    const double off = 3.6 * width;
    arrow(cr, -length / 4, -off, length / 4, -off, 3.5);
    cairo_restore(cr);
    // the label upright, beside the arrow's head
    const double a = deg * pi / 180, ox = -std::sin(a) * 3.6 * width, oy = -std::cos(a) * 3.6 * width;
    font(cr, kTick);
    set_axis_style(cr);
    text(cr, current_label, cx + 0.3 * length * std::cos(a) + ox, cy - 0.3 * length * std::sin(a) + oy - 2, 0.5);
    return;
  }
  cairo_restore(cr);
}

// Sample axes x and y with their crystal directions, the origin at (ox, oy).
void draw_axes(cairo_t* cr, double ox, double oy, double len, const std::array<std::string, 2>& labels) {
  set_axis_style(cr, 0, 0.7);
  arrow(cr, ox, oy, ox + len, oy);
  arrow(cr, ox, oy, ox, oy - len);
  font(cr, kTick);
  text(cr, "x ∥ " + labels[0], ox + len + 3, oy + 2.5);
  text(cr, "y ∥ " + labels[1], ox - 2, oy - len - 4);
}

void draw_polar(cairo_t* cr, const FigureData& f, const Layout& l) {
  double common = 0;
  for (const auto& panel : f.panels)
    for (const auto& c : panel)
      for (double v : c.y) common = std::max(common, std::abs(v));
  const int n = static_cast<int>(f.panels.size());
  const double pw = (l.w - 10) / l.cols, radius = std::min(44.0, 0.34 * pw), ph = 2 * radius + 44;
  for (int p = 0; p < n; ++p) {
    const double cx = 5 + (p % l.cols) * pw + pw / 2, cy = l.top + (p / l.cols) * ph + 16 + radius;
    double peak = f.own_scales ? 0 : common;
    if (f.own_scales)
      for (const auto& c : f.panels[p])
        for (double v : c.y) peak = std::max(peak, std::abs(v));
    set_axis_style(cr, 0.6, 0.4);
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
    font(cr, kTick);
    text(cr, "0°", cx + radius + 2, cy + 2.5);
    text(cr, "90°", cx, cy - radius - 2, 0.5);
    text(cr, "180°", cx - radius - 2, cy + 2.5, 1);
    text(cr, "270°", cx, cy + radius + 8, 0.5);
    font(cr, kLabel, true);
    text(cr, f.panel_titles[p], cx - radius - 6, cy - radius - 6);
    const std::string& why = p < static_cast<int>(f.panel_notes.size()) ? f.panel_notes[p] : std::string();
    font(cr, kNote);
    if (!why.empty()) {
      // an empty panel says why it is empty, in the middle where the curve would be
      // on two lines, broken at the space nearest the middle, when one would cross the circle
      std::vector<std::string> lines{why};
      if (text_width(cr, why) > 1.6 * radius) {
        std::size_t best = std::string::npos;
        for (std::size_t sp = why.find(' '); sp != std::string::npos; sp = why.find(' ', sp + 1))
          if (best == std::string::npos || std::abs(static_cast<double>(sp) - why.size() / 2.0) <
                                               std::abs(static_cast<double>(best) - why.size() / 2.0))
            best = sp;
        if (best != std::string::npos) lines = {why.substr(0, best), why.substr(best + 1)};
      }
      for (std::size_t k = 0; k < lines.size(); ++k) {
        const double ly = cy + 1 + (k - (lines.size() - 1) / 2.0) * 9;
        const double tw = text_width(cr, lines[k]);
        cairo_set_source_rgb(cr, 1, 1, 1);
        cairo_rectangle(cr, cx - tw / 2 - 2, ly - 7, tw + 4, 9.5);
        cairo_fill(cr);
        cairo_set_source_rgb(cr, 0.15, 0.15, 0.15);
        text(cr, lines[k], cx, ly, 0.5);
      }
      continue;
    }
    if (f.own_scales) {
      cairo_set_source_rgb(cr, 0.25, 0.25, 0.25);
      text(cr, "max " + tick_text(peak), cx, cy + radius + 17, 0.5);
    }
    if (!(peak > 0)) continue;
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
}

void draw_sketch(cairo_t* cr, const BarSketch& s, double left, double top, double w) {
  const double cy = top + 40, cx = left + w / 2 + 8;
  draw_axes(cr, left + 6, top + 70, 22, s.axis_labels);
  draw_bar(cr, cx, cy, 84, 7, s.current_deg, palette[6], s.current_rotating ? "j (φ)" : "j");
  if (s.current_rotating) { // the angle φ from sample x
    set_axis_style(cr, 0.3, 0.5);
    cairo_new_path(cr);
    cairo_arc_negative(cr, cx, cy, 30, 0, -s.current_deg * pi / 180);
    cairo_stroke(cr);
  }
  const double bx = cx + 78, by = cy;
  set_axis_style(cr, 0.0, 0.9);
  font(cr, kLabel);
  if (s.field_normal) {
    cairo_new_path(cr);
    cairo_arc(cr, bx, by, 6, 0, 2 * pi);
    cairo_stroke(cr);
    cairo_arc(cr, bx, by, 1.6, 0, 2 * pi);
    cairo_fill(cr);
    text(cr, "B ⊙ (normal)", bx + 9, by + 3);
  } else if (s.field_deg) {
    const double a = *s.field_deg * pi / 180;
    arrow(cr, bx - 14 * std::cos(a), by + 14 * std::sin(a), bx + 14 * std::cos(a), by - 14 * std::sin(a), 4.5);
    text(cr, "B", bx + 18 * std::cos(a) + 3, by - 18 * std::sin(a) + 3);
  } else {
    text(cr, "no field", bx - 10, by + 3);
  }
}

void draw_line(cairo_t* cr, const FigureData& f, const Layout& l) {
  const double x0 = 40, x1 = l.w - 8, y1 = l.top + l.legend_height + 6, y0 = y1 + 124;
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
  font(cr, kTick);
  for (int t = 0; t <= 360; t += 90) {
    cairo_move_to(cr, X(t), y0);
    cairo_line_to(cr, X(t), y0 + 3);
    cairo_stroke(cr);
    text(cr, std::to_string(t), X(t), y0 + 11, 0.5);
  }
  for (double t : yt) {
    cairo_move_to(cr, x0 - 3, Y(t));
    cairo_line_to(cr, x0, Y(t));
    cairo_stroke(cr);
    text(cr, tick_text(t), x0 - 5, Y(t) + 2.5, 1);
  }
  if (lo < 0 && hi > 0) {
    set_axis_style(cr, 0.6, 0.4);
    cairo_move_to(cr, x0, Y(0));
    cairo_line_to(cr, x1, Y(0));
    cairo_stroke(cr);
  }
  set_axis_style(cr);
  font(cr, kLabel);
  text(cr, f.x_label, (x0 + x1) / 2, y0 + 23, 0.5);
  cairo_save(cr);
  cairo_translate(cr, 10, (y0 + y1) / 2);
  cairo_rotate(cr, -pi / 2);
  text(cr, f.y_label, 0, 0, 0.5);
  cairo_restore(cr);
  // Legend rows under the title.
  const std::vector<int> rows = legend_rows(cr, f, x0, x1);
  double lx = x0;
  font(cr, kTick);
  for (std::size_t k = 0; k < f.panels[0].size(); ++k) {
    const Curve& c = f.panels[0][k];
    if (k > 0 && rows[k] != rows[k - 1]) lx = x0;
    const double ly = l.top + 4 + 10 * rows[k];
    set_curve_style(cr, static_cast<int>(k) + 1);
    if (c.points) {
      marker(cr, lx + 10, ly);
    } else {
      cairo_move_to(cr, lx, ly);
      cairo_line_to(cr, lx + 20, ly);
      cairo_stroke(cr);
    }
    set_axis_style(cr);
    text(cr, c.label, lx + 24, ly + 2.5);
    lx += 34 + text_width(cr, c.label);
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
  if (f.sketch.present) draw_sketch(cr, f.sketch, 8, y0 + 30, l.w - 16);
}

void draw_rosette(cairo_t* cr, const FigureData& f, const Layout& l) {
  const double half = 96, cx = l.w / 2, cy = l.top + 4 + half;
  set_axis_style(cr, 0.4, 0.6);
  cairo_rectangle(cr, cx - half, cy - half, 2 * half, 2 * half);
  cairo_stroke(cr);
  const std::size_t n = f.bars.size();
  for (std::size_t k = 0; k < n; ++k) {
    // Bars of one rosette sit apart along their own direction, so pads and probes do
    // not overlap at the centre; a single bar sits in the middle.
    const double a = f.bars[k].azimuth * pi / 180;
    const double shift = n == 1 ? 0 : 0.45 * half;
    const double bx = cx + shift * std::cos(a), by = cy - shift * std::sin(a);
    draw_bar(cr, bx, by, n == 1 ? 1.1 * half : 0.8 * half, 6, f.bars[k].azimuth, palette[(k + 1) % palette_size], "j");
    set_axis_style(cr);
    font(cr, kTick);
    const double reach = n == 1 ? 0.72 * half : shift + 0.5 * half;
    const double lx = cx + reach * std::cos(a), ly = cy - reach * std::sin(a);
    text(cr, f.bars[k].label, lx, ly + 3, std::cos(a) < -0.3 ? 1 : (std::cos(a) > 0.3 ? 0 : 0.5));
  }
  draw_axes(cr, cx - half + 8, cy + half - 8, 26, f.axis_labels);
}

void draw(cairo_t* cr, const FigureData& f, const Layout& l) {
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_paint(cr);
  draw_header(cr, f, l);
  switch (f.kind) {
  case FigureKind::polar: draw_polar(cr, f, l); break;
  case FigureKind::line: draw_line(cr, f, l); break;
  case FigureKind::rosette: draw_rosette(cr, f, l); break;
  }
}

std::string svg_text_elements(const std::vector<SvgText>& items) {
  std::string out;
  char buf[320];
  for (const auto& t : items) {
    std::snprintf(buf, sizeof buf,
                  "<text x=\"%.2f\" y=\"%.2f\" font-family=\"DejaVu Sans, Arial, sans-serif\" font-size=\"%.2f\"%s "
                  "fill=\"rgb(%d,%d,%d)\" xml:space=\"preserve\"",
                  t.x, t.y, t.size, t.bold ? " font-weight=\"bold\"" : "", static_cast<int>(255 * t.r + 0.5),
                  static_cast<int>(255 * t.g + 0.5), static_cast<int>(255 * t.b + 0.5));
    out += buf;
    if (std::abs(t.angle_deg) > 1e-9) {
      std::snprintf(buf, sizeof buf, " transform=\"rotate(%.2f %.2f %.2f)\"", t.angle_deg, t.x, t.y);
      out += buf;
    }
    out += ">" + markup_escape(t.text) + "</text>\n";
  }
  return out;
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

std::string render_figure(const FigureData& f, FigureFormat format, int dpi) {
  // The layout needs the font's measures before the page size is known.
  cairo_surface_t* probe = cairo_recording_surface_create(CAIRO_CONTENT_COLOR, nullptr);
  cairo_t* measure = cairo_create(probe);
  const Layout l = layout_of(measure, f);
  cairo_destroy(measure);
  cairo_surface_destroy(probe);
  const double scale = dpi / 72.0;
  std::string bytes;
  std::vector<SvgText> texts;
  cairo_surface_t* surface = nullptr;
  switch (format) {
  case FigureFormat::svg: surface = cairo_svg_surface_create_for_stream(append_bytes, &bytes, l.w, l.h); break;
  case FigureFormat::pdf: surface = cairo_pdf_surface_create_for_stream(append_bytes, &bytes, l.w, l.h); break;
  case FigureFormat::png:
    surface = cairo_image_surface_create(CAIRO_FORMAT_RGB24, static_cast<int>(std::ceil(scale * l.w)),
                                         static_cast<int>(std::ceil(scale * l.h)));
    break;
  }
  check(cairo_surface_status(surface), f.stem);
  cairo_t* cr = cairo_create(surface);
  if (format == FigureFormat::png) cairo_scale(cr, scale, scale);
  svg_text = format == FigureFormat::svg ? &texts : nullptr;
  draw(cr, f, l);
  svg_text = nullptr;
  cairo_status_t st = cairo_status(cr);
  cairo_destroy(cr);
  if (format == FigureFormat::png && st == CAIRO_STATUS_SUCCESS) st = cairo_surface_write_to_png_stream(surface, append_bytes, &bytes);
  cairo_surface_finish(surface);
  if (st == CAIRO_STATUS_SUCCESS) st = cairo_surface_status(surface);
  cairo_surface_destroy(surface);
  check(st, f.stem);
  if (format == FigureFormat::svg) {
    const std::size_t close = bytes.rfind("</svg>");
    if (close == std::string::npos) fail(ErrorKind::internal, "cairo wrote no closing </svg> for " + f.stem);
    bytes.insert(close, svg_text_elements(texts));
  }
  return bytes;
}

std::vector<std::string> write_figures(const std::vector<FigureData>& figures, const std::string& directory,
                                       const std::vector<FigureFormat>& formats, OutputBatch* batch, int dpi) {
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
      batch->add(path, render_figure(f, fmt, dpi), Links::replace);
      written.push_back(path);
    }
    const std::string caption = (fs::path(directory) / (f.stem + ".caption.txt")).string();
    batch->add(caption, f.title + "\n\n" + f.caption + "\n", Links::replace);
    written.push_back(caption);
  }
  return written;
}

} // namespace ts
