// Structure files in: CIF (1.1 and 2) and magnetic CIF (mCIF), read with
// gemmi's CIF parser (Debian gemmi-dev, header-only use) into a CrystalStructure
// holding every atom of the cell, ready for the spglib search of
// structure_symmetry.hpp.
//
// The file's operations (stated as xyz triplets, or expanded from its
// Hermann-Mauguin symbol with gemmi's tables) generate the atoms of the cell
// from the listed sites; they are checked on the way and never trusted blindly:
// they must close under composition, and each one must carry every site onto a
// site of the same species with the moment the operation predicts. The first
// operation and site that fail are named in the error.
//
// Moments (`_atom_site_moment.crystalaxis_x/y/z`) are components along unit
// vectors parallel to a, b, c (the mCIF convention); they are turned into
// Cartesian axial vectors in the frame of the lattice (a along x, b in the xy
// plane), the frame the rest of the program works in.
#pragma once

#include "core/error.hpp"
#include "lowering/structure_symmetry.hpp"

#include <cstddef>
#include <string>
#include <vector>

namespace ts {

enum class OccupancyPolicy {
  refuse, // a site with occupancy below 1 is an error (the default: the symmetry of a disordered crystal is a choice)
  ignore, // every listed atom counts as present; atoms sharing a spot become one mixed species
};

struct StructureFileOptions {
  OccupancyPolicy occupancy = OccupancyPolicy::refuse;
  // Distance tolerance in Angstrom, for merging symmetry images and for the
  // spglib search. Files give coordinates to 4 or 5 decimals, so the 1e-5 of
  // hand-made TOML structures is too strict here.
  double symprec = 1e-2;
  // Atoms of the expanded cell beyond which the file is refused: the symmetry
  // search grows with the square of the atoms (100 general sites of Fm-3m make
  // 19,200 atoms and 20 s). Raised with --max-atoms.
  std::size_t max_atoms = 5000;
};

// "refuse" or "ignore"; anything else throws `kind` naming `where`.
OccupancyPolicy parse_occupancy_policy(const std::string& text, const std::string& where, ErrorKind kind);

// Reads a CIF or mCIF file. Throws ts::Error(bad_file) with file:line and what
// would be valid for an unreadable file, a syntax error, a missing cell or
// atom list, operations that do not close or do not map the structure onto
// itself, moments on sites the file does not list, partial occupancy (unless
// ignored) and incommensurate (superspace) files.
CrystalStructure read_structure_file(const std::string& path, const StructureFileOptions& options);
// Same, from text already in memory; `name` stands for the file in messages.
CrystalStructure read_structure_text(const std::string& text, const std::string& name,
                                     const StructureFileOptions& options);

// What the report says about a structure beside its point group: the magnetic
// space group (BNS and spglib UNI number, type), why a type-IV group is grey,
// how the file's stated group and operations compare with the search, and
// what reading the file assumed. One sentence per entry.
std::vector<std::string> structure_symmetry_notes(const CrystalStructure& cell, const StructureSymmetry& symmetry);

} // namespace ts
