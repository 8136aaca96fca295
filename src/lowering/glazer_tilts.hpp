// Octahedral tilt systems of ABO3 perovskites, in Glazer's notation
// (A. M. Glazer, "The classification of tilted octahedra in perovskites",
// Acta Cryst. B28, 3384 (1972)).
//
// A Glazer symbol gives, for each pseudocubic axis x, y, z in turn, a letter and
// a superscript: equal letters mean equal tilt magnitudes, and the superscript
// says how successive octahedra along that axis turn about it:
//   0  no tilt about this axis
//   +  in phase: every octahedron along the axis turns the same way
//   -  anti-phase: successive octahedra along the axis turn oppositely
// Perpendicular to the axis, neighbouring octahedra always turn oppositely, as
// corner sharing forces. Examples: a0a0c- (one anti-phase tilt about z),
// a-a-a- (equal anti-phase tilts about x, y, z), a+b-b- (the common
// orthorhombic system).
//
// build_tilted_perovskite() makes the tilted structure for real and asks spglib
// for its space group, so the result is a computation, not a table look-up;
// tests/glazer_tilts_test.cpp compares it with the published assignments.
// docs/structures.md describes the construction.
#pragma once

#include "lowering/structure_symmetry.hpp"

#include <array>
#include <string>
#include <vector>

namespace ts {

struct TiltSystem {
  std::string glazer;                  // normalised ASCII form, e.g. "a+b-b-"
  std::array<char, 3> sense;           // per axis x, y, z: '0', '+' or '-'
  // Per axis: index (0, 1, 2) of the first axis carrying the same letter, so
  // equal entries mean equal tilt magnitudes. "a+b-b-" -> {0, 1, 1},
  // "a0a0c-" -> {0, 0, 2}.
  std::array<int, 3> magnitude_class;
};

// Parses a Glazer symbol. Accepted: three (letter, superscript) pairs, the
// letter for axis i being its own letter (a, b, c for x, y, z) or the letter of
// an earlier axis (equal magnitude); the superscript is 0, + or -, written in
// ASCII or as the Unicode superscripts ⁰ ⁺ ⁻ (the minus sign − is accepted too),
// optionally preceded by '^'. Surrounding blanks are ignored. Axes sharing a
// letter must be all tilted or all untilted. Throws ts::Error(bad_spec) naming
// the offending character (counted from 1) and the valid form.
TiltSystem parse_glazer_symbol(const std::string& text);

struct TiltedPerovskite {
  TiltSystem tilts;
  CrystalStructure cell;      // the 2x2x2 pseudocubic supercell, 40 atoms, labels "A", "B", "O"
  StructureSymmetry symmetry; // spglib's answer for `cell`
  // The point operations of `symmetry` as integer matrices acting on Cartesian
  // columns in the pseudocubic frame (x, y, z along the parent cubic axes); all
  // are signed permutation matrices, elements of the parent m-3m.
  std::vector<std::array<std::array<int, 3>, 3>> point_rotations_pseudocubic;
};

// Builds the tilted perovskite for `tilts` and finds its symmetry. Distinct
// letters get tilt angles of 5, 7 and 9 degrees (letter a, b, c in order of
// first appearance), so no accidental equality adds symmetry. Throws
// ts::Error(bad_spec) for an inconsistent TiltSystem and ts::Error(internal)
// if the symmetry found is not a subgroup of m-3m in the pseudocubic frame.
TiltedPerovskite build_tilted_perovskite(const TiltSystem& tilts);

// The 15 distinct tilt systems of Howard & Stokes, "Group-theoretical analysis
// of octahedral tilting in perovskites", Acta Cryst. B54, 782 (1998), in the
// order a0a0a0, then one, two and three tilts. Glazer's 1972 list has 23
// symbols; the other 8 parse and build as well (docs/structures.md lists the
// groups this construction finds for them).
std::vector<std::string> all_glazer_tilt_systems();

} // namespace ts
