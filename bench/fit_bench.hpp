// Figures of the scan fits (docs/fit.md): a transport scan of 10,000 points
// against every hypothesis of a (111) cubic film's lowering lattice.
#pragma once

namespace ts::bench {

void print_fit_figures(int repeats);

} // namespace ts::bench
