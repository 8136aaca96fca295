// Bad input to the tensorsieve executable: each mistake must end with its own
// exit code (src/core/error.hpp), a message on standard error that names the
// offending thing and says what would be valid, nothing on standard output,
// and no file (whole or partial) behind --output.
#include "core/error.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <cctype>
#include <fstream>
#include <sstream>

using namespace ts;
using namespace ts::test;
namespace fs = std::filesystem;

namespace {

int code(ErrorKind k) { return static_cast<int>(k); }

void check_failure(const CliResult& r, ErrorKind kind) {
  INFO("stderr: " << r.err);
  CHECK(r.exit_code == code(kind));
  CHECK(r.out.empty());
  CHECK_THAT(r.err, Catch::StartsWith("tensorsieve: error: "));
}

// A private copy of groups/ to break, found by the binary through TENSORSIEVE_DATA.
struct DataCopy {
  TempDir dir;
  DataCopy() { fs::copy(fs::path(TENSORSIEVE_SOURCE_DIR) / "groups", dir / "groups", fs::copy_options::recursive); }
  fs::path file(const std::string& name) const { return dir / ("groups/" + name); }
  std::vector<std::pair<std::string, std::string>> env() const { return {{"TENSORSIEVE_DATA", dir.path().string()}}; }

  // Replace the first line equal to `from` after line `after` by `to`; returns its 1-based number.
  int replace_line(const std::string& name, const std::string& from, const std::string& to, int after = 0) {
    std::ifstream in(file(name));
    std::vector<std::string> lines;
    for (std::string l; std::getline(in, l);) lines.push_back(l);
    in.close();
    int hit = 0;
    for (std::size_t i = static_cast<std::size_t>(after); i < lines.size() && !hit; ++i)
      if (lines[i] == from) {
        lines[i] = to;
        hit = static_cast<int>(i) + 1;
      }
    REQUIRE(hit > 0);
    std::ofstream out(file(name), std::ios::trunc);
    for (const auto& l : lines) out << l << "\n";
    return hit;
  }
  int line_of(const std::string& name, const std::string& text) const {
    std::ifstream in(file(name));
    int n = 0;
    for (std::string l; std::getline(in, l);) {
      ++n;
      if (l == text) return n;
    }
    return 0;
  }
};

// The message echoes the spec and puts a caret under the offending character:
// return the character the caret points at (or '\0' past the end).
char caret_target(const std::string& err, const std::string& spec) {
  std::istringstream in(err);
  std::vector<std::string> lines;
  for (std::string l; std::getline(in, l);) lines.push_back(l);
  for (std::size_t i = 0; i + 1 < lines.size(); ++i) {
    const std::size_t at = lines[i].find(spec);
    if (at == std::string::npos || lines[i].find_first_not_of(' ') != at) continue;
    const std::size_t caret = lines[i + 1].find('^');
    if (caret == std::string::npos || caret < at || lines[i + 1].find_first_not_of(' ') != caret) continue;
    const std::size_t offset = caret - at;
    return offset < spec.size() ? spec[offset] : '\0';
  }
  FAIL("no caret line under the spec in: " << err);
  return '\0';
}

} // namespace

TEST_CASE("cli: an unknown group exits 3 and lists the closest symbols", "[cli]") {
  const CliResult r = run_cli({"form", "4nm", "V"});
  check_failure(r, ErrorKind::unknown_name);
  CHECK_THAT(r.err, Catch::Contains("'4nm'"));
  CHECK_THAT(r.err, Catch::Contains("closest: "));
  CHECK_THAT(r.err, Catch::Contains("4mm"));
  CHECK_THAT(r.err, Catch::Contains("valid: "));

  const CliResult s = run_cli({"group", "C5v"}); // no five-fold axis in a crystal
  check_failure(s, ErrorKind::unknown_name);
  CHECK_THAT(s.err, Catch::Contains("'C5v'"));
  CHECK_THAT(s.err, Catch::Contains("closest: "));

  const CliResult t = run_cli({"form", "m'm'2'", "V"}); // both mirrors primed make 2 unprimed
  check_failure(t, ErrorKind::unknown_name);
  CHECK_THAT(t.err, Catch::Contains("m'm'2"));
}

