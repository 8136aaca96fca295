// Drawing the figures with cairo: polar plots, line plots with a sketch of the
// bar, and rosette sketches of bars with their contacts, in a plain journal style (thin black axes, labelled ticks, no
// grid or background), in colours of a colour-blind-safe palette (Okabe and
// Ito) with dash patterns that keep the curves apart in greyscale too.
// Output goes to SVG, PDF or PNG bytes; files are written atomically.
#pragma once

#include "core/output_file.hpp"
#include "figure/figure_data.hpp"

#include <string>
#include <vector>

namespace ts {

enum class FigureFormat { svg, pdf, png };
// "svg", "pdf", "png"; throws Error(usage) naming `where`.
FigureFormat parse_figure_format(const std::string& name, const std::string& where);
const char* figure_extension(FigureFormat f);

// The figure as the bytes of a file in the given format: sized for a journal column
// (FigureData::column), text at 7-9 pt, SVG text as <text> elements, PNG at `dpi`.
std::string render_figure(const FigureData& f, FigureFormat format, int dpi = 300);

// Every figure in every format for `directory` (created if missing), each
// with its caption beside it (STEM.caption.txt), added to `batch` so they are
// written together with the report; a link planted in the directory is
// replaced, never followed. Returns the paths.
std::vector<std::string> write_figures(const std::vector<FigureData>& figures, const std::string& directory,
                                       const std::vector<FigureFormat>& formats, OutputBatch* batch,
                                       int dpi = 300);

} // namespace ts
