// Structure files written the way real programs write them (tests/data/reading,
// each a file of our own reproducing one feature): symmetry by number or Hall
// symbol only, operations with fractional coefficients and translations in
// fifths, text fields in other encodings, a broken second block, duplicate
// tags, a Unicode minus, located row errors, and rhombohedral axes with a cut.
#include "core/error.hpp"
#include "lowering/cif_text.hpp"
#include "lowering/structure_file.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <fstream>

using namespace ts;
using ts::test::run_cli;

namespace {

std::string data(const std::string& name) { return std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/" + name; }
std::string reading(const std::string& name) { return data("reading/" + name); }

bool has(const std::string& text, const std::string& piece) { return text.find(piece) != std::string::npos; }

std::string all_notes(const CrystalStructure& cell) {
  std::string s;
  for (const auto& n : cell.reading_notes) s += n + "\n";
  return s;
}

} // namespace

TEST_CASE("symmetry given only by the International Tables number is expanded, or refused when ambiguous") {
  // No. 2 is P-1 (common practice): 2 listed sites, 4 atoms, point group -1.
  const CrystalStructure cell = read_structure_file(reading("only-number-p-1.cif"), {});
  CHECK(cell.sites.size() == 4);
  CHECK(has(all_notes(cell), "International Tables number 2"));
  const StructureSymmetry sym = find_structure_symmetry(cell);
  CHECK(sym.space_group_number == 2); // spglib
  CHECK(sym.point_group_symbol == "-1");
  // No. 227 has two origin choices in International Tables (common practice).
  const auto r = run_cli({"sample", "--structure-file", reading("only-number-origin-choice.cif"), "--response",
                          "conductivity"});
  CHECK(r.exit_code == 5);
  CHECK(has(r.err, "only-number-origin-choice.cif:11"));
  CHECK(has(r.err, "two origin choices"));
  CHECK(has(r.err, "Hall symbol"));
}

TEST_CASE("a Hall symbol selects the origin choice, before the H-M symbol; alone it is read too") {
  // Diamond-type Si in origin choice 2: 8 atoms, Fd-3m (227), point group m-3m
  // (International Tables, common practice; spglib checks the group).
  for (const char* file : {"hall-origin-choice-2.cif", "hall-only.cif"}) {
    INFO(file);
    const CrystalStructure cell = read_structure_file(reading(file), {});
    CHECK(cell.sites.size() == 8);
    CHECK(has(all_notes(cell), "expanded from the Hall symbol -F 4vw 2vw 3"));
    const StructureSymmetry sym = find_structure_symmetry(cell);
    CHECK(sym.space_group_number == 227);
    CHECK(sym.point_group_symbol == "m-3m");
  }
  const CrystalStructure both = read_structure_file(reading("hall-origin-choice-2.cif"), {});
  CHECK(has(all_notes(both), "the symbol F d -3 m alone stands for another origin or setting"));
}

TEST_CASE("operations with fractional coefficients and translations in fifths, sevenths and ninths") {
  // P-3 in an orthohexagonal C-centred cell: one general site, 12 atoms, point
  // group -3 (No. 147); the change of axes is worked out in the file's header.
  const CrystalStructure hex = read_structure_file(reading("orthohexagonal-fractional-operations.cif"), {});
  CHECK(hex.sites.size() == 12);
  CHECK(has(all_notes(hex), "fractional entries in the file's axes"));
  const StructureSymmetry hs = find_structure_symmetry(hex);
  CHECK(hs.space_group_number == 147);
  CHECK(hs.point_group_symbol == "-3");
  // A five-fold supercell of a P-1 crystal: 20 atoms, point group -1 (a supercell keeps the point group).
  const CrystalStructure five = read_structure_file(reading("supercell-fifths.cif"), {});
  CHECK(five.sites.size() == 20);
  CHECK(find_structure_symmetry(five).point_group_symbol == "-1");
  // Sevenths and ninths, and coefficient spellings programs use (2*x, 0.5x, x/2 style decimals).
  for (int n : {7, 9}) {
    std::string text = "data_s\n_cell_length_a " + std::to_string(4 * n) +
                       "\n_cell_length_b 5\n_cell_length_c 6\n_cell_angle_alpha 90\n_cell_angle_beta 90\n"
                       "_cell_angle_gamma 90\nloop_\n_space_group_symop_operation_xyz\n";
    for (int k = 0; k < n; ++k) text += "'x+" + std::to_string(k) + "/" + std::to_string(n) + ",1*y,+z'\n";
    text += "loop_\n_atom_site_label\n_atom_site_type_symbol\n_atom_site_fract_x\n_atom_site_fract_y\n"
            "_atom_site_fract_z\nFe1 Fe 0.01 0.2 0.3\n";
    const CrystalStructure cell = read_structure_text(text, "sevenths.cif", {});
    CHECK(cell.sites.size() == static_cast<std::size_t>(n));
  }
  const std::string bad = "data_s\n_cell_length_a 4\n_cell_length_b 5\n_cell_length_c 6\n_cell_angle_alpha 90\n"
                          "_cell_angle_beta 90\n_cell_angle_gamma 90\nloop_\n_space_group_symop_operation_xyz\n"
                          "x,y,z\n'-x,-y,-z+1/11'\nloop_\n_atom_site_label\n_atom_site_fract_x\n_atom_site_fract_y\n"
                          "_atom_site_fract_z\nFe1 0.1 0.2 0.3\n";
  try {
    read_structure_text(bad, "elevenths.cif", {});
    FAIL("1/11 was accepted");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_file);
    CHECK(has(e.location(), "elevenths.cif:11")); // the operation's own line
    CHECK(has(e.problem(), "not a divisor of 2520"));
  }
}