TEST_CASE("cli: a malformed tensor spec exits 4 and points at the character", "[cli]") {
  {
    const std::string spec = "d_ijk: polar, sym(jq)";
    const CliResult r = run_cli({"form", "4mm", spec});
    check_failure(r, ErrorKind::bad_spec);
    CHECK_THAT(r.err, Catch::Contains("at character 20"));
    CHECK_THAT(r.err, Catch::Contains("'q'"));
    CHECK_THAT(r.err, Catch::Contains("valid: "));
    CHECK(caret_target(r.err, spec) == 'q');
  }
  {
    const std::string spec = "d_ijk: polor";
    const CliResult r = run_cli({"survey", spec});
    check_failure(r, ErrorKind::bad_spec);
    CHECK_THAT(r.err, Catch::Contains("'polor'"));
    CHECK(caret_target(r.err, spec) == 'p');
    CHECK_THAT(r.err, Catch::Contains("polar | axial"));
  }
  {
    const std::string spec = "V[V2"; // the bracket is never closed: the caret sits past the end
    const CliResult r = run_cli({"form", "3m", spec});
    check_failure(r, ErrorKind::bad_spec);
    CHECK_THAT(r.err, Catch::Contains("at character 5"));
    CHECK_THAT(r.err, Catch::Contains("']'"));
    CHECK(caret_target(r.err, spec) == '\0');
  }
}

TEST_CASE("cli: a rank-7 tensor exits 8", "[cli]") {
  for (const std::string spec : {"d_ijklmno", "VVVVVVV"}) {
    INFO("spec " << spec);
    const CliResult r = run_cli({"form", "m-3m", spec});
    check_failure(r, ErrorKind::too_large);
    CHECK_THAT(r.err, Catch::Contains("rank 7"));
    CHECK_THAT(r.err, Catch::Contains("rank at most 6"));
  }
  check_failure(run_cli({"survey", "d_ijklmno"}), ErrorKind::too_large);
}

TEST_CASE("cli: broken TOML in a group file exits 5 with file:line:column", "[cli]") {
  DataCopy data;
  const int line = data.replace_line("orthorhombic.toml", "order = 4", "order = = 4");
  const CliResult r = run_cli({"groups"}, data.env());
  check_failure(r, ErrorKind::bad_file);
  const std::string where = data.file("orthorhombic.toml").string() + ":" + std::to_string(line) + ":";
  CHECK_THAT(r.err, Catch::Contains(where));
  // A column number follows the line number.
  const std::size_t at = r.err.find(where);
  REQUIRE(at != std::string::npos);
  CHECK(std::isdigit(static_cast<unsigned char>(r.err[at + where.size()])));
  CHECK_THAT(r.err, Catch::Contains("valid: TOML"));

  // Every command reads the data, not only `groups`.
  check_failure(run_cli({"form", "4mm", "V"}, data.env()), ErrorKind::bad_file);

  DataCopy other;
  const int l2 = other.replace_line("cubic.toml", "name = \"432\"", "name = \"432");
  const CliResult u = run_cli({"group", "4mm"}, other.env());
  check_failure(u, ErrorKind::bad_file);
  CHECK_THAT(u.err, Catch::Contains(other.file("cubic.toml").string() + ":" + std::to_string(l2) + ":"));
}

