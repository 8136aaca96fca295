// Regression tests for inputs a hostile or careless user found: each once gave a
// crash, a hang, silent wrong physics or an internal error. The failure paths are
// in tests/bad_input/cases.txt; this file holds the cases that must now succeed.
#include "support/cli_run.hpp"
#include "support/report_text.hpp"

#include <catch2/catch.hpp>

#include <algorithm>

#include <sys/stat.h>
#include <unistd.h>

using ts::test::run_cli;
using ts::test::TempDir;

using ts::test::independent_in;

TEST_CASE("hardening: --tensor keeps the brackets of a Jahn symbol", "[hardening]") {
  // Orthorhombic elastic constants: 9 (Nye, Physical Properties of Crystals, 1957,
  // table of elastic stiffnesses by class, orthorhombic; from memory). The symmetric
  // rank-2 tensor: 3 (Nye 1957, same chapter, orthorhombic).
  const auto elastic = run_cli({"sample", "mmm", "--tensor", "[[V2]2]"});
  REQUIRE(elastic.exit_code == 0);
  CHECK(independent_in(elastic.out) == 9);
  const auto sym2 = run_cli({"sample", "mmm", "--tensor", "[V2]"});
  REQUIRE(sym2.exit_code == 0);
  CHECK(independent_in(sym2.out) == 3);
  // Two occurrences, and a spec that starts and ends with a bracket pair: read as
  // written, the same count as `form` gives for it.
  const auto pairs = run_cli({"sample", "mmm", "--tensor", "[V2][V2]", "--tensor", "V"});
  REQUIRE(pairs.exit_code == 0);
  const auto pairs_form = run_cli({"form", "mmm", "[V2][V2]"});
  REQUIRE(pairs_form.exit_code == 0);
  CHECK(independent_in(pairs.out) == independent_in(pairs_form.out));
  CHECK(pairs.out.find("tensor T_i: polar") != std::string::npos);
}

TEST_CASE("hardening: options taking a direction keep their brackets", "[hardening]") {
  // --cut, --z and --x take one bracketed value each; the same frame by every route.
  const auto cut = run_cli({"sample", "m-3m", "--cut", "[111]", "--x", "[1-10]", "--tensor", "[[V2]2]"});
  REQUIRE(cut.exit_code == 0);
  CHECK(cut.out.find("x ∥ [1-10]") != std::string::npos);
  const auto bulk = run_cli({"sample", "m-3m", "--z", "[111]", "--x", "[1-10]", "--tensor", "[[V2]2]"});
  REQUIRE(bulk.exit_code == 0);
  const auto form = run_cli({"form", "m-3m", "[[V2]2]", "--z", "[111]", "--x", "[1-10]"});
  REQUIRE(form.exit_code == 0);
  // common practice: a cubic elastic tensor has 3 constants in any frame
  CHECK(independent_in(bulk.out) == 3);
  CHECK(independent_in(form.out) == 3);
}

TEST_CASE("hardening: films with measured lattice parameters", "[hardening]") {
  // A (101) film of a tetragonal crystal: the normal carries a^2 and c^2, which used to
  // overflow 64 bits in the step that names the group in the sample frame.
  for (const char* a : {"3.91", "3.905"}) {
    INFO("a = " << a);
    const auto r = run_cli({"sample", "4/mmm", "--cut", "(101)", "--a", a, "--c", "4.1", "--tensor", "V",
                            "--response", "electric-dipole-shg"});
    CHECK(r.exit_code == 0);
    CHECK(r.err.empty());
    // common practice: a polar surface of a centrosymmetric crystal keeps one mirror,
    // so a polar vector has two components in the mirror plane
    CHECK(r.out.find("m1'") != std::string::npos);
  }
  TempDir dir;
  std::ofstream(dir / "film.toml") << "responses = [\"electric-dipole-shg\"]\n[crystal]\ngroup = \"4/mmm\"\n"
                                      "lattice = { a = 3.91, c = 4.1 }\n[sample]\ncut = \"(101)\"\n";
  const auto run = run_cli({"run", (dir / "film.toml").string()});
  CHECK(run.exit_code == 0);
  // the same number written two ways is the same length
  const auto e1 = run_cli({"sample", "4/mmm", "--cut", "(101)", "--a", "41e-1", "--c", "4.1", "--tensor", "V"});
  const auto e2 = run_cli({"sample", "4/mmm", "--cut", "(101)", "--a", "4.1", "--c", "4.1", "--tensor", "V"});
  CHECK(e1.exit_code == 0);
  CHECK(e1.out == e2.out);
}

