// The group table built into the library (src/group/group_table.hpp) against a
// fresh derivation of the catalogue from groups/*.toml: the table must be exactly
// what the data files give, reading it must give back the same catalogue, and a
// data directory with other files must be derived, not read from the table.
// The checks are of the build against its own data; the data itself is checked
// against outside references in group_catalogue_test.cpp and groups/check_groups.py.
#include "group/group_catalogue.hpp"
#include "group/group_table.hpp"
#include "support/cli_run.hpp"
#include "support/data_copy.hpp"

#include <catch2/catch.hpp>


using namespace ts;
using namespace ts::test;

namespace {

const std::string source_dir = TENSORSIEVE_SOURCE_DIR;

void check_same_group(const PointGroup& a, const PointGroup& b) {
  CHECK(a.lattice() == b.lattice());
  CHECK(a.operations() == b.operations()); // the same operations in the same canonical order
  CHECK(a.generators() == b.generators());
}

void check_same_catalogue(const GroupCatalogue& read, const GroupCatalogue& derived) {
  REQUIRE(read.crystal_classes().size() == derived.crystal_classes().size());
  for (std::size_t i = 0; i < derived.crystal_classes().size(); ++i) {
    const CrystalClass& r = read.crystal_classes()[i];
    const CrystalClass& d = derived.crystal_classes()[i];
    INFO("class " << d.name);
    CHECK(r.name == d.name);
    CHECK(r.full == d.full);
    CHECK(r.schoenflies == d.schoenflies);
    CHECK(r.system == d.system);
    CHECK(r.laue == d.laue);
    CHECK(r.type == d.type);
    CHECK(r.setting == d.setting);
    CHECK(r.aliases == d.aliases);
    CHECK(r.magnetic_names == d.magnetic_names);
    CHECK(r.standard == d.standard);
    CHECK(r.centrosymmetric == d.centrosymmetric);
    CHECK(r.polar == d.polar);
    CHECK(r.lattice == d.lattice);
    CHECK(r.generators == d.generators);
    REQUIRE(r.symbol.size() == d.symbol.size());
    for (std::size_t k = 0; k < d.symbol.size(); ++k) {
      CHECK(r.symbol[k].text == d.symbol[k].text);
      CHECK(r.symbol[k].op == d.symbol[k].op);
    }
    CHECK(r.source == d.source);
    check_same_group(r.group, d.group);
  }
  REQUIRE(read.groups().size() == derived.groups().size());
  for (std::size_t i = 0; i < derived.groups().size(); ++i) {
    const NamedGroup& r = read.groups()[i];
    const NamedGroup& d = derived.groups()[i];
    INFO("group " << d.symbol);
    CHECK(r.symbol == d.symbol);
    CHECK(r.type_symbol == d.type_symbol);
    CHECK(r.family == d.family);
    CHECK(r.unitary_type == d.unitary_type);
    CHECK(r.schoenflies == d.schoenflies);
    CHECK(r.kind == d.kind);
    CHECK(r.is_type_standard == d.is_type_standard);
    CHECK(r.type_index == d.type_index);
    CHECK(r.crystal - read.crystal_classes().data() == d.crystal - derived.crystal_classes().data());
    check_same_group(r.group, d.group);
    const CrystalClass* rt = read.crystallographic_type_of(r.group);
    const CrystalClass* dt = derived.crystallographic_type_of(d.group);
    REQUIRE(rt);
    REQUIRE(dt);
    CHECK(rt->name == dt->name);
    // Every symbol that names the group finds it in both.
    const NamedGroup* found = read.find(d.symbol);
    REQUIRE(found);
    CHECK(found->symbol == derived.find(d.symbol)->symbol);
  }
  CHECK(read.types().size() == 122);
}

} // namespace

TEST_CASE("the built group table is the derivation of the group files", "[group_table]") {
  const std::uint64_t fingerprint = group_data_fingerprint(source_dir);
  REQUIRE(fingerprint != 0);
  CHECK(group_table_fingerprint(built_group_table()) == fingerprint);
  const auto derived = GroupCatalogue::load(source_dir);
  CHECK(derived->table_text(fingerprint) == std::string(built_group_table()));
}

TEST_CASE("reading the built group table gives the derived catalogue", "[group_table]") {
  const auto derived = GroupCatalogue::load(source_dir);
  const auto read = GroupCatalogue::from_table(built_group_table(), source_dir);
  check_same_catalogue(*read, *derived);
  // The source data directory matches the table, so load_with_table reads it.
  check_same_catalogue(*GroupCatalogue::load_with_table(source_dir), *derived);
}

TEST_CASE("an unchanged copy of the group files elsewhere uses the table and names its own files",
          "[group_table]") {
  DataCopy copy;
  const std::string dir = copy.dir.path().string();
  CHECK(group_data_fingerprint(dir) == group_data_fingerprint(source_dir));
  const auto read = GroupCatalogue::load_with_table(dir);
  check_same_catalogue(*read, *GroupCatalogue::load(dir));
  CHECK(read->crystal_classes().front().source.rfind((copy.dir / "groups").string(), 0) == 0);
}

TEST_CASE("edited group files are derived, not read from the table", "[group_table]") {
  DataCopy copy;
  const std::string edited = "setting = \"4 along z, edited copy\"";
  copy.replace("groups/tetragonal.toml", "setting = \"4 ∥ z (polar axis z); mirrors ⊥ x, y and ⊥ [110], [1-10]\"", edited);
  const std::string dir = copy.dir.path().string();
  CHECK(group_data_fingerprint(dir) != group_data_fingerprint(source_dir));
  const auto cat = GroupCatalogue::load_with_table(dir);
  CHECK(cat->get("4mm").crystal->setting == "4 along z, edited copy");
  check_same_catalogue(*cat, *GroupCatalogue::load(dir));

  // The command line reads the edited copy through TENSORSIEVE_DATA.
  CliResult r = run_cli({"group", "4mm"}, {{"TENSORSIEVE_DATA", dir}});
  INFO("stderr: " << r.err);
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("4 along z, edited copy") != std::string::npos);
  CliResult built = run_cli({"group", "4mm"});
  CHECK(built.exit_code == 0);
  CHECK(built.out.find("edited copy") == std::string::npos);
}

TEST_CASE("a broken group file in a copy is reported from the derivation", "[group_table]") {
  DataCopy copy;
  copy.replace("groups/tetragonal.toml", "order = 8", "order = 9");
  CliResult r = run_cli({"group", "4mm"}, {{"TENSORSIEVE_DATA", copy.dir.path().string()}});
  CHECK(r.exit_code != 0);
  CHECK(r.out.empty());
  CHECK(r.err.find("tetragonal.toml") != std::string::npos);
  CHECK(r.err.find("'order' says 9") != std::string::npos);
}
