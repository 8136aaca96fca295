// Writing -o outputs and figures: what happens to links, long names, owners,
// modes and interrupted runs (src/core/output_file.hpp), and a report with its
// figures committed together. Expectations are the documented behaviour
// (docs/cli.md, "Output files"); the file-system facts are common practice.
#include "core/error.hpp"
#include "core/output_file.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <csignal>
#include <filesystem>
#include <fstream>
#include <sys/stat.h>
#include <sys/wait.h>
#include <thread>
#include <unistd.h>

namespace fs = std::filesystem;
using ts::test::read_file;
using ts::test::run_cli;
using ts::test::TempDir;

namespace {

bool has(const std::string& text, const std::string& piece) { return text.find(piece) != std::string::npos; }

std::vector<std::string> leftovers(const fs::path& dir) {
  std::vector<std::string> out;
  for (const auto& name : ts::test::directory_entries(dir))
    if (name.rfind(".ts", 0) == 0 || name.find(".tmp") != std::string::npos) out.push_back(name);
  return out;
}

} // namespace

TEST_CASE("a dangling symbolic link given as the output keeps being a link; the file it names is written") {
  TempDir dir;
  fs::create_symlink("target.txt", dir / "link.txt");
  ts::write_output((dir / "link.txt").string(), "report\n");
  CHECK(fs::is_symlink(dir / "link.txt"));
  CHECK(read_file(dir / "target.txt") == "report\n");
  CHECK(leftovers(dir.path()).empty());
}

TEST_CASE("a file with two hard links is rewritten in place, both names see the report") {
  TempDir dir;
  std::ofstream(dir / "a.txt") << "an old report that is longer than the new one\n";
  fs::create_hard_link(dir / "a.txt", dir / "b.txt");
  ts::write_output((dir / "a.txt").string(), "new\n");
  CHECK(read_file(dir / "a.txt") == "new\n");
  CHECK(read_file(dir / "b.txt") == "new\n");
  CHECK(fs::hard_link_count(dir / "a.txt") == 2);
}

TEST_CASE("a 254-byte file name is written: the temporary name is short") {
  TempDir dir;
  const fs::path p = dir / std::string(254, 'r');
  ts::write_output(p.string(), "long name\n");
  CHECK(read_file(p) == "long name\n");
  CHECK(leftovers(dir.path()).empty());
}

TEST_CASE("a replaced file keeps its mode, and its owner when the writer may keep it") {
  TempDir dir;
  const fs::path p = dir / "kept.txt";
  std::ofstream(p) << "old\n";
  ::chmod(p.c_str(), 0640);
  const bool root = ::geteuid() == 0;
  if (root) REQUIRE(::chown(p.c_str(), 65534, 65534) == 0); // nobody: another user's file
  ts::write_output(p.string(), "new\n");
  struct stat st {};
  REQUIRE(::stat(p.c_str(), &st) == 0);
  CHECK((st.st_mode & 07777) == 0640);
  if (root) CHECK(st.st_uid == 65534);
  CHECK(read_file(p) == "new\n");
}

TEST_CASE("a write killed by SIGTERM leaves no temporary file behind") {
  TempDir dir;
  const std::string big(64u << 20, 'x'); // long enough to be caught in the middle
  const pid_t child = ::fork();
  REQUIRE(child >= 0);
  if (child == 0) {
    std::signal(SIGTERM, SIG_DFL); // as in the program; the test framework has its own handler
    try {
      ts::write_output((dir / "big.txt").string(), big);
    } catch (...) {
    }
    ::_exit(0);
  }
  // Wait until the temporary file exists, then stop the writer.
  for (int i = 0; i < 2000 && leftovers(dir.path()).empty(); ++i) std::this_thread::sleep_for(std::chrono::milliseconds(1));
  ::kill(child, SIGTERM);
  int status = 0;
  ::waitpid(child, &status, 0);
  CHECK(leftovers(dir.path()).empty());
}

TEST_CASE("a batch whose last file cannot be written leaves every old file as it was") {
  TempDir dir;
  std::ofstream(dir / "report.txt") << "old report\n";
  ts::OutputBatch batch;
  batch.add((dir / "report.txt").string(), "new report\n");
  batch.add((dir / "no-such-folder" / "figure.svg").string(), "<svg/>");
  CHECK_THROWS_AS(batch.commit(), ts::Error);
  CHECK(read_file(dir / "report.txt") == "old report\n");
  CHECK(leftovers(dir.path()).empty());
}

TEST_CASE("figures: a run that fails on its figures keeps the old report; planted links are not followed") {
  TempDir dir;
  std::ofstream(dir / "report.txt") << "old report\n";
  std::ofstream(dir / "not-a-folder") << "a file where the figures folder should be\n";
  const std::vector<std::string> shg = {"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:0", "--figure-format",
                                        "svg"};
  auto args = shg;
  args.insert(args.end(), {"--figures", (dir / "not-a-folder").string(), "-o", (dir / "report.txt").string()});
  const auto failed = run_cli(args);
  CHECK(failed.exit_code == 5);
  CHECK(read_file(dir / "report.txt") == "old report\n");

  // First run: learn the figure names; then plant a link in place of one.
  args = shg;
  args.insert(args.end(), {"--figures", (dir / "figs").string(), "-o", (dir / "report.txt").string()});
  REQUIRE(run_cli(args).exit_code == 0);
  std::string figure;
  for (const auto& name : ts::test::directory_entries(dir / "figs"))
    if (name.size() > 4 && name.compare(name.size() - 4, 4, ".svg") == 0) figure = name;
  REQUIRE(!figure.empty());
  std::ofstream(dir / "precious.txt") << "not a figure\n";
  fs::remove(dir / "figs" / figure);
  fs::create_symlink(dir / "precious.txt", dir / "figs" / figure);
  REQUIRE(run_cli(args).exit_code == 0);
  CHECK(read_file(dir / "precious.txt") == "not a figure\n");
  CHECK(!fs::is_symlink(dir / "figs" / figure));
  CHECK(has(read_file(dir / "figs" / figure), "<svg"));
}