TEST_CASE("hardening: -o writes through links and devices, keeps the mode", "[hardening]") {
  TempDir dir;
  const auto target = dir / "target.txt", link = dir / "link.txt", hard = dir / "hard.txt";
  std::ofstream(target) << "old\n";
  REQUIRE(::symlink(target.c_str(), link.c_str()) == 0);
  REQUIRE(::chmod(target.c_str(), 0640) == 0);
  REQUIRE(run_cli({"groups", "-o", link.string()}).exit_code == 0);
  struct stat st {};
  REQUIRE(::lstat(link.c_str(), &st) == 0);
  CHECK(S_ISLNK(st.st_mode));
  CHECK(ts::test::read_file(target).rfind("32 point groups", 0) == 0);
  REQUIRE(::stat(target.c_str(), &st) == 0);
  CHECK((st.st_mode & 0777) == 0640);

  REQUIRE(::link(target.c_str(), hard.c_str()) == 0);
  REQUIRE(run_cli({"group", "m", "-o", hard.string()}).exit_code == 0);
  CHECK(ts::test::read_file(target).rfind("point group m1'", 0) == 0);

  REQUIRE(run_cli({"groups", "-o", "/dev/null"}).exit_code == 0);
  REQUIRE(::stat("/dev/null", &st) == 0);
  CHECK(S_ISCHR(st.st_mode));

  // a new file gets the usual mode and nothing is left beside it
  REQUIRE(run_cli({"groups", "-o", (dir / "new.txt").string()}).exit_code == 0);
  CHECK(ts::test::directory_entries(dir.path()).size() == 4);
}

TEST_CASE("hardening: domain reports are capped, JSON keeps every variant", "[hardening]") {
  // A polar distortion along [110] of m-3m1' leaves mm21' (order 8 of 96): 12 variants.
  const std::vector<std::string> base = {"sample", "m-3m", "--lower", "polar:[110]", "--tensor", "V", "--domains"};
  const auto text = run_cli(base);
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("12 variants") != std::string::npos);
  CHECK(text.out.find("variants 9 to 12 are not printed here") != std::string::npos);
  auto json_args = base;
  json_args.insert(json_args.end(), {"-f", "json"});
  const auto json = run_cli(json_args);
  REQUIRE(json.exit_code == 0);
  std::size_t reps = 0;
  for (std::size_t p = json.out.find("\"representative\""); p != std::string::npos;
       p = json.out.find("\"representative\"", p + 1))
    ++reps;
  CHECK(reps == 12);
}

// The caps count relations, not characters, so the text, Markdown and LaTeX
// reports cut the same cells and averages at the same relation.
TEST_CASE("hardening: every text format caps the same relations", "[hardening]") {
  // A polar distortion along [111] of m-3m1' leaves 3m1' (index 48/12): 4 variants of a rank-5 tensor (common practice).
  const std::vector<std::string> base = {"sample", "m-3m", "--lower", "polar:[111]", "--tensor", "V5", "--domains"};
  std::vector<std::vector<std::string>> cuts;
  for (const char* f : {"text", "markdown", "latex"}) {
    auto args = base;
    args.insert(args.end(), {"-f", f});
    const auto r = run_cli(args);
    REQUIRE(r.exit_code == 0);
    std::vector<std::string> found;
    for (std::size_t p = r.out.find("... "); p != std::string::npos; p = r.out.find("... ", p + 1)) {
      const std::size_t end = r.out.find(';', p);
      if (end != std::string::npos && r.out.compare(end - 8, 8, "relation") == 0) found.push_back(r.out.substr(p, end - p));
      if (end != std::string::npos && r.out.compare(end - 9, 9, "relations") == 0) found.push_back(r.out.substr(p, end - p));
    }
    cuts.push_back(found);
  }
  REQUIRE(cuts[0].size() >= 4); // a cell per variant and the average
  CHECK(cuts[1] == cuts[0]);
  CHECK(cuts[2] == cuts[0]);
  CHECK(std::find(cuts[0].begin(), cuts[0].end(), "... 1 more relation") != cuts[0].end()); // singular
}

TEST_CASE("hardening: output is byte-identical across runs", "[hardening]") {
  const std::vector<std::string> args = {"sample", "m-3m", "--cut", "(110)", "--lower", "moment:[001]",
                                         "--response", "anomalous-hall", "--domains", "-f", "json"};
  const auto a = run_cli(args), b = run_cli(args);
  REQUIRE(a.exit_code == 0);
  CHECK(a.out == b.out);
}

