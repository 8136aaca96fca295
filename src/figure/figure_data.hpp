// The numbers behind the figures of a scenario: sampled curves of the exact
// signals at illustrative parameter values. Parameter values in a figure are
// never predictions: every parameter is set to an illustrative value (distinct
// values from a fixed list unless the user sets them, so that allowed channels
// do not cancel by accident) and each figure says so on itself and in its
// caption. The same samples go into the JSON report, so a script can redraw
// every picture.
#pragma once

#include "scenario/scenario_run.hpp"

#include <array>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace ts {

struct Curve {
  std::string label;
  std::vector<double> x, y; // x in degrees
  bool points = false;      // measured points (markers), not a line
};

enum class FigureKind { polar, line, rosette };

// One bar of a rosette sketch.
struct RosetteBar {
  int azimuth = 0;   // degrees from sample x
  std::string label; // its crystal direction or angle
};

// A small sketch of a Hall bar in the sample plane: the stripe with its current
// pads and voltage probes, the current arrow, the field arrow and the sample axes.
struct BarSketch {
  bool present = false;
  double current_deg = 0;             // direction of the current drawn, from sample x
  bool current_rotating = false;      // the current turns: drawn at current_deg, marked φ
  std::optional<double> field_deg;    // in-plane field direction from sample x
  bool field_normal = false;          // field along the normal (drawn as ⊙)
  std::array<std::string, 2> axis_labels; // crystal directions of sample x and y
};

// The journal column a figure is drawn for: 3.4 in (246 pt) or 7 in (504 pt) wide.
enum class FigureColumn { automatic, single, double_column };

struct FigureData {
  std::string stem;    // file name without extension: "shg-1-chi-i-type"
  FigureKind kind = FigureKind::line;
  FigureColumn column = FigureColumn::automatic;
  std::string title;   // drawn above the plot
  std::string x_label, y_label;
  std::vector<std::string> panel_titles; // polar: one panel per channel
  std::vector<std::vector<Curve>> panels; // polar: curves per panel; line: one panel
  // polar: per panel, "" or why it is empty ("forbidden by symmetry", "zero at these values")
  std::vector<std::string> panel_notes;
  bool own_scales = false;                 // polar: each panel scaled to its own maximum (printed on it)
  BarSketch sketch;                        // line plots of a Hall bar
  std::vector<RosetteBar> bars;            // rosette
  std::array<std::string, 2> axis_labels;  // rosette: the crystal directions of sample x and y
  std::string note;    // one line on the figure: the illustrative values
  std::string caption; // the caption file: what is drawn, the values used, the conventions
};

struct FigureSettings {
  std::map<std::string, double> values; // parameter name -> illustrative value; others from a fixed list
  FigureColumn column = FigureColumn::automatic;
  int incidence_deg = 45;               // for SHG setups whose θ is a variable
  std::string where;                    // [figures] table or option, for messages
};

// The settings of a scenario's [figures] table (or the options).
FigureSettings figure_settings(const FigureSpec& spec);

// Every figure the scenario gives: a polar plot per SHG setup and radiating
// source (azimuth turning) or a line plot against the polariser angle, a line
// plot per Hall bar and transport part that reads something against the
// current (or field) angle, and a rosette sketch per layout design.
// Throws Error(usage) naming settings.where for a value set for a parameter
// that no figure uses.
std::vector<FigureData> scenario_figures(const ScenarioResult& r, const FigureSettings& settings);

// The figures a report carries, computed once and handed to every writer; nullopt
// when the report has none. The one rule: a report carries its figures when the
// scenario asks for them (a [figures] table or any figure option), and a page
// (HTML) always does, its pictures being its figures. So a bad [figures] value
// fails the same way in every format.
using ReportFigures = std::optional<std::vector<FigureData>>;
ReportFigures report_figures(const ScenarioResult& r, bool page);

} // namespace ts
