// Crystal structures in, point operations out.
//
// A structure (lattice + atoms, optionally with magnetic moments) is handed to
// spglib (Debian libsymspg-dev), which finds its space group; we keep the
// distinct point parts of the space-group operations (translations dropped),
// each with a time-reversal flag for magnetic structures. Those point parts are
// what decides which macroscopic tensors are allowed (Neumann's principle), so
// this is the bridge from "here is my crystal" to the group engine.
//
// Conventions (docs/structures.md has the full description and a TOML example):
// - `lattice` holds the lattice vectors as ROWS, in Cartesian Angstrom:
//   lattice[0] = a, lattice[1] = b, lattice[2] = c. Call this matrix M. Then the
//   Cartesian position of fractional coordinates f (a column) is r = M^T f.
//   (spglib wants the transpose, the vectors as columns; we convert.)
// - spglib's rotation W acts on fractional columns, f' = W f + w. With r = M^T f,
//   the same operation on Cartesian columns is
//       R_cart = M^T W M^-T,
//   an orthogonal matrix for every true symmetry of the lattice.
// - Moments are axial vectors in the same Cartesian frame (Bohr magnetons, but
//   only directions and ratios matter). An operation (R, primed) maps a moment m
//   to  det(R) R m  and, when primed, to minus that.
#pragma once

#include <array>
#include <string>
#include <utility>
#include <vector>

namespace ts {

struct AtomSite {
  std::string species;                // any label; equal labels mean the same kind of atom
  std::array<double, 3> frac;         // fractional coordinates along a, b, c
  std::array<double, 3> moment{0, 0, 0}; // Cartesian axial vector, used when the structure is magnetic
};

struct CrystalStructure {
  std::array<std::array<double, 3>, 3> lattice; // rows = lattice vectors a, b, c in Cartesian Angstrom
  std::vector<AtomSite> sites;
  bool magnetic = false; // true when any site has a moment given (even a zero one)
  // Distance tolerance in Angstrom for the symmetry search, read from the file's
  // optional `symprec`; used by the one-argument find_structure_symmetry.
  double symprec = 1e-5;
  // Where the structure came from ("cell.toml:[structure]"), quoted in errors
  // raised by the symmetry search. Empty for structures built in code.
  std::string where;
  // Filled by read_structure_file (structure_file.hpp) for CIF and mCIF input:
  // what the file states, cross-checked against the search, and what reading
  // it assumed (partial occupancy ignored, sites merged, ...).
  std::string stated_bns_number; // _space_group_magn.number_BNS, empty when not stated
  std::vector<std::pair<std::array<std::array<int, 3>, 3>, bool>> stated_point_parts; // (W, primed)
  std::vector<std::string> reading_notes;
  // The file gave rhombohedral axes, turned into hexagonal ones (obverse:
  // a_h = a - b, b_h = b - c, c_h = a + b + c); Miller indices and directions
  // the user writes for this structure refer to the file's axes.
  bool rhombohedral_axes = false;
};

struct PointOperation {
  std::array<std::array<int, 3>, 3> rotation_lattice;       // W, in the lattice basis, as spglib gives it
  std::array<std::array<double, 3>, 3> rotation_cartesian;  // R_cart = M^T W M^-T (see above)
  bool time_reversal = false;                                // primed operation (magnetic structures only)
};

struct StructureSymmetry {
  // Non-magnetic structure: the space group of the structure.
  // Magnetic structure: the space group that spglib's magnetic dataset names
  // by its Hall number, i.e. the family group (all operations with the primes
  // dropped) for magnetic types I-III and the maximal unitary subgroup for
  // type IV (a group with anti-translations).
  int space_group_number = 0;
  std::string space_group_symbol; // international short symbol, e.g. "Pnma", "P4_2/nmc"
  std::string point_group_symbol; // spglib's point-group symbol of that space group, e.g. "mmm"
  // Distinct (point part, time reversal) pairs of all space-group operations,
  // in spglib's order (identity first). For a magnetic structure this is the
  // magnetic point group, primed operations included; for a non-magnetic one it
  // is the ordinary point group and no operation is primed (time reversal itself,
  // 1', is a symmetry of every non-magnetic crystal and is left to the caller).
  std::vector<PointOperation> point_operations;
  int magnetic_uni_number = 0; // UNI serial number (1..1651) from spglib when magnetic, else 0
  int magnetic_type = 0;       // 1..4 (type IV: anti-translations, grey point group) when magnetic, else 0
  std::string bns_number;      // BNS number of the magnetic space group, e.g. "167.108", when magnetic
  double symprec = 1e-5;       // the tolerance the search used
  // The input axes miss some operations (their matrices there are not integer,
  // e.g. a threefold axis in an orthohexagonal cell), so rotation_lattice is
  // written in the axes of the primitive cell spglib found; rotation_cartesian
  // is in the structure's Cartesian frame as always.
  bool primitive_basis = false;
};

// A [structure] block of a TOML file is read by parse_structure (lowering/structure_table.hpp).

// Space group and point operations of a structure, by spglib. Uses the magnetic
// search (moments as axial rank-1 site tensors) when `cell.magnetic`. Throws
// ts::Error(ErrorKind::bad_file) quoting cell.where and spglib's own message
// when spglib fails (atoms too close, no symmetry found within symprec, ...).
StructureSymmetry find_structure_symmetry(const CrystalStructure& cell, double symprec);
// Same, with the structure's own tolerance `cell.symprec` (1e-5 unless the file set it).
StructureSymmetry find_structure_symmetry(const CrystalStructure& cell);
// spglib runs in a child process per search (on by default), so a crash there
// is an error of one structure. A process that is itself a disposable worker
// (screening, scenario/worker_processes.hpp) turns it off for speed and handles
// its own end.
void set_symmetry_library_isolation(bool on);

// Lattice rows a, b, c from a, b, c (Angstrom) and alpha, beta, gamma (degrees):
// a along x, b in the xy plane. False when the angles do not close a cell.
bool lattice_from_cell_parameters(const std::array<double, 6>& parameters, std::array<std::array<double, 3>, 3>* lattice);

// r = M^T f: Cartesian position (Angstrom) of fractional coordinates f.
std::array<double, 3> fractional_to_cartesian(const CrystalStructure& cell,
                                              const std::array<double, 3>& frac);

} // namespace ts