TEST_CASE("cli: generators that disagree with 'order' exit 5 and name the entry", "[cli]") {
  DataCopy data;
  const int entry = data.line_of("orthorhombic.toml", "name = \"222\"") - 1; // the [[group]] line above
  REQUIRE(data.line_of("orthorhombic.toml", "[[group]]") == entry);
  data.replace_line("orthorhombic.toml", "order = 4", "order = 5", entry);
  const CliResult r = run_cli({"groups"}, data.env());
  check_failure(r, ErrorKind::bad_file);
  // The message points at the `order` key of that entry, and says what would be valid.
  const int order_line = data.line_of("orthorhombic.toml", "order = 5");
  CHECK_THAT(r.err, Catch::Contains(data.file("orthorhombic.toml").string() + ":" + std::to_string(order_line) + ":"));
  CHECK_THAT(r.err, Catch::Contains("valid: order = 4"));
  CHECK_THAT(r.err, Catch::Contains("222"));
  CHECK_THAT(r.err, Catch::Contains("'order' says 5"));
  CHECK_THAT(r.err, Catch::Contains("give 4 operations"));

  // The same mismatch from the other side: an extra generator that doubles the group.
  DataCopy more;
  more.replace_line("orthorhombic.toml", "generators = [\"2 [100]\", \"2 [010]\"]",
                    "generators = [\"2 [100]\", \"4+ [001]\"]");
  const CliResult s = run_cli({"group", "222"}, more.env());
  check_failure(s, ErrorKind::bad_file);
  CHECK_THAT(s.err, Catch::Contains("give 8 operations"));
}

TEST_CASE("cli: generators that do not close or are not crystallographic exit 6", "[cli]") {
  {
    // 3-fold and 4-fold about one axis generate a 12-fold rotation.
    const CliResult r = run_cli({"identify", "3+ [001]", "4+ [001]"});
    check_failure(r, ErrorKind::bad_group);
    CHECK_THAT(r.err, Catch::Contains("not a crystallographic operation"));
    CHECK_THAT(r.err, Catch::Contains("valid: "));
  }
  {
    // A 4-fold about [110] leaves Q(sqrt 3) and no lattice has it.
    const CliResult r = run_cli({"identify", "4+ [001]", "4+ [110]"});
    check_failure(r, ErrorKind::bad_group);
    CHECK_THAT(r.err, Catch::Contains("operation 2"));
    CHECK_THAT(r.err, Catch::Contains("4+ [110]"));
  }
  {
    // 4 [001] with 2 [210] and 3 [111]: products outside every point group.
    const CliResult r = run_cli({"identify", "4+ [001]", "3+ [111]", "2 [210]"});
    check_failure(r, ErrorKind::bad_group);
  }
}

TEST_CASE("cli: a 2-fold axis along [210] with a 4-fold along [001] is rejected", "[cli]") {
  // Known bug (reported): in the orthogonal lattice basis `2 [210]` is the matrix
  // [[3/5, 4/5, 0], [4/5, -3/5, 0], [0, 0, -1]], which maps no lattice onto itself
  // (its lattice-basis matrix is not integral), so it is not a crystallographic
  // operation of the frame; together with 4+ [001] it generates a copy of 422
  // turned by atan(1/2). PointGroup::generate only checks the trace of each
  // operation (Operation::kind), so the command succeeds and names 422.
  const CliResult r = run_cli({"identify", "4+ [001]", "2 [210]"});
  INFO("stdout: " << r.out << "\nstderr: " << r.err);
  CHECK(r.exit_code == code(ErrorKind::bad_group));
  CHECK_THAT(r.err, Catch::Contains("valid: "));
}

TEST_CASE("cli: a frame direction that is not perpendicular exits 7", "[cli]") {
  const CliResult r = run_cli({"form", "m-3m", "V", "--z", "[001]", "--x", "[101]"});
  check_failure(r, ErrorKind::bad_geometry);
  CHECK_THAT(r.err, Catch::Contains("[101]"));
  CHECK_THAT(r.err, Catch::Contains("[001]"));
  CHECK_THAT(r.err, Catch::Contains("perpendicular"));
  CHECK_THAT(r.err, Catch::Contains("valid: "));
  // The same direction for both axes is just as impossible.
  check_failure(run_cli({"form", "4mm", "V", "--z", "[110]", "--x", "[110]"}), ErrorKind::bad_geometry);
}

TEST_CASE("cli: an unknown format exits 2 and lists the formats", "[cli]") {
  for (const auto& args : std::vector<std::vector<std::string>>{
           {"form", "4mm", "V", "-f", "yaml"}, {"survey", "V", "--format", "yaml"}, {"group", "4mm", "-f", "yaml"},
           {"groups", "-f", "yaml"}}) {
    INFO("command " << args[0]);
    const CliResult r = run_cli(args);
    check_failure(r, ErrorKind::usage);
    CHECK_THAT(r.err, Catch::Contains("'yaml'"));
    CHECK_THAT(r.err, Catch::Contains("--format"));
    CHECK_THAT(r.err, Catch::Contains("text, markdown, latex, json"));
  }
  // Command-line mistakes CLI11 catches itself are usage errors too, in the same format.
  check_failure(run_cli({"form", "4mm", "V", "--no-such-option"}), ErrorKind::usage);
}