TEST_CASE("text fields in other encodings, control characters, typographic quotes, an unquoted H-M symbol") {
  const CrystalStructure cell = read_structure_file(reading("messy-text-fields.cif"), {});
  CHECK(cell.sites.size() == 8); // 2 general sites of P21/c, 4 each: common practice
  const std::string notes = all_notes(cell);
  CHECK(has(notes, "characters outside printable ASCII"));
  CHECK(has(notes, "_chemical_name_common on line 13 has spaces but no quotes"));
  const StructureSymmetry sym = find_structure_symmetry(cell);
  CHECK(sym.space_group_number == 14); // spglib
  CHECK(sym.point_group_symbol == "2/m");

  // The repair keeps every line where it was.
  const CifTextRepair r = repair_cif_text("a\n_t  P 21/c\n\xff\xfe\n;\n\x01\n;\n_x \xe2\x88\x92" "1\n");
  CHECK(r.text == "a\n_t 'P 21/c'\n??\n;\n?\n;\n_x -1\n");
  CHECK(r.notes.size() == 3);
  // A pair followed by another pair on its line, and a quoted value with an inner quote, stay as they are.
  CHECK(repair_cif_text("_a 1 _b 2\n_c 'O'Neil'\n").text == "_a 1 _b 2\n_c 'O'Neil'\n");
}

TEST_CASE("a broken second block and harmless duplicates are read with notes; conflicting duplicates refused") {
  const CrystalStructure cell = read_structure_file(reading("second-block-broken.cif"), {});
  CHECK(cell.sites.size() == 8); // rock salt: 4 Na + 4 Cl, common practice
  const std::string notes = all_notes(cell);
  CHECK(has(notes, "lines 24-33) is not valid CIF and was skipped"));
  CHECK(has(notes, "_cell_length_a is given twice (line 7 and line 8) with the same value"));
  CHECK(find_structure_symmetry(cell).space_group_number == 225);
  // Two sound blocks of one name: the first with a structure is read, and the note says so.
  const std::string block = "data_twice\n_cell_length_a 4\n_cell_length_b 4\n_cell_length_c 4\n_cell_angle_alpha 90\n"
                            "_cell_angle_beta 90\n_cell_angle_gamma 90\nloop_\n_atom_site_label\n_atom_site_fract_x\n"
                            "_atom_site_fract_y\n_atom_site_fract_z\nFe1 0 0 0\n";
  CHECK(has(all_notes(read_structure_text(block + block, "twice.cif", {})), "2 data blocks are named data_twice"));

  const auto r = run_cli({"sample", "--structure-file", reading("duplicate-tag-conflict.cif"), "--response",
                          "conductivity"});
  CHECK(r.exit_code == 5);
  CHECK(has(r.err, "_cell_length_a is given twice with different values (line 4 and line 7)"));
  CHECK(has(r.err, "duplicate-tag-conflict.cif:7"));
}

TEST_CASE("a Unicode minus in a coordinate is read; a bad coordinate is located at its row") {
  const CrystalStructure cell = read_structure_file(reading("unicode-minus.cif"), {});
  CHECK(cell.sites.size() == 5); // SrTiO3, Pm-3m: 1 + 1 + 3 atoms, common practice
  CHECK(has(all_notes(cell), "Unicode minus"));
  CHECK(find_structure_symmetry(cell).point_group_symbol == "m-3m");
  const auto r = run_cli({"sample", "--structure-file", reading("bad-coordinate-row.cif"), "--response",
                          "conductivity"});
  CHECK(r.exit_code == 5);
  CHECK(has(r.err, "bad-coordinate-row.cif:18"));
  CHECK(has(r.err, "site 'O1' has a coordinate that is not a number"));
}

