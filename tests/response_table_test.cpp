// The response table built into the library (src/response/response_table.hpp)
// against a fresh load of src/response/catalogue.toml and families.toml: the table
// must be exactly what the files give, reading it must give back the same
// catalogue field by field, and a catalogue whose files differ must be loaded from
// them, not read from the table. These are checks of the build against its own
// data; the data itself is checked against outside references in
// response_catalogue_test.cpp and response_physics_test.cpp.
#include "data/record_table.hpp"
#include "response/response_catalogue.hpp"
#include "response/response_table.hpp"
#include "support/cli_run.hpp"
#include "support/data_copy.hpp"

#include <catch2/catch.hpp>

#include <fstream>

using namespace ts;
using namespace ts::test;

namespace {

const std::string source_catalogue = std::string(TENSORSIEVE_SOURCE_DIR) + "/src/response/catalogue.toml";

void check_same_spec(const TensorSpec& a, const TensorSpec& b) {
  CHECK(a.name == b.name);
  CHECK(a.letters == b.letters);
  CHECK(a.rank == b.rank);
  CHECK(a.axial == b.axial);
  CHECK(a.time_odd == b.time_odd);
  REQUIRE(a.symmetries.size() == b.symmetries.size());
  for (std::size_t i = 0; i < a.symmetries.size(); ++i) {
    CHECK(a.symmetries[i].perm == b.symmetries[i].perm);
    CHECK(a.symmetries[i].sign == b.symmetries[i].sign);
  }
  CHECK(a.symmetry_text == b.symmetry_text);
  CHECK(a.onsager == b.onsager);
  CHECK(a.jahn == b.jahn);
  CHECK(a.canonical_text() == b.canonical_text());
}

void check_same_catalogue(const ResponseCatalogue& read, const ResponseCatalogue& loaded) {
  CHECK(read.path() == loaded.path());
  CHECK(read.families() == loaded.families());
  REQUIRE(read.responses().size() == loaded.responses().size());
  for (std::size_t i = 0; i < loaded.responses().size(); ++i) {
    const Response& r = read.responses()[i];
    const Response& l = loaded.responses()[i];
    INFO("response " << l.id);
    CHECK(r.id == l.id);
    CHECK(r.name == l.name);
    CHECK(r.relation == l.relation);
    CHECK(r.response == l.response);
    CHECK(r.harmonic == l.harmonic);
    CHECK(r.time_reversal == l.time_reversal);
    CHECK(r.onsager == l.onsager);
    CHECK(r.source == l.source);
    CHECK(r.status == l.status);
    CHECK(r.aliases == l.aliases);
    CHECK(r.drives == l.drives);
    CHECK(r.where == l.where);
    REQUIRE(r.parts.size() == l.parts.size());
    for (std::size_t k = 0; k < l.parts.size(); ++k) {
      const ResponsePart& a = r.parts[k];
      const ResponsePart& b = l.parts[k];
      INFO("part " << b.label);
      CHECK(a.label == b.label);
      CHECK(a.spec_text == b.spec_text);
      CHECK(a.mechanism == b.mechanism);
      CHECK(a.indices == b.indices);
      CHECK(a.harmonic == b.harmonic);
      CHECK(a.drive == b.drive);
      CHECK(a.hall == b.hall);
      CHECK(a.excluded_text == b.excluded_text);
      CHECK(a.where == b.where);
      check_same_spec(a.spec, b.spec);
      REQUIRE(a.excluded.has_value() == b.excluded.has_value());
      if (b.excluded) check_same_spec(*a.excluded, *b.excluded);
    }
  }
}

} // namespace

TEST_CASE("the built response table is the catalogue files read", "[response_table]") {
  const std::uint64_t fingerprint = response_data_fingerprint(source_catalogue);
  REQUIRE(fingerprint != 0);
  CHECK(response_table_fingerprint(built_response_table()) == fingerprint);
  const auto loaded = ResponseCatalogue::load(source_catalogue);
  CHECK(loaded->table_text(fingerprint) == std::string(built_response_table()));
}

TEST_CASE("reading the built response table gives the loaded catalogue", "[response_table]") {
  const auto loaded = ResponseCatalogue::load(source_catalogue);
  const auto read = ResponseCatalogue::from_table(built_response_table(), source_catalogue);
  check_same_catalogue(*read, *loaded);
  check_same_catalogue(*ResponseCatalogue::load_with_table(source_catalogue), *loaded);
  // The families survive: `transport` expands to the same ids.
  CHECK(read->expand("transport") == loaded->expand("transport"));
  CHECK(read->expand("transport").size() > 5);
}

TEST_CASE("an unchanged copy of the catalogue elsewhere uses the table and names its own file",
          "[response_table]") {
  DataCopy copy;
  CHECK(response_data_fingerprint(copy.catalogue()) == response_data_fingerprint(source_catalogue));
  const auto read = ResponseCatalogue::load_with_table(copy.catalogue());
  check_same_catalogue(*read, *ResponseCatalogue::load(copy.catalogue()));
  CHECK(read->path() == copy.catalogue());
  CHECK(read->responses().front().where.rfind(copy.catalogue() + ":", 0) == 0);
  CHECK(read->responses().front().parts.front().where.rfind(copy.catalogue() + ":", 0) == 0);
}