TEST_CASE("cli: a failing command leaves no --output file, whole or partial", "[cli]") {
  struct Case {
    std::vector<std::string> args;
    ErrorKind kind;
  };
  const std::vector<Case> cases = {
      {{"form", "4nm", "V"}, ErrorKind::unknown_name},
      {{"form", "4mm", "V[V2"}, ErrorKind::bad_spec},
      {{"form", "4mm", "d_ijklmno"}, ErrorKind::too_large},
      {{"form", "m-3m", "V", "--z", "[001]", "--x", "[101]"}, ErrorKind::bad_geometry},
      {{"form", "4mm", "V", "-f", "yaml"}, ErrorKind::usage},
      {{"identify", "3+ [001]", "4+ [001]"}, ErrorKind::bad_group},
      {{"survey", "d_ijk: polor"}, ErrorKind::bad_spec},
  };
  for (std::size_t i = 0; i < cases.size(); ++i) {
    TempDir dir;
    std::vector<std::string> args = cases[i].args;
    args.push_back("--output");
    args.push_back((dir / "report.txt").string());
    INFO("command " << args[0] << " " << args[1]);
    // Every other case finds an earlier report in place, which must stay as it was.
    const bool earlier = i % 2 == 1;
    if (earlier) std::ofstream(dir / "report.txt") << "previous report\n";
    const CliResult r = run_cli(args);
    CHECK(r.exit_code == code(cases[i].kind));
    if (earlier) {
      CHECK(directory_entries(dir.path()) == std::vector<std::string>{"report.txt"});
      CHECK(read_file(dir / "report.txt") == "previous report\n");
    } else {
      CHECK(directory_entries(dir.path()).empty());
    }
  }
  // A report that cannot be written is a file error, and nothing is left either.
  TempDir dir;
  const CliResult r = run_cli({"form", "4mm", "V", "-o", (dir / "missing/report.txt").string()});
  check_failure(r, ErrorKind::bad_file);
  CHECK_THAT(r.err, Catch::Contains("--output"));
  CHECK(directory_entries(dir.path()).empty());
}

TEST_CASE("cli: --output writes the same bytes as standard output", "[cli]") {
  const std::vector<std::vector<std::string>> commands = {
      {"form", "3m", "V[V2]"},
      {"form", "4'/m'm'm", "aeV", "-f", "json"},
      {"form", "m-3m", "[[V2]2]", "-f", "latex"},
      {"survey", "aeV", "-m", "-f", "markdown"},
      {"group", "6/mmm", "--subgroups"},
  };
  for (const auto& cmd : commands) {
    INFO("command " << cmd[0] << " " << (cmd.size() > 1 ? cmd[1] : ""));
    const CliResult plain = run_cli(cmd);
    REQUIRE(plain.exit_code == 0);
    REQUIRE(!plain.out.empty());
    TempDir dir;
    std::vector<std::string> args = cmd;
    args.push_back("--output");
    args.push_back((dir / "report").string());
    const CliResult to_file = run_cli(args);
    CHECK(to_file.exit_code == 0);
    CHECK(to_file.out.empty());
    CHECK_THAT(to_file.err, Catch::EndsWith("tensorsieve: wrote " + (dir / "report").string() + "\n"));
    CHECK(read_file(dir / "report") == plain.out);
    CHECK(directory_entries(dir.path()) == std::vector<std::string>{"report"}); // no temporary left
    // Over an existing file: replaced, not appended to.
    { std::ofstream(dir / "report") << "an older and much longer report that must disappear entirely\n"; }
    CHECK(run_cli(args).exit_code == 0);
    CHECK(read_file(dir / "report") == plain.out);
  }
}
