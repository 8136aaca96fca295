// CIF and mCIF files in: textbook crystals against their published space and
// magnetic groups, and broken files against located messages.
#include "core/error.hpp"
#include "lowering/structure_file.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <fstream>

using namespace ts;
using ts::test::run_cli;

namespace {

std::string data(const std::string& name) { return std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/" + name; }

bool has(const std::string& text, const std::string& piece) { return text.find(piece) != std::string::npos; }

StructureSymmetry symmetry_of(const std::string& name, StructureFileOptions options = {}) {
  return find_structure_symmetry(read_structure_file(data(name), options));
}

} // namespace

// Dzyaloshinskii 1960 (Sov. Phys. JETP 10, 628): the magnetic point group of
// Cr2O3 is -3'm', which allows alpha_xx = alpha_yy and alpha_zz and nothing
// else. BNS number 167.106: from memory (and spglib's tables). 30 atoms: 12 Cr
// + 18 O in the hexagonal cell (R-3c: 12c and 18e), common practice.
void check_cr2o3_afm(const std::string& file) {
  INFO(file);
  const CrystalStructure cell = read_structure_file(data(file), {});
  CHECK(cell.magnetic);
  CHECK(cell.sites.size() == 30);
  const StructureSymmetry sym = find_structure_symmetry(cell);
  CHECK(sym.space_group_number == 167);
  CHECK(sym.bns_number == "167.106");
  CHECK(sym.magnetic_type == 3);
  CHECK(sym.point_operations.size() == 12);
  const auto r = run_cli({"sample", "--structure-file", data(file), "--response", "linear-magnetoelectric"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "bulk     -3'm'"));
  CHECK(has(r.out, "the file states BNS 167.106, as found"));
  CHECK(has(r.out, "all 12 stated point operations confirmed"));
  CHECK(has(r.out, "alpha_xx = alpha_yy  alpha_xx"));
  CHECK(has(r.out, "parameters:  alpha_xx, alpha_zz"));
}

TEST_CASE("Cr2O3 with moments along c: R-3'c', point group -3'm', the magnetoelectric class") {
  check_cr2o3_afm("cr2o3-afm.mcif");
}

TEST_CASE("Cr2O3 in rhombohedral axes gives the same groups, turned into hexagonal axes") {
  check_cr2o3_afm("cr2o3-afm-rhombohedral.mcif");
  const auto r = run_cli({"sample", "--structure-file", data("cr2o3-afm-rhombohedral.mcif"), "--response",
                          "linear-magnetoelectric"});
  CHECK(has(r.out, "rhombohedral axes of the file turned into hexagonal axes"));
}

TEST_CASE("Cr2O3 above the Neel temperature from its symbol alone: R-3c, -3m1'") {
  const StructureSymmetry sym = symmetry_of("cr2o3-paramagnetic.cif");
  CHECK(sym.space_group_number == 167);       // International Tables, corundum type: common practice
  CHECK(sym.point_group_symbol == "-3m");
  const auto r = run_cli({"sample", "--structure-file", data("cr2o3-paramagnetic.cif"), "--response",
                          "linear-magnetoelectric", "-f", "json"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "\"type\" : \"-3m1'\""));
  CHECK(has(r.out, "operations expanded from the symbol R -3 c"));
}

TEST_CASE("CIF 2 tag names are read; CIF 2 syntax beyond them is refused with its line") {
  const CrystalStructure cell = read_structure_file(data("nacl-cif2-names.cif"), {});
  CHECK(cell.sites.size() == 8); // 4 Na + 4 Cl in the conventional cell: common practice
  const StructureSymmetry sym = find_structure_symmetry(cell);
  CHECK(sym.space_group_number == 225); // rock salt, Fm-3m: common practice
  CHECK(sym.point_group_symbol == "m-3m");
  const auto r = run_cli({"sample", "--structure-file", data("malformed/cif2-triple-quoted.cif"), "--response",
                          "conductivity"});
  CHECK(r.exit_code == 5);
  CHECK(has(r.err, "cif2-triple-quoted.cif:5:"));
  CHECK(has(r.err, "not lists, tables or triple-quoted strings"));
}

TEST_CASE("bcc Fe with moments along [001]: I4/mm'm', anomalous Hall allowed") {
  // I4/mm'm', BNS 139.537, and sigma_xy of a ferromagnet along z: common practice
  // (BNS number from memory; spglib agrees).
  const StructureSymmetry sym = symmetry_of("fe-bcc-ferromagnet.mcif");
  CHECK(sym.bns_number == "139.537");
  CHECK(sym.magnetic_type == 3);
  const auto r = run_cli({"sample", "--structure-file", data("fe-bcc-ferromagnet.mcif"), "--response",
                          "anomalous-hall"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "4/mm'm'"));
  CHECK(has(r.out, "parameters:  h_z"));
}

TEST_CASE("MnO type-II order: a type-IV group, grey point group, no anomalous Hall effect") {
  // C_c2/c, BNS 15.90 for MnO with the moments in the (111) sheets: from memory;
  // spglib's magnetic search is the outside check of the group.
  const StructureSymmetry sym = symmetry_of("mno-afm.mcif");
  CHECK(sym.magnetic_type == 4);
  CHECK(sym.bns_number == "15.90");
  const auto r = run_cli({"sample", "--structure-file", data("mno-afm.mcif"), "--response", "anomalous-hall"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "2/m1'"));
  CHECK(has(r.out, "type IV: an anti-translation"));
  CHECK(has(r.out, "anomalous Hall effect of this antiferromagnet, are forbidden"));
  CHECK(has(r.out, "forbidden"));
}

TEST_CASE("a stated BNS number the atoms do not have is reported, not trusted") {
  ts::test::TempDir dir;
  std::string text = ts::test::read_file(data("fe-bcc-ferromagnet.mcif"));
  text.replace(text.find("number_BNS  139.537"), 19, "number_BNS  139.536");
  std::ofstream(dir / "fe.mcif") << text;
  const auto r = run_cli({"sample", "--structure-file", (dir / "fe.mcif").string(), "--response", "anomalous-hall"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "the file states BNS 139.536, but its atoms and moments have BNS 139.537"));
}

TEST_CASE("partial occupancy is refused by default and merged when ignored") {
  CHECK_THROWS_AS(read_structure_file(data("malformed/partial-occupancy.cif"), {}), Error);
  StructureFileOptions ignore;
  ignore.occupancy = OccupancyPolicy::ignore;
  const CrystalStructure cell = read_structure_file(data("malformed/partial-occupancy.cif"), ignore);
  CHECK(cell.sites.size() == 8); // 4 mixed cation sites + 4 O in the F-centred cell
  CHECK(cell.sites.front().species == "Fe/Co");
  const auto r = run_cli({"sample", "--structure-file", data("malformed/partial-occupancy.cif"), "--occupancy",
                          "ignore", "--response", "conductivity"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "partial occupancy ignored: Fe1 (0.5), Co1 (0.5)"));
  CHECK(has(r.out, "m-3m1'"));
  const auto bad = run_cli({"sample", "--structure-file", data("cr2o3-afm.mcif"), "--occupancy", "maybe",
                            "--response", "conductivity"});
  CHECK(bad.exit_code == 2);
  CHECK(has(bad.err, "--occupancy"));
}

TEST_CASE("broken structure files give a located message and exit code 5") {
  struct Case {
    const char* file;
    const char* where;
    const char* what;
  };
  const Case cases[] = {
      {"missing-cell.cif", "missing-cell.cif (data_missing_cell)", "missing _cell_length_c"},
      {"broken-loop.cif", "broken-loop.cif:9:1", "Wrong number of values in the loop"},
      {"open-operations.mcif", "open-operations.mcif:13", "the stated operations do not close"},
      {"moment-on-absent-site.mcif", "moment-on-absent-site.mcif:21", "site 'Fe2', which the atom sites do not list"},
      {"moment-against-operation.mcif", "moment-against-operation.mcif:14",
       "operation 2 (-y,x,z,+1) maps site 'Fe1' onto itself"},
      {"incommensurate.mcif", "incommensurate.mcif:9", "incommensurate (superspace) structure"},
      {"partial-occupancy.cif", "partial-occupancy.cif:11", "partial occupancy (a disordered crystal) at sites Fe1"},
      {"unknown-symbol.cif", "unknown-symbol.cif:3", "unknown space-group symbol 'P 7 2 2'"},
  };
  for (const auto& c : cases) {
    INFO(c.file);
    const auto r =
        run_cli({"sample", "--structure-file", data(std::string("malformed/") + c.file), "--response", "conductivity"});
    CHECK(r.exit_code == 5);
    CHECK(has(r.err, c.where));
    CHECK(has(r.err, c.what));
    CHECK(has(r.err, "valid:"));
    CHECK(r.out.empty());
  }
  const auto missing = run_cli({"sample", "--structure-file", data("no-such-file.cif"), "--response", "conductivity"});
  CHECK(missing.exit_code == 5);
  CHECK(has(missing.err, "cannot open the structure file"));
}

TEST_CASE("a scenario reads its crystal from a file next to it") {
  ts::test::TempDir dir;
  std::filesystem::create_directory(dir / "cif");
  std::filesystem::copy_file(data("cr2o3-afm.mcif"), dir / "cif" / "cr2o3.mcif");
  std::ofstream(dir / "me.toml") << "title = \"Cr2O3 film\"\nresponses = [\"linear-magnetoelectric\"]\n"
                                    "[crystal]\nfile = \"cif/cr2o3.mcif\"\n[sample]\ncut = \"(001)\"\n";
  const auto r = run_cli({"run", (dir / "me.toml").string()});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "-3'm'"));
  CHECK(has(r.out, "cut (001)"));

  std::ofstream(dir / "bad.toml") << "responses = [\"conductivity\"]\n[crystal]\nfile = \"cif/cr2o3.mcif\"\n"
                                     "occupancy = \"sometimes\"\n";
  const auto bad = run_cli({"run", (dir / "bad.toml").string()});
  CHECK(bad.exit_code == 5);
  CHECK(has(bad.err, "bad.toml:4"));
  CHECK(has(bad.err, "unknown occupancy handling 'sometimes'"));

  std::ofstream(dir / "tolerance.toml") << "responses = [\"conductivity\"]\n[crystal]\nfile = \"cif/cr2o3.mcif\"\n"
                                           "symprec = 2\n";
  const auto tolerance = run_cli({"run", (dir / "tolerance.toml").string()});
  CHECK(tolerance.exit_code == 5);
  CHECK(has(tolerance.err, "tolerance.toml:4"));
  CHECK(has(tolerance.err, "'symprec' must be a distance"));
  const auto zero = run_cli({"sample", "--structure-file", data("cr2o3-afm.mcif"), "--symprec", "0", "--response",
                             "conductivity"});
  CHECK(zero.exit_code == 2);
  CHECK(has(zero.err, "--symprec"));

  const auto both = run_cli({"sample", "m-3m", "--structure-file", data("cr2o3-afm.mcif"), "--response", "conductivity"});
  CHECK(both.exit_code == 2);
  CHECK(has(both.err, "a point group or --structure-file"));
}