TEST_CASE("--response all and families, with the summary first", "[reports]") {
  // Common practice: a polar (001) surface of a centrosymmetric cubic crystal switches
  // on the even-order nonlinear transport that inversion forbade in the bulk.
  const auto family = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "transport"});
  REQUIRE(family.exit_code == 0);
  const std::size_t summary = family.out.find("summary: what the last step (cut (001), surface or interface) switched on");
  REQUIRE(summary != std::string::npos);
  CHECK(summary < family.out.find("allowed form of"));
  CHECK(family.out.find("switched on: second-order-conductivity") != std::string::npos);
  CHECK(family.out.find("electric-dipole-shg") == std::string::npos); // optics is another family
  const auto all = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "all", "-f", "json"});
  REQUIRE(all.exit_code == 0);
  const auto list = run_cli({"responses", "-f", "json"});
  std::size_t ids = 0, seen = 0;
  for (std::size_t p = list.out.find("\"id\" : \""); p != std::string::npos; p = list.out.find("\"id\" : \"", p + 1)) {
    ++ids;
    const std::size_t s = p + 8;
    const std::string id = list.out.substr(s, list.out.find('"', s) - s);
    if (all.out.find("\"response\" : \"" + id + "\"") != std::string::npos) ++seen;
  }
  CHECK(ids > 30);
  CHECK(seen == ids);
  // a family given twice, or beside one of its members, asks for each response once
  const auto twice = run_cli({"sample", "m-3m", "--response", "optics", "--response", "electric-dipole-shg",
                              "--response", "optics", "-f", "json"});
  const auto once = run_cli({"sample", "m-3m", "--response", "optics", "-f", "json"});
  CHECK(twice.out == once.out);
}

TEST_CASE("domain tables print, from variant 2 on, only what differs from variant 1", "[reports]") {
  // Variant 2 of a polar [110] distortion of m-3m1' is the image under 2 [100]: the
  // polar vector (T_x, T_x, 0) goes to (T_x, -T_x, 0) (common practice), so only T_y differs.
  const auto r = run_cli({"sample", "m-3m", "--lower", "polar:[110]", "--tensor", "V", "--domains"});
  REQUIRE(r.exit_code == 0);
  // Variant 1 is written as a form (equal components share a line); the components of
  // variant i carry a superscript (i), so "T_y⁽²⁾ = -T_x" cannot read as T_y = -T_y.
  CHECK(r.out.find("  1        1         T_x = T_y; all others vanish\n") != std::string::npos);
  CHECK(r.out.find("  2        2 [100]   T_y⁽²⁾ = -T_x\n") != std::string::npos);
}

TEST_CASE("the domain average is written as a form, one relation a line when long", "[reports]") {
  // A polar 4mm distortion of m-3m1' along each cube axis: the average over the 6 equally
  // populated variants of a symmetric second-rank tensor is isotropic, its trace a third of the
  // trace of variant 1 (Nye, Physical Properties of Crystals, 1957, ch. 1: a cubic second-rank
  // tensor is a scalar times the unit tensor).
  const auto r = run_cli({"sample", "m-3m", "--lower", "subgroup:4mm", "--tensor", "[V2]", "--domains"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("average over equal populations: ⟨T_xx⟩ = ⟨T_yy⟩ = ⟨T_zz⟩ = 2/3*T_xx + 1/3*T_zz; all others vanish\n") !=
        std::string::npos);
  // The rank-4 average over the polar [001] variants (cubic again: three parameters, as c11, c12,
  // c44 of a cubic crystal, Nye 1957, ch. 8) does not fit on a line: one relation a line.
  const auto w = run_cli({"sample", "m-3m", "--lower", "polar:[001]", "--tensor", "[V2][V2]", "--domains"});
  REQUIRE(w.exit_code == 0);
  const auto at = w.out.find("average over equal populations:\n  ⟨");
  REQUIRE(at != std::string::npos);
  const auto end = w.out.find("\n\n", at);
  for (std::size_t nl = w.out.find('\n', at); nl < end; nl = w.out.find('\n', nl + 1))
    CHECK(w.out.find('\n', nl + 1) - nl < 200); // no relation line runs on
}

TEST_CASE("a layout without a cut designs bars in the sample xy plane, and says when nothing is allowed", "[reports]") {
  // Without a cut the sample is the crystal in its own axes: the candidates are the
  // low-index directions perpendicular to z = [001] (common practice: a bar is patterned in the plane).
  const auto r = run_cli({"sample", "4mm", "--layout", "magnetoconductivity-quadratic", "-f", "json"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("[00-1]") == std::string::npos);
  CHECK(r.out.find("\"[210]\"") != std::string::npos);
  // A non-magnetic 4mm crystal has no anomalous Hall effect (a time-odd axial vector, common practice).
  const auto none = run_cli({"sample", "4mm", "--layout", "anomalous-hall"});
  REQUIRE(none.exit_code == 0);
  CHECK(none.out.find("anomalous-hall at 1ω: no part is allowed in 4mm1' at this harmonic") != std::string::npos);
  const auto bad = run_cli({"sample", "4mm", "--bar", "[001]", "--response", "anomalous-hall"});
  CHECK(bad.exit_code == 7);
  CHECK(bad.err.find("(normal sample z = [001])") != std::string::npos);
}