TEST_CASE("an edited catalogue or family file is loaded, not read from the table", "[response_table]") {
  DataCopy copy;
  copy.replace("responses/catalogue.toml", "name = \"linear electrical conductivity (longitudinal and Hall)\"",
               "name = \"linear conductivity, edited copy\"");
  CHECK(response_data_fingerprint(copy.catalogue()) != response_data_fingerprint(source_catalogue));
  const auto cat = ResponseCatalogue::load_with_table(copy.catalogue());
  CHECK(cat->get("conductivity").name == "linear conductivity, edited copy");
  check_same_catalogue(*cat, *ResponseCatalogue::load(copy.catalogue()));

  CliResult r = run_cli({"response", "conductivity", "m-3m"}, {{"TENSORSIEVE_DATA", copy.path()}});
  INFO("stderr: " << r.err);
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("edited copy") != std::string::npos);
  CliResult built = run_cli({"response", "conductivity", "m-3m"});
  CHECK(built.exit_code == 0);
  CHECK(built.out.find("edited copy") == std::string::npos);

  // The family file is part of the fingerprint too.
  DataCopy families;
  families.replace("responses/families.toml", "transport = [", "electrical = [");
  CHECK(response_data_fingerprint(families.catalogue()) != response_data_fingerprint(source_catalogue));
  const auto moved = ResponseCatalogue::load_with_table(families.catalogue());
  CHECK(moved->families().count("electrical") == 1);
  CHECK(moved->families().count("transport") == 0);
}

TEST_CASE("a broken catalogue in a copy is reported from its file", "[response_table]") {
  DataCopy copy;
  copy.replace("responses/catalogue.toml", "id = \"conductivity\"", "id = \"Conductivity\"");
  CliResult r = run_cli({"response", "conductivity", "m-3m"}, {{"TENSORSIEVE_DATA", copy.path()}});
  CHECK(r.exit_code != 0);
  CHECK(r.out.empty());
  CHECK(r.err.find(copy.catalogue() + ":") != std::string::npos);
  CHECK(r.err.find("'Conductivity' is not a valid id") != std::string::npos);
}

TEST_CASE("a catalogue whose texts hold tabs, line breaks and backslashes survives the table",
          "[response_table]") {
  TempDir dir;
  const std::string path = (dir / "catalogue.toml").string();
  std::ofstream(path) << "[[response]]\n"
                         "id = \"test-effect\"\n"
                         "name = \"a name\\twith a tab\"\n"
                         "relation = \"\"\"two\nlines\"\"\"\n"
                         "response = \"j\"\n"
                         "drives = [\"E\"]\n"
                         "harmonic = \"1ω\"\n"
                         "time_reversal = \"back\\\\slash\"\n"
                         "onsager = \"none\"\n"
                         "source = \"Nye, Physical Properties of Crystals (1957) [from memory]\"\n"
                         "status = \"from memory\"\n"
                         "[[response.part]]\n"
                         "label = \"sigma\"\n"
                         "spec = \"sigma_ab: onsager(a,b)\"\n"
                         "indices = [\"j\", \"E\"]\n"
                         "harmonic = 1\n"
                         "drive = \"field\"\n";
  const auto loaded = ResponseCatalogue::load(path);
  const Response& x = loaded->get("test-effect");
  CHECK(x.name == "a name\twith a tab");
  CHECK(x.relation == "two\nlines");
  CHECK(x.time_reversal == "back\\slash");
  const std::string table = loaded->table_text(response_data_fingerprint(path));
  CHECK(table.find("a name\twith") == std::string::npos); // escaped, so records stay one per line
  check_same_catalogue(*ResponseCatalogue::from_table(table, path), *loaded);
}

TEST_CASE("the record format escapes what would split a record", "[response_table]") {
  RecordWriter w("test table");
  w.field("tag").field("plain").field("tab\there").field("line\nbreak").field("back\\slash").field("\\t literally");
  w.field(-42).field(true);
  w.end();
  RecordReader r(w.text(), "test table");
  CHECK(r.next_is("tag"));
  auto f = r.record("tag", 7);
  CHECK(unescaped(f[0]) == "plain");
  CHECK(unescaped(f[1]) == "tab\there");
  CHECK(unescaped(f[2]) == "line\nbreak");
  CHECK(unescaped(f[3]) == "back\\slash");
  CHECK(unescaped(f[4]) == "\\t literally");
  CHECK(r.number(f[5]) == -42);
  CHECK(r.flag(f[6]));
  CHECK(r.at_end());
  // A reader of a table from another build fails as an internal error, not silently.
  RecordReader other("something\telse\n", "test table");
  CHECK_THROWS_AS(other.record("tag"), Error);
}
