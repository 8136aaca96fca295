#include "figure/fit_figure.hpp"

#include <cmath>

namespace ts {

namespace {

double wrapped(double deg) {
  double d = std::fmod(deg, 360.0);
  return d < 0 ? d + 360.0 : d;
}

// The models the reports show (FitResult::shown_models): the accepted one first.
std::vector<const HypothesisFit*> shown_models(const FitResult& r) {
  std::vector<const HypothesisFit*> out;
  for (std::size_t i : r.shown_models) out.push_back(&r.hypotheses.at(i));
  return out;
}

Curve model_curve(const FitResult& r, const HypothesisFit& h, std::size_t channel, const std::vector<std::size_t>& points) {
  Curve c;
  c.label = h.hypothesis.symbol;
  if (channel < h.curve.size()) {
    c.x = r.curve_deg;
    c.y = h.curve[channel];
    return c;
  }
  // No smooth curve (the scan varies more than one quantity): the model at the points.
  c.points = true;
  for (std::size_t k : points) {
    c.x.push_back(wrapped(r.angle_deg[k]));
    c.y.push_back(h.model[k]);
  }
  return c;
}

} // namespace

std::vector<FigureData> fit_figures(const FitResult& r, const std::string& stem) {
  std::vector<FigureData> out;
  if (r.angle_deg.empty()) return out;
  const auto shown = shown_models(r);
  const std::string note = "fit of " + r.data + " (" + std::to_string(r.points) +
                           " points); lines: the accepted and the best hypotheses by AIC";
  // The caption names the selection: the accepted hypothesis and the best ranked.
  std::string models;
  for (std::size_t i = 0; i < shown.size(); ++i)
    models += (i == 0 ? "" : i + 1 == shown.size() ? " and " : ", ") + shown[i]->hypothesis.symbol;
  if (!r.verdict.accepted.empty()) models += " (the accepted hypothesis first, then the best ranked by AIC)";
  else models += " (the best ranked by AIC)";
  FigureData f;
  f.stem = stem + "-data";
  f.title = r.name + ": data and the best fits";
  f.x_label = r.abscissa;
  f.note = note;
  f.caption = "Measured points of " + r.data + " (" + r.measurement + ") and the fitted models of " + models +
              ", " + r.abscissa + " from sample x.";
  std::vector<std::size_t> all;
  for (std::size_t k = 0; k < r.points; ++k) all.push_back(k);
  if (r.kind == "SHG") {
    f.kind = FigureKind::polar;
    f.y_label = "intensity";
    for (std::size_t c = 0; c < r.channels.size(); ++c) {
      std::vector<std::size_t> pts;
      for (std::size_t k = 0; k < r.points; ++k)
        if (r.channel[k] == r.channels[c]) pts.push_back(k);
      std::vector<Curve> panel;
      Curve data{"data", {}, {}, true};
      for (std::size_t k : pts) {
        data.x.push_back(wrapped(r.angle_deg[k]));
        data.y.push_back(r.value[k]);
      }
      panel.push_back(data);
      for (const auto* h : shown) panel.push_back(model_curve(r, *h, c, pts));
      f.panel_titles.push_back(r.channels[c]);
      f.panels.push_back(panel);
    }
  } else {
    f.kind = FigureKind::line;
    f.y_label = "reading (SI units)";
    std::vector<Curve> panel;
    Curve data{"data", {}, {}, true};
    for (std::size_t k = 0; k < r.points; ++k) {
      data.x.push_back(wrapped(r.angle_deg[k]));
      data.y.push_back(r.value[k]);
    }
    panel.push_back(data);
    for (const auto* h : shown) panel.push_back(model_curve(r, *h, 0, all));
    f.panels.push_back(panel);
  }
  out.push_back(f);
  FigureData res;
  res.stem = stem + "-residuals";
  res.kind = FigureKind::line;
  res.title = r.name + ": residuals of the best fits";
  res.x_label = r.abscissa;
  res.y_label = r.uncertainties ? "(data − model)/σ" : "data − model";
  res.note = note;
  res.caption = "Residuals of " + models + " at each measured point" +
                (r.uncertainties ? ", in units of the point's uncertainty." : ".");
  std::vector<Curve> panel;
  for (const auto* h : shown) {
    Curve c{h->hypothesis.symbol, {}, {}, true};
    for (std::size_t k = 0; k < r.points; ++k) {
      c.x.push_back(wrapped(r.angle_deg[k]));
      const double d = r.value[k] - h->model[k];
      c.y.push_back(r.uncertainties ? d / r.sigma[k] : d);
    }
    panel.push_back(c);
  }
  res.panels.push_back(panel);
  out.push_back(res);
  return out;
}

} // namespace ts
