// Figures a physicist can paste into a paper: illustrative values that do not cancel,
// empty panels that say why, journal-column sizes with 7-9 pt text kept as SVG text,
// a PNG resolution, and bar sketches with contacts, current and field. Checked on the
// figure values and on the pixels of rendered PNGs.
#include "figure/figure_data.hpp"
#include "figure/figure_draw.hpp"
#include "figure/image_ink.hpp"
#include "scenario/scenario.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <regex>

using namespace ts;

namespace {

std::vector<FigureData> example_figures(const std::string& name, FigureColumn column = FigureColumn::automatic) {
  const Scenario sc = load_scenario(std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/" + name);
  FigureSettings settings = figure_settings(sc.figures);
  settings.column = column;
  return scenario_figures(run_scenario(sc), settings);
}

double peak(const Curve& c) {
  double p = 0;
  for (double v : c.y) p = std::max(p, std::abs(v));
  return p;
}

struct SvgTextItem {
  std::string text;
  double x, y, size;
};

std::vector<SvgTextItem> svg_texts(const std::string& svg) {
  std::vector<SvgTextItem> out;
  const std::regex re("<text x=\"([-0-9.]+)\" y=\"([-0-9.]+)\"[^>]*font-size=\"([0-9.]+)\"[^>]*>([^<]*)</text>");
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), re); it != std::sregex_iterator(); ++it)
    out.push_back({(*it)[4], std::stod((*it)[1]), std::stod((*it)[2]), std::stod((*it)[3])});
  return out;
}

std::pair<double, double> svg_size(const std::string& svg) {
  std::smatch m;
  REQUIRE(std::regex_search(svg, m, std::regex("viewBox=\"0 0 ([0-9.]+) ([0-9.]+)\"")));
  return {std::stod(m[1]), std::stod(m[2])};
}

} // namespace

TEST_CASE("figures: every SHG panel is drawn or says why it is empty", "[figures]") {
  const auto figures = example_figures("magnetised-film-optics.toml");
  int polar = 0, labelled = 0;
  for (const auto& f : figures) {
    if (f.kind != FigureKind::polar) continue;
    ++polar;
    REQUIRE(f.panel_notes.size() == f.panels.size());
    for (std::size_t k = 0; k < f.panels.size(); ++k) {
      INFO(f.stem << " " << f.panel_titles[k]);
      CHECK((peak(f.panels[k][0]) > 0 || !f.panel_notes[k].empty()));
      if (!f.panel_notes[k].empty()) ++labelled;
    }
    // the values are stated in the caption, distinct ones from the fixed list
    CHECK_THAT(f.caption, Catch::Contains("illustrative"));
    CHECK_THAT(f.caption, Catch::Contains("distinct so that allowed terms do not cancel"));
  }
  CHECK(polar > 0);
  // The example's PP channel of the i-type source once cancelled at equal values
  // (−√2/8 − √2/8 + √2/4 = 0): with distinct values it radiates.
  bool some_pp_drawn = false;
  for (const auto& f : figures)
    for (std::size_t k = 0; k < f.panels.size() && f.kind == FigureKind::polar; ++k)
      if (f.panel_titles[k] == "PP" && peak(f.panels[k][0]) > 0) some_pp_drawn = true;
  CHECK(some_pp_drawn);
  (void)labelled;
}

TEST_CASE("figures: a forbidden panel is labelled, in SVG text and in the pixels", "[figures]") {
  // 4mm (001) at 45° incidence: the SS channel of the surface χ(2) is forbidden
  // (common practice: SS needs in-plane chiral components, none in C4v).
  Scenario sc;
  sc.group = "4mm";
  sc.cut = "(001)";
  sc.responses = {"electric-dipole-shg"};
  ShgSpec s;
  s.name = "rotational anisotropy";
  s.incidence = "45";
  s.channels = {"PP", "PS", "SP", "SS"};
  sc.shg.push_back(s);
  const auto figures = scenario_figures(run_scenario(sc), FigureSettings{});
  REQUIRE_FALSE(figures.empty());
  const FigureData& f = figures.front();
  REQUIRE(f.kind == FigureKind::polar);
  const auto ss = std::find(f.panel_titles.begin(), f.panel_titles.end(), "SS") - f.panel_titles.begin();
  REQUIRE(ss < static_cast<long>(f.panel_titles.size()));
  CHECK(f.panel_notes[ss] == "forbidden by symmetry");
  CHECK(peak(f.panels[0][0]) > 0); // PP radiates

  const std::string svg = render_figure(f, FigureFormat::svg);
  CHECK(svg.find("glyph") == std::string::npos); // no outlines: the text is text
  const auto texts = svg_texts(svg);
  const auto label = std::find_if(texts.begin(), texts.end(), [](const SvgTextItem& t) { return t.text.rfind("forbidden", 0) == 0; });
  REQUIRE(label != texts.end());
  const auto [w, h] = svg_size(svg);
  CHECK(w == 504); // four panels: a double column
  // The label is there in the pixels too: ink where the SVG puts its text.
  const int dpi = 200;
  const std::string png = render_figure(f, FigureFormat::png, dpi);
  const ImageInk whole = png_ink(png, "figure");
  CHECK(whole.width == static_cast<int>(std::ceil(w * dpi / 72)));
  const ImageInk at_label = png_ink(png, "label", label->x / w, (label->y - 6) / h, (label->x + 60) / w, (label->y + 1) / h);
  CHECK(at_label.ink > 0.05);
  // and the empty panel is otherwise blank: no curve colour in it
  CHECK(at_label.coloured < 0.01);
  const ImageInk pp_panel = png_ink(png, "PP panel", 0.0, 0.1, 0.25, 0.8);
  CHECK(pp_panel.coloured > 0.002); // the PP curve
}

