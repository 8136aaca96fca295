// tensorsieve screen: many structure files, one row each, the same bytes on
// any number of threads, bad files in their rows and in the exit code.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

using ts::test::run_cli;
namespace fs = std::filesystem;

namespace {

std::string data(const std::string& name) { return std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/" + name; }

bool has(const std::string& text, const std::string& piece) { return text.find(piece) != std::string::npos; }

std::size_t lines(const std::string& text) { return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n')); }

// A folder of 48 files: twelve copies of each textbook crystal, and one broken file.
void fill_batch(const fs::path& dir) {
  const char* crystals[] = {"cr2o3-afm.mcif", "cr2o3-paramagnetic.cif", "fe-bcc-ferromagnet.mcif", "mno-afm.mcif"};
  for (int copy = 0; copy < 12; ++copy)
    for (const char* c : crystals)
      fs::copy_file(data(c), dir / ("c" + std::to_string(copy) + "-" + c));
  fs::copy_file(data("malformed/open-operations.mcif"), dir / "zz-open.mcif");
  std::ofstream(dir / "notes.txt") << "not a structure file; the folder scan skips it\n";
}

} // namespace

TEST_CASE("screen gives the same bytes on 1 and 4 threads, in every format") {
  ts::test::TempDir dir;
  fill_batch(dir.path());
  for (const char* format : {"csv", "jsonl", "text"}) {
    INFO(format);
    const auto one = run_cli({"screen", dir.path().string(), "--response", "anomalous-hall", "--response",
                              "linear-magnetoelectric", "--cut", "(001)", "-f", format, "--threads", "1"});
    const auto many = run_cli({"screen", dir.path().string(), "--response", "anomalous-hall", "--response",
                               "linear-magnetoelectric", "--cut", "(001)", "-f", format, "--threads", "4"});
    CHECK(one.exit_code == 5); // one file of the batch is broken
    CHECK(many.exit_code == 5);
    CHECK(one.out == many.out);
    CHECK(has(one.err, "1 of 49 structure files could not be screened"));
    CHECK_FALSE(has(one.err, "files/s")); // no progress bar when stderr is not a terminal
  }
}

TEST_CASE("screen rows: groups, verdicts and the error of a bad file") {
  ts::test::TempDir dir;
  fill_batch(dir.path());
  const auto csv = run_cli({"screen", dir.path().string(), "--response", "anomalous-hall", "--response",
                            "linear-magnetoelectric", "-f", "csv", "--quiet"});
  CHECK(lines(csv.out) == 50); // header + 49 rows
  CHECK(has(csv.out, "file,point_group,crystal-axes_symbol,space_group,magnetic_(BNS),anomalous-hall,"
                     "linear-magnetoelectric,error\n"));
  // Cr2O3 (-3'm'): magnetoelectric alpha_xx = alpha_yy, alpha_zz, no Hall vector
  // (Dzyaloshinskii 1960); bcc Fe along [001]: sigma_xy only (common practice).
  CHECK(has(csv.out, "c0-cr2o3-afm.mcif,-3'm',-3'm',R-3c (167),167.106,0,2,\n"));
  CHECK(has(csv.out, "c0-fe-bcc-ferromagnet.mcif,4/mm'm',4/mm'm',I4/mmm (139),139.537,1,0,\n"));
  CHECK(has(csv.out, "c0-mno-afm.mcif,2/m1',,C2/c (15),15.90,0,0,\n"));
  CHECK(has(csv.out, "zz-open.mcif,,,,,,,"));
  CHECK(has(csv.out, "the stated operations do not close"));

  const auto jsonl = run_cli({"screen", data("fe-bcc-ferromagnet.mcif"), "--response", "anomalous-hall", "--cut",
                              "(110)", "-f", "jsonl"});
  REQUIRE(jsonl.exit_code == 0);
  CHECK(lines(jsonl.out) == 1);
  CHECK(has(jsonl.out, "\"cut\" : \"(110)\",\"point_group\" : \"m'm2'\""));
  CHECK(has(jsonl.out, "\"anomalous-hall\" : {\"allowed\" : true,\"independent\" : 1}"));
}

TEST_CASE("screen reads list files and refuses what it cannot start on") {
  ts::test::TempDir dir;
  fs::create_directory(dir / "cifs");
  fs::copy_file(data("fe-bcc-ferromagnet.mcif"), dir / "cifs" / "fe.mcif");
  fs::copy_file(data("cr2o3-afm.mcif"), dir / "cifs" / "cr2o3.mcif");
  std::ofstream(dir / "list.txt") << "# two crystals\ncifs/fe.mcif\n\ncifs/cr2o3.mcif  # the magnetoelectric one\n";
  const auto r = run_cli({"screen", "@" + (dir / "list.txt").string(), "--response", "anomalous-hall"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("fe.mcif") < r.out.find("cr2o3.mcif")); // the list's order, not sorted
  CHECK(has(r.out, "allowed (1)"));

  std::ofstream(dir / "bad-list.txt") << "cifs/fe.mcif\ncifs/missing.mcif\n";
  const auto missing = run_cli({"screen", "@" + (dir / "bad-list.txt").string(), "--response", "anomalous-hall"});
  CHECK(missing.exit_code == 5);
  CHECK(has(missing.err, "bad-list.txt:2"));
  CHECK(missing.out.empty());

  const auto unknown = run_cli({"screen", (dir / "cifs").string(), "--response", "anomalous-hal"});
  CHECK(unknown.exit_code == 3);
  CHECK(has(unknown.err, "anomalous-hall")); // the closest ids are offered
  CHECK(unknown.out.empty());

  const auto format = run_cli({"screen", (dir / "cifs").string(), "--response", "anomalous-hall", "-f", "latex"});
  CHECK(format.exit_code == 2);
  CHECK(has(format.err, "text, markdown, csv or jsonl"));
}

TEST_CASE("the progress bar is drawn on a terminal only, and never into the output") {
  // `script` (util-linux, Essential on Debian) runs the command on a pseudo-terminal
  // and copies what the terminal shows to its own standard output.
  ts::test::TempDir dir;
  fill_batch(dir.path());
  auto on_terminal = [&](const std::string& extra) {
    const std::string inner = ts::test::shell_quote(TENSORSIEVE_BINARY) + " screen " +
                              ts::test::shell_quote(dir.path().string()) + " --response anomalous-hall -f csv -o " +
                              ts::test::shell_quote((dir / "rows.csv").string()) + extra;
    const std::string cmd = "script -qec " + ts::test::shell_quote(inner) + " /dev/null > " +
                            ts::test::shell_quote((dir / "terminal.txt").string()) + " 2>&1 </dev/null";
    const int status = std::system(cmd.c_str());
    REQUIRE(WIFEXITED(status));
    CHECK(WEXITSTATUS(status) == 5); // the broken file of the batch
    return ts::test::read_file(dir / "terminal.txt");
  };
  const std::string shown = on_terminal("");
  CHECK(has(shown, "49/49"));
  CHECK(has(shown, "files/s"));
  CHECK(has(shown, "s left"));
  const std::string rows = ts::test::read_file(dir / "rows.csv");
  CHECK(lines(rows) == 50);
  CHECK_FALSE(has(rows, "files/s"));
  CHECK_FALSE(has(on_terminal(" --quiet"), "files/s"));
}
