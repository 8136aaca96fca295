// screen -o FILE keeps a journal of finished rows (FILE.partial) and an
// interrupted run continues from it (src/scenario/screen_journal.hpp); rows
// survive the journal format exactly; a run with another request starts afresh.
#include "scenario/screen_journal.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

namespace fs = std::filesystem;
using ts::test::read_file;
using ts::test::run_cli;
using ts::test::TempDir;

namespace {

std::string data(const std::string& name) { return std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/" + name; }
bool has(const std::string& text, const std::string& piece) { return text.find(piece) != std::string::npos; }

} // namespace

TEST_CASE("a journal line holds a whole row, escapes included; a cut line is no row") {
  ts::ScreenRow row;
  row.file = "dir/with\ttab\nand newline\\.cif";
  row.point_group = "4/mm'm'";
  row.setting = "4/mm'm'";
  row.bns_number = "139.537";
  row.magnetic_type = 3;
  row.space_group = "I4/mmm (139)";
  row.cut_groups = {"4m'm'", "2'/m'"};
  row.counts = {{1, 0}, {1, 2}, {0, 0}};
  ts::ScreenRow back;
  const std::string line = ts::journal_line(row);
  REQUIRE(ts::parse_journal_line(line, &back));
  CHECK(back.file == row.file);
  CHECK(back.cut_groups == row.cut_groups);
  CHECK(back.counts == row.counts);
  CHECK(back.magnetic_type == 3);
  CHECK_FALSE(ts::parse_journal_line(line.substr(0, line.size() - 5), &back));
  ts::ScreenRow failed;
  failed.file = "bad.cif";
  failed.error = "bad.cif:3: no cell";
  REQUIRE(ts::parse_journal_line(ts::journal_line(failed), &back));
  CHECK(back.error == failed.error);
}

TEST_CASE("an interrupted screen -o continues from its journal and removes it when done") {
  TempDir dir;
  const std::string fe = (dir / "fe.mcif").string(), cr = (dir / "cr.mcif").string();
  fs::copy_file(data("fe-bcc-ferromagnet.mcif"), fe);
  fs::copy_file(data("cr2o3-afm.mcif"), cr);
  const std::string out = (dir / "out.csv").string();

  // What an interrupted run leaves: the header, one finished row, half a row.
  ts::ScreenRequest request;
  request.responses = {"anomalous-hall"};
  ts::ScreenRow done;
  done.file = fe;
  done.point_group = "JOURNALLED"; // not what the search would say: proves the row is taken, not redone
  done.counts = {{1}};
  {
    std::ofstream j(out + ".partial");
    j << "#tensorsieve-screen-journal 1\t" << ts::screen_signature(request) << "\n"
      << ts::journal_line(done) << "\nrow\t" << cr << "\t";
  }
  const auto r = run_cli({"screen", fe, cr, "--response", "anomalous-hall", "-f", "csv", "-o", out, "--quiet"});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.err, "resuming from " + out + ".partial: 1 files already screened"));
  const std::string csv = read_file(out);
  CHECK(has(csv, "JOURNALLED"));
  CHECK(has(csv, "-3'm'")); // Cr2O3 screened now (the cut line was not taken as a row)
  CHECK(!fs::exists(out + ".partial"));

  // A journal of another request is not used.
  {
    std::ofstream j(out + ".partial");
    j << "#tensorsieve-screen-journal 1\t" << ts::screen_signature(request) << "\n" << ts::journal_line(done) << "\n";
  }
  const auto other =
      run_cli({"screen", fe, "--response", "anomalous-hall", "--symprec", "0.001", "-f", "csv", "-o", out, "--quiet"});
  REQUIRE(other.exit_code == 0);
  CHECK(!has(read_file(out), "JOURNALLED"));
  CHECK(has(read_file(out), "4/mm'm'"));
}

TEST_CASE("screen: a file the symmetry search cannot take is an error row, the others are screened") {
  TempDir dir;
  const std::string fe = (dir / "fe.mcif").string();
  fs::copy_file(data("fe-bcc-ferromagnet.mcif"), fe);
  const std::string flat = std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/reading/flat-cell.cif";
  const std::string many = std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/bad_input/too-many-atoms.cif";
  const auto r = run_cli({"screen", fe, flat, many, "--response", "anomalous-hall", "-f", "csv", "--threads", "2"});
  CHECK(r.exit_code == 5);
  CHECK(has(r.out, "4/mm'm'"));
  CHECK(has(r.out, "the cell angles do not form a cell"));
  CHECK(has(r.out, "more than 5000 atoms"));
  CHECK(has(r.err, "2 of 3 structure files could not be screened"));
}
