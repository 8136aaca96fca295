// Figures of the inverse search (what an observed signal proves) over the
// subgroups of the largest magnetic point group, m-3m1' (order 96).
#pragma once

namespace ts::bench {

void print_inverse_figures(int repeats);

} // namespace ts::bench