TEST_CASE("figures: journal column sizes and 7-9 pt text", "[figures]") {
  for (FigureColumn column : {FigureColumn::automatic, FigureColumn::single, FigureColumn::double_column}) {
    for (const auto& f : example_figures("strained-film.toml", column)) {
      INFO(f.stem);
      const std::string svg = render_figure(f, FigureFormat::svg);
      const auto [w, h] = svg_size(svg);
      if (column == FigureColumn::single) CHECK(w == 246);
      if (column == FigureColumn::double_column) CHECK(w == 504);
      CHECK((w == 246 || w == 504));
      CHECK(h < 1.5 * w); // a column figure, not a page
      for (const auto& t : svg_texts(svg)) {
        INFO(t.text);
        CHECK(t.size >= 7);
        CHECK(t.size <= 9);
        CHECK(t.x >= 0);
        CHECK(t.y <= h); // nothing clipped at the foot (the note is wrapped, not cut)
      }
    }
  }
}

TEST_CASE("figures: bar sketches show contacts, current, field and crystal directions", "[figures]") {
  int bars = 0, rosettes = 0;
  for (const auto& f : example_figures("strained-film.toml")) {
    const std::string svg = render_figure(f, FigureFormat::svg);
    const auto texts = svg_texts(svg);
    auto has = [&](const std::string& s) {
      return std::any_of(texts.begin(), texts.end(), [&](const SvgTextItem& t) { return t.text.find(s) != std::string::npos; });
    };
    if (f.kind == FigureKind::line && f.sketch.present) {
      ++bars;
      INFO(f.stem);
      CHECK(has("j"));
      CHECK((has("B") || has("no field")));
      CHECK(has("x ∥ [100]"));
      CHECK_THAT(f.caption, Catch::Contains("current pads and voltage probes"));
      // the sketch (lower part of the figure) has ink and colour: the bar and its pads
      const std::string png = render_figure(f, FigureFormat::png, 150);
      const auto [w, h] = svg_size(svg);
      const double sketch_top = (h - 78 - 30) / h;
      const ImageInk sketch = png_ink(png, f.stem, 0.2, sketch_top, 0.9, 0.95);
      CHECK(sketch.ink > 0.02);
      CHECK(sketch.coloured > 0.005);
    }
    if (f.kind == FigureKind::rosette) {
      ++rosettes;
      CHECK(has("j"));
      CHECK(has("x ∥ "));
    }
  }
  CHECK(bars > 0);
  CHECK(rosettes > 0);
}

TEST_CASE("figures: --figure-dpi and --figure-column on the command line", "[figures]") {
  ts::test::TempDir dir;
  const auto r = ts::test::run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml", "--figures",
                                    (dir / "fig").string(), "--figure-format", "png", "--figure-dpi", "144",
                                    "--figure-column", "double", "--brief"});
  REQUIRE(r.exit_code == 0);
  int pngs = 0;
  for (const auto& e : std::filesystem::directory_iterator(dir / "fig"))
    if (e.path().extension() == ".png") {
      ++pngs;
      CHECK(png_ink(ts::test::read_file(e.path()), e.path().string()).width == 1008); // 504 pt at 144 dpi
    }
  CHECK(pngs > 0);
  CHECK(ts::test::run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml", "--figures",
                           (dir / "x").string(), "--figure-dpi", "5"})
            .exit_code == 2);
}
