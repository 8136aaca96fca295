// The response catalogue as data: it loads, its ids and aliases are unique and
// well formed, every spec parses, lookups by alias work, unknown ids get
// suggestions, and broken copies of the file fail with file:line and the entry.
// The CLI commands built on it run and give the documented exit codes.
#include "core/error.hpp"
#include "response/response_catalogue.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <stdexcept>
#include <sys/wait.h>
#include <unistd.h>

using namespace ts;
namespace fs = std::filesystem;

namespace {

std::string read_file(const std::string& path) {
  std::ifstream in(path);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

std::string temp_path(const std::string& stem) {
  return (fs::temp_directory_path() / ("tensorsieve_" + stem + "_" + std::to_string(::getpid()) + ".toml")).string();
}

// A copy of the built-in catalogue with `from` (which must occur) replaced by `to`.
std::string broken_copy(const std::string& stem, const std::string& from, const std::string& to, int* line = nullptr) {
  std::string text = read_file(ResponseCatalogue::builtin().path());
  std::size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  if (line) *line = 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
  text.replace(at, from.size(), to);
  std::string path = temp_path(stem);
  std::ofstream(path) << text;
  return path;
}

Error load_error(const std::string& path) {
  try {
    ResponseCatalogue::load(path);
  } catch (const Error& e) {
    fs::remove(path);
    return e;
  }
  fs::remove(path);
  FAIL("loading " << path << " should have failed");
  throw std::logic_error("unreachable");
}

struct Run {
  int status = -1;
  std::string out;
};

Run run(const std::string& args) {
  std::string cmd = std::string("'") + TENSORSIEVE_BINARY + "' " + args;
  Run r;
  FILE* p = ::popen(cmd.c_str(), "r");
  REQUIRE(p);
  std::array<char, 4096> buf{};
  std::size_t n;
  while ((n = std::fread(buf.data(), 1, buf.size(), p)) > 0) r.out.append(buf.data(), n);
  int st = ::pclose(p);
  r.status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
  return r;
}

// Parses with Python's json module (an outside JSON reader) and checks a Python assertion on it (d is the document).
int python_json_check(const std::string& json, const std::string& assertion) {
  const std::string data = temp_path("json"), script = temp_path("check") + ".py";
  std::ofstream(data) << json;
  std::ofstream(script) << "import json, sys\nd = json.load(open(sys.argv[1]))\nassert " << assertion << "\n";
  int st = std::system(("python3 '" + script + "' '" + data + "'").c_str());
  fs::remove(data);
  fs::remove(script);
  return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

} // namespace

TEST_CASE("the built-in catalogue loads and is well formed", "[responses]") {
  const auto& cat = ResponseCatalogue::builtin();
  REQUIRE(cat.responses().size() >= 30);
  std::set<std::string> keys;
  for (const auto& r : cat.responses()) {
    INFO("response " << r.id << " at " << r.where);
    CHECK(keys.insert(r.id).second);
    for (const auto& a : r.aliases) CHECK(keys.insert(a).second);
    CHECK(normalise_response_key(r.id) == r.id);
    CHECK_FALSE(r.name.empty());
    CHECK_FALSE(r.relation.empty());
    CHECK_FALSE(r.source.empty());
    CHECK(r.source.find("[" + r.status + "]") != std::string::npos);
    REQUIRE_FALSE(r.parts.empty());
    for (const auto& p : r.parts) {
      INFO("part " << p.label);
      // Parsing again from the stored text gives the same tensor, and the canonical text round-trips.
      TensorSpec again = parse_tensor_spec(p.spec_text);
      CHECK(again.canonical_text() == p.spec.canonical_text());
      CHECK(parse_tensor_spec(p.spec.canonical_text()).canonical_text() == p.spec.canonical_text());
      CHECK(p.spec.rank >= 0);
      if (p.excluded) CHECK(p.excluded->rank < p.spec.rank);
    }
  }
}

TEST_CASE("every response of the catalogue's list R1 ... R18 has an entry", "[responses]") {
  // R1 ... R18 as numbered in the headings of src/response/catalogue.toml, by the id chosen for each.
  const char* ids[] = {"conductivity", "resistivity", "ordinary-hall", "anomalous-hall",
                       "magnetoconductivity-linear", "magnetoconductivity-quadratic", "anisotropic-magnetoresistance",
                       "in-plane-hall", "magnetochiral-anisotropy", "unidirectional-magnetoresistance",
                       "second-order-conductivity", "berry-curvature-dipole", "intrinsic-nonlinear-hall",
                       "nonlinear-drude", "current-induced-spin-polarization", "spin-hall", "linear-magnetoelectric",
                       "magneto-optic-kerr", "magnetic-linear-birefringence", "optical-activity",
                       "electric-dipole-shg", "magnetic-dipole-shg", "electric-quadrupole-shg",
                       "third-order-susceptibility", "third-order-conductivity", "pyroelectric", "piezoelectric",
                       "elastic", "electrostriction", "photoelastic", "piezomagnetic", "spontaneous-magnetization",
                       "thermal-conductivity", "seebeck"};
  for (const char* id : ids) {
    INFO(id);
    CHECK(ResponseCatalogue::builtin().find(id) != nullptr);
  }
}

TEST_CASE("lookup by id, alias and loosely typed names", "[responses]") {
  const auto& cat = ResponseCatalogue::builtin();
  CHECK(cat.get("ahe").id == "anomalous-hall");
  CHECK(cat.get("Anomalous Hall").id == "anomalous-hall");
  CHECK(cat.get("SHG").id == "electric-dipole-shg");
  CHECK(cat.get("second_harmonic_generation").id == "electric-dipole-shg");
  CHECK(cat.get("bcd").id == "berry-curvature-dipole");
  CHECK(cat.get("eMChA").id == "magnetochiral-anisotropy");
  CHECK(cat.get("kerr").id == "magneto-optic-kerr");
  CHECK(cat.find("no-such-effect") == nullptr);
}

TEST_CASE("an unknown response id names the closest ids", "[responses]") {
  const auto& cat = ResponseCatalogue::builtin();
  try {
    cat.get("anomalus-hall");
    FAIL("expected an error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::unknown_name);
    CHECK(e.exit_code() == 3);
    CHECK(e.problem().find("anomalus-hall") != std::string::npos);
    CHECK(e.valid().find("anomalous-hall") != std::string::npos);
  }
  auto near = cat.closest_ids("spin hall conductance");
  REQUIRE_FALSE(near.empty());
  CHECK(near.front() == "spin-hall");
}

TEST_CASE("a TOML syntax error names file, line and column", "[responses]") {
  int line = 0;
  // Drop the closing quote of the first harmonic: an unterminated string.
  std::string path = broken_copy("syntax", "harmonic = \"1ω\"", "harmonic = \"1ω", &line);
  Error e = load_error(path);
  CHECK(e.kind() == ErrorKind::bad_file);
  CHECK(e.location().rfind(path + ":" + std::to_string(line) + ":", 0) == 0);
}

TEST_CASE("a bad tensor spec names file, line and the entry id", "[responses]") {
  int line = 0;
  std::string path = broken_copy("spec", "spec = \"h_a: axial, time-odd\"", "spec = \"h_a: axial, time-weird\"", &line);
  Error e = load_error(path);
  CHECK(e.kind() == ErrorKind::bad_file);
  CHECK(e.location().rfind(path + ":" + std::to_string(line) + ":", 0) == 0);
  CHECK(e.problem().find("anomalous-hall") != std::string::npos);
  CHECK(e.problem().find("time-weird") != std::string::npos);
  CHECK_FALSE(e.valid().empty());
}

TEST_CASE("schema violations are reported with the entry and what is valid", "[responses]") {
  SECTION("unknown key") {
    int line = 0;
    std::string path = broken_copy("key", "id = \"resistivity\"\n", "id = \"resistivity\"\ncolour = \"red\"\n", &line);
    Error e = load_error(path);
    CHECK(e.problem().find("colour") != std::string::npos);
    CHECK(e.problem().find("resistivity") != std::string::npos);
    CHECK(e.location().rfind(path + ":" + std::to_string(line + 1) + ":", 0) == 0);
    CHECK(e.valid().find("harmonic") != std::string::npos);
  }
  SECTION("duplicate id") {
    std::string path = broken_copy("dup", "id = \"resistivity\"", "id = \"conductivity\"");
    Error e = load_error(path);
    CHECK(e.problem().find("already used") != std::string::npos);
  }
  SECTION("alias that clashes with an id") {
    std::string path = broken_copy("alias", "aliases = [\"rho\",", "aliases = [\"conductivity\",");
    Error e = load_error(path);
    CHECK(e.problem().find("already used") != std::string::npos);
  }
  SECTION("unknown harmonic") {
    std::string path = broken_copy("harm", "harmonic = \"3ω\"", "harmonic = \"4ω\"");
    Error e = load_error(path);
    CHECK(e.problem().find("4ω") != std::string::npos);
    CHECK(e.valid().find("2ω+DC") != std::string::npos);
  }
  SECTION("unknown drive") {
    std::string path = broken_copy("drive", "drives = [\"j\", \"B\"]", "drives = [\"j\", \"wind\"]");
    Error e = load_error(path);
    CHECK(e.problem().find("wind") != std::string::npos);
  }
  SECTION("status that differs from the first source's tag") {
    std::string path = broken_copy("status", "status = \"checked\"", "status = \"from memory\"");
    Error e = load_error(path);
    CHECK(e.problem().find("first source") != std::string::npos);
  }
  SECTION("missing required key") {
    std::string path = broken_copy("missing", "name = \"ordinary Hall effect (odd in B)\"\n", "");
    Error e = load_error(path);
    CHECK(e.problem().find("missing key 'name'") != std::string::npos);
    CHECK(e.problem().find("ordinary-hall") != std::string::npos);
  }
  SECTION("excluded piece of another time parity") {
    std::string path = broken_copy("excl", "excluded = \"trD_: axial, time-even\"", "excluded = \"trD_: axial, time-odd\"");
    Error e = load_error(path);
    CHECK(e.problem().find("excluded") != std::string::npos);
  }
  SECTION("a file that does not exist") {
    try {
      ResponseCatalogue::load(temp_path("absent"));
      FAIL("expected an error");
    } catch (const Error& e) {
      CHECK(e.kind() == ErrorKind::bad_file);
    }
  }
}

TEST_CASE("CLI: responses lists the catalogue", "[responses][cli]") {
  Run r = run("responses");
  CHECK(r.status == 0);
  CHECK(r.out.find("anomalous-hall") != std::string::npos);
  CHECK(r.out.find("berry-curvature-dipole") != std::string::npos);
  Run j = run("responses --format json");
  REQUIRE(j.status == 0);
  std::string n = std::to_string(ResponseCatalogue::builtin().responses().size());
  CHECK(python_json_check(j.out, "d['count'] == " + n + " and len(d['responses']) == " + n) == 0);
  for (const char* f : {"markdown", "latex"}) CHECK(run(std::string("responses --format ") + f).status == 0);
}

TEST_CASE("CLI: response anomalous-hall 4m'm'", "[responses][cli]") {
  Run r = run("response anomalous-hall \"4m'm'\"");
  REQUIRE(r.status == 0);
  CHECK(r.out.find("allowed: 1 independent component") != std::string::npos);
  CHECK(r.out.find("h_z") != std::string::npos);
  Run j = run("response anomalous-hall \"4m'm'\" --format json");
  REQUIRE(j.status == 0);
  CHECK(python_json_check(j.out, "d['response']['id'] == 'anomalous-hall' and d['group']['symbol'] == \"4m'm'\" "
                                 "and d['parts'][0]['independent'] == 1 and d['parts'][0]['form']['parameters'] == ['h_z']") == 0);
  Run grey = run("response ahe \"4mm1'\" --format json");
  REQUIRE(grey.status == 0);
  CHECK(python_json_check(grey.out, "d['allowed_parts'] == 0 and d['parts'][0]['verdict'] == 'forbidden'") == 0);
  for (const char* f : {"markdown", "latex"}) CHECK(run(std::string("response ahe \"4m'm'\" --format ") + f).status == 0);
}

TEST_CASE("CLI: frames, excluded pieces and output files", "[responses][cli]") {
  Run r = run("response bcd 23");
  REQUIRE(r.status == 0);
  CHECK(r.out.find("forbidden (only trD survives") != std::string::npos);
  Run f = run("response shg \"3m1'\" --z [001] --x [1-10] --format json");
  REQUIRE(f.status == 0);
  CHECK(python_json_check(f.out, "d['frame']['x'] == '[1-10]' and not d['frame']['crystal_frame']") == 0);
  std::string out = temp_path("out");
  REQUIRE(run("responses --output '" + out + "'").status == 0);
  CHECK(read_file(out).find("anomalous-hall") != std::string::npos);
  fs::remove(out);
}

TEST_CASE("CLI: exit codes for unknown ids, groups and bad options", "[responses][cli]") {
  Run id = run("response no-such-effect 4mm 2>&1");
  CHECK(id.status == 3);
  CHECK(id.out.find("unknown response") != std::string::npos);
  Run g = run("response anomalous-hall 4mmx 2>&1");
  CHECK(g.status == 3);
  CHECK(g.out.find("unknown point group") != std::string::npos);
  CHECK(run("response anomalous-hall 4mm --x [100] 2>&1").status == 2); // x without the z of its frame
  CHECK(run("response anomalous-hall 4mm --format yaml 2>&1").status == 2);
  CHECK(run("response anomalous-hall 2>&1").status == 2);
}
