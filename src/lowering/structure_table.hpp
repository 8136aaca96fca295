// The reader of a crystal structure written as a TOML table: the loader side of
// structure_symmetry.hpp, kept apart so toml++ stays out of the headers the rest
// of the library includes.
#pragma once

#include "lowering/structure_symmetry.hpp"

#include <toml++/toml.h>

#include <string>

namespace ts {

// Reads a [structure] block (schema in docs/structures.md):
//   lattice = [[ax, ay, az], [bx, by, bz], [cx, cy, cz]]        (rows a, b, c; Angstrom)
//   or a, b, c (Angstrom) and alpha, beta, gamma (degrees), with a along x and
//   b in the xy plane
//   sites = [ { species = "Ti", at = [0.5, 0.5, 0.5], moment = [0, 0, 1] }, ... ]
//   symprec = 1e-5                                               (optional)
// `where` names the block for messages, e.g. "cell.toml:[structure]". Every
// malformed or unknown field throws ts::Error(ErrorKind::bad_file) naming the
// field and its line:column.
CrystalStructure parse_structure(const toml::table& block, const std::string& where);

} // namespace ts