TEST_CASE("a flat cell (an angle within 1e-7 of 180 degrees) is refused before the symmetry search") {
  const auto r = run_cli({"sample", "--structure-file", reading("flat-cell.cif"), "--response", "conductivity"});
  CHECK(r.exit_code == 5);
  CHECK(has(r.err, "the cell angles do not form a cell"));
  ts::test::TempDir dir;
  std::ofstream(dir / "flat.toml") << "responses = [\"conductivity\"]\n[crystal.structure]\na = 4\nb = 4\nc = 4\n"
                                      "alpha = 90\nbeta = 90\ngamma = 179.99999995\n"
                                      "sites = [{ species = \"Fe\", at = [0, 0, 0] }]\n";
  const auto t = run_cli({"run", (dir / "flat.toml").string()});
  CHECK(t.exit_code == 5);
  CHECK(has(t.err, "flat.toml"));
  CHECK(has(t.err, "do not form a cell"));
}

TEST_CASE("Miller indices of a file in rhombohedral axes refer to those axes") {
  // Cr2O3 (-3'm'): the (111) plane of the rhombohedral cell is the (001) plane
  // of the hexagonal one (obverse setting, common practice), so both files give
  // the same film group.
  const auto rh = run_cli({"sample", "--structure-file", data("cr2o3-afm-rhombohedral.mcif"), "--cut", "(111)",
                           "--response", "linear-magnetoelectric"});
  const auto hx = run_cli({"sample", "--structure-file", data("cr2o3-afm.mcif"), "--cut", "(001)", "--response",
                           "linear-magnetoelectric"});
  REQUIRE(rh.exit_code == 0);
  REQUIRE(hx.exit_code == 0);
  CHECK(has(rh.out, "(111) is (001) in the hexagonal axes used here"));
  const auto film_line = [](const std::string& out) {
    const std::size_t p = out.find("cut (");
    return p == std::string::npos ? std::string() : out.substr(out.find(')', p) + 1, out.find('\n', p) - out.find(')', p) - 1);
  };
  CHECK(!film_line(rh.out).empty());
  CHECK(film_line(rh.out) == film_line(hx.out));
}

TEST_CASE("a search that finds nothing is tried at smaller tolerances and says which one answered") {
  // Two Fe atoms 0.005 Angstrom apart, closer than symprec 0.01 but not images
  // of each other: spglib refuses them as too close at 0.01 and answers at 0.001.
  ts::test::TempDir dir;
  std::ofstream(dir / "close.toml") << "responses = [\"conductivity\"]\n[crystal.structure]\n"
                                       "lattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]\nsymprec = 0.01\n"
                                       "sites = [{ species = \"Fe\", at = [0, 0, 0] }, "
                                       "{ species = \"Fe\", at = [0.00125, 0, 0] }]\n";
  const auto r = run_cli({"run", (dir / "close.toml").string()});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "spglib found no symmetry at symprec 0.01 Angstrom; the group is the one found at symprec 0.001"));
}

// A file on which spglib itself crashes (tests/data/reading/near-equal-moments.mcif, an
// invented NiO-like antiferromagnet whose moments differ by multiples of 0.0004 muB) at
// symprec 0.05: a located error of this file, exit 5; in `screen`, with two worker
// processes, one error row and every other row written.
TEST_CASE("a crash inside the symmetry library is an error of one file, never of the run") {
  const std::string file = reading("near-equal-moments.mcif");
  const auto fine = run_cli({"sample", "--structure-file", file, "--response", "conductivity"});
  CHECK(fine.exit_code == 0);
  const auto crash = run_cli({"sample", "--structure-file", file, "--symprec", "0.05", "--response", "conductivity"});
  CHECK(crash.exit_code == 5);
  CHECK(has(crash.err, "near-equal-moments.mcif"));
  CHECK(has(crash.err, "crashed"));
  CHECK(has(crash.err, "a smaller symprec"));
  const auto screen = run_cli({"screen", file, data("cr2o3-afm.mcif"), data("fe-bcc-ferromagnet.mcif"), "--symprec",
                               "0.05", "--response", "anomalous-hall", "-j", "2", "-f", "csv"});
  CHECK(screen.exit_code == 5);
  CHECK(has(screen.out, "cr2o3-afm.mcif,-3'm'"));
  CHECK(has(screen.out, "fe-bcc-ferromagnet.mcif,4/mm'm'"));
  CHECK(has(screen.out, "crashed"));
}
