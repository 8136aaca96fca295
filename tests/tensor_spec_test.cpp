// Tensor specs: Jahn symbols and our index syntax give the right rank, parity,
// time parity and number of index-reduced components; equivalent specs agree in
// every group; malformed specs are rejected with a message pointing at the
// offending character.
//
// Reduced-component counts are those of the intrinsic index symmetry alone:
// Jahn, "Note on the Bhagavantam-Suryanarayana method of enumerating the physical
// constants of crystals", Acta Cryst. 2, 30 (1949) (title from memory), and
// International Tables for Crystallography Vol. D, ch. 1.1 (Authier), the tables of
// independent components in the triclinic class (from memory). They are also plain counting: a symmetric
// pair of 3-valued indices has 3·4/2 = 6 values, an antisymmetric pair 3, a fully
// symmetric triple C(5,3) = 10, quadruple C(6,4) = 15 [common practice].
#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "tensor/allowed_form.hpp"
#include "tensor/index_symmetry.hpp"
#include "tensor/tensor_spec.hpp"

#include <catch2/catch.hpp>

#include <set>

#include <sstream>
#include <string>
#include <vector>

using namespace ts;

namespace {

struct JahnCase {
  const char* symbol;
  int rank;
  bool axial, time_odd;
  int reduced; // number of components left by the index symmetry alone
};

// Jahn 1949; ITC D ch. 1.1 (from memory); combinatorics [common practice].
const JahnCase kJahn[] = {
    {"V", 1, false, false, 3},        {"aeV", 1, true, true, 3},         {"eV", 1, true, false, 3},
    {"[V2]", 2, false, false, 6},     {"{V2}", 2, false, false, 3},      {"a{V2}", 2, false, true, 3},
    {"eV2", 2, true, false, 9},       {"aeV2", 2, true, true, 9},        {"V[V2]", 3, false, false, 18},
    {"aV[V2]", 3, false, true, 18},   {"eV[V2]", 3, true, false, 18},    {"ae[V2]V", 3, true, true, 18},
    {"[V3]", 3, false, false, 10},    {"V3", 3, false, false, 27},       {"[[V2]2]", 4, false, false, 21},
    {"[V2][V2]", 4, false, false, 36}, {"V[V3]", 4, false, false, 30},   {"[V4]", 4, false, false, 15},
    {"e{V2}", 2, true, false, 3},     {"[V2]V2", 4, false, false, 54},   {"[V²]", 2, false, false, 6},
    {"V[V³]", 4, false, false, 30},
};

const NamedGroup& group(const char* s) { return GroupCatalogue::builtin().get(s); }

// Our index syntax for the same tensors (docs/spec-syntax.md).
const std::pair<const char*, const char*> kEquivalent[] = {
    {"V", "p_i"},
    {"aeV", "m_i: axial, time-odd"},
    {"[V2]", "eps_ij: sym(ij)"},
    {"{V2}", "w_ij: antisym(ij)"},
    {"a{V2}", "t_ij: time-odd, antisym(ij)"},
    {"eV2", "g_ij: axial"},
    {"aeV2", "alpha_ij: axial, c-type"},
    {"V[V2]", "d_ijk: polar, sym(jk)"},
    {"aV[V2]", "chi_ijk: time-odd, sym(jk)"},
    {"ae[V2]V", "q_ijk: axial, time-odd, sym(ij)"},
    {"[V3]", "k_ijk: sym(ijk)"},
    {"[[V2]2]", "c_ijkl: sym(ij), sym(kl), sym(ij,kl)"},
    {"[V2][V2]", "p_ijkl: sym(ij), sym(kl)"},
    {"V[V3]", "chi_ijkl: sym(jkl)"},
    {"[V4]", "s_ijkl: sym(ijkl)"},
    {"e{V2}", "h_ij: axial, i-type, antisym(ij)"},
};

struct BadSpec {
  const char* text;
  int character; // 1-based position the message must point at
  const char* said; // a fragment the message must contain
};

// Malformed specs and where the error must point (our syntax, docs/spec-syntax.md).
const BadSpec kBad[] = {
    {"V[V2", 5, "']'"},                        // missing bracket: points just past the end
    {"[V2", 4, "']'"},
    {"V[V]", 4, "power"},                      // [V] is no symmetrised power
    {"{V}", 3, "power"},
    {"VX", 2, "'X'"},
    {"V(V2)", 2, "'('"},
    {"d_ijk: polar, sym(jq)", 20, "'q'"},      // q is not an index
    {"a_ij: antisym(ik)", 16, "'k'"},
    {"d_ijk: polr", 8, "polr"},
    {"d_iji", 5, "twice"},
    {"d_i2k", 4, "lowercase"},
    {"_ijk", 1, "name"},
    {"d_ijk: sym(jk", 11, "'('"},
    {"d_ijk: polar, axial", 15, "twice"},
    {"d_ijk: time-even, c-type", 19, "twice"},
    {"d_ijk: sym(j)", 8, "two"},
    {"d_ijk: onsager(i,jk)", 8, "equal length"},
    {"d_ijk: sym(jj)", 13, "twice"},
    {"sigma_ab: onsager(a,b), onsager(a,b)", 25, "twice"},
    {"", 1, "empty"},
};

} // namespace

TEST_CASE("Jahn symbols give the expected rank, parities and reduced components", "[spec][jahn]") {
  const NamedGroup& triclinic = group("1");
  for (const auto& c : kJahn) {
    INFO("Jahn symbol " << c.symbol);
    TensorSpec s = parse_tensor_spec(c.symbol);
    CHECK(s.rank == c.rank);
    CHECK(s.axial == c.axial);
    CHECK(s.time_odd == c.time_odd);
    CHECK(s.onsager.empty());
    CHECK(IndexSymmetry(s).size() == c.reduced);
    // With no symmetry but the identity every reduced component is free (Neumann).
    CHECK(independent_count(s, triclinic.group) == c.reduced);
    CHECK(parse_jahn_symbol(c.symbol).rank == c.rank);
  }
}

TEST_CASE("the full index symmetry of a Jahn symbol: every member of an orbit is tied", "[spec][jahn]") {
  // [[V2]2]: c_ijkl = c_jikl = c_ijlk = c_klij; 81 components fall into 21 orbits
  // (Voigt pairs 11, 22, 33, 23, 13, 12 and their symmetric 6x6 matrix) [common practice].
  IndexSymmetry elastic(parse_tensor_spec("[[V2]2]"));
  auto code = [](const char* s) {
    int c = 0;
    for (const char* p = s; *p; ++p) c = c * 3 + (*p - 'x');
    return c;
  };
  const char* tied[] = {"xyzz", "yxzz", "zzxy", "zzyx"};
  for (const char* t : tied) CHECK(elastic.reduced_of(code(t)) == elastic.reduced_of(code("xyzz")));
  CHECK(elastic.reduced_of(code("xyzz")) != elastic.reduced_of(code("xzyz")));
  // {V2}: the diagonal vanishes and w_yx = -w_xy.
  IndexSymmetry anti(parse_tensor_spec("{V2}"));
  CHECK(anti.reduced_of(code("xx")) == -1);
  CHECK(anti.reduced_of(code("xy")) == anti.reduced_of(code("yx")));
  CHECK(anti.sign_of(code("xy")) == -anti.sign_of(code("yx")));
  // [V3]: all six orderings of x, y, z are one component, with sign +1.
  IndexSymmetry kl(parse_tensor_spec("[V3]"));
  for (const char* t : {"xyz", "xzy", "yxz", "yzx", "zxy", "zyx"}) {
    CHECK(kl.reduced_of(code(t)) == kl.reduced_of(code("xyz")));
    CHECK(kl.sign_of(code(t)) == 1);
  }
}

TEST_CASE("index specs equivalent to Jahn symbols give the same counts in every group and setting",
          "[spec][equivalent]") {
  const auto& cat = GroupCatalogue::builtin();
  for (const auto& [jahn, index] : kEquivalent) {
    TensorSpec a = parse_tensor_spec(jahn), b = parse_tensor_spec(index);
    INFO(jahn << " vs " << index);
    REQUIRE(a.rank == b.rank);
    CHECK(a.axial == b.axial);
    CHECK(a.time_odd == b.time_odd);
    CHECK(IndexSymmetry(a).size() == IndexSymmetry(b).size());
    int disagreements = 0;
    for (const auto& g : cat.groups())
      if (independent_count(a, g.group) != independent_count(b, g.group)) {
        ++disagreements;
        UNSCOPED_INFO("differs in " << g.symbol);
      }
    CHECK(disagreements == 0);
  }
}

TEST_CASE("the canonical text of a spec parses back to the same spec", "[spec][roundtrip]") {
  std::vector<std::string> texts;
  for (const auto& c : kJahn) texts.push_back(c.symbol);
  for (const auto& e : kEquivalent) texts.push_back(e.second);
  texts.push_back("sigma_abk: axial, time-odd, onsager(a,b)");
  texts.push_back("sigma_abkl: onsager(a,b), sym(kl)");
  const NamedGroup& g = group("4m'm'");
  for (const auto& t : texts) {
    TensorSpec s = parse_tensor_spec(t);
    TensorSpec back = parse_tensor_spec(s.canonical_text());
    INFO(t << " -> " << s.canonical_text());
    CHECK(back.rank == s.rank);
    CHECK(back.axial == s.axial);
    CHECK(back.time_odd == s.time_odd);
    CHECK(back.onsager == s.onsager);
    CHECK(IndexSymmetry(back).size() == IndexSymmetry(s).size());
    CHECK(independent_count(back, g.group) == independent_count(s, g.group));
    CHECK(back.canonical_text() == s.canonical_text());
  }
}

TEST_CASE("modifiers of the index syntax", "[spec][index]") {
  TensorSpec s = parse_tensor_spec("rho_abk: axial, time-odd, onsager(a,b)");
  CHECK(s.name == "rho");
  CHECK(s.letters == "abk");
  CHECK(s.rank == 3);
  CHECK(s.axial);
  CHECK(s.time_odd);
  CHECK(s.onsager == std::vector<int>{1, 0, 2});
  // i-type / c-type are synonyms of time-even / time-odd.
  CHECK_FALSE(parse_tensor_spec("x_ij: i-type").time_odd);
  CHECK(parse_tensor_spec("x_ij: c-type").time_odd);
  // A block exchange sym(ij,kl) alone leaves 45 components (pairs of a 9-valued index).
  CHECK(IndexSymmetry(parse_tensor_spec("q_ijkl: sym(ij,kl)")).size() == 45);
  // sym(ij) with antisym(ij) kills the tensor.
  CHECK(IndexSymmetry(parse_tensor_spec("z_ij: sym(ij), antisym(ij)")).size() == 0);
  // Rank 6 is the largest accepted.
  CHECK(parse_tensor_spec("T_abcdef").rank == 6);
  CHECK(IndexSymmetry(parse_tensor_spec("[V2][V2][V2]")).size() == 216);
}

TEST_CASE("malformed specs throw bad_spec pointing at the offending character", "[spec][errors]") {
  for (const auto& b : kBad) {
    INFO("spec '" << b.text << "'");
    bool threw = false;
    try {
      (void)parse_tensor_spec(b.text);
    } catch (const Error& e) {
      threw = true;
      CHECK(e.kind() == ErrorKind::bad_spec);
      CHECK(e.exit_code() == 4);
      const std::string msg = e.what();
      INFO("message: " << msg);
      CHECK(msg.find("at character " + std::to_string(b.character) + ":") != std::string::npos);
      CHECK(msg.find(b.said) != std::string::npos);
      CHECK_FALSE(e.valid().empty()); // says what would be accepted
      // The echo of the spec and a caret under the named character.
      std::istringstream lines(e.problem());
      std::string line, echo, caret;
      while (std::getline(lines, line)) {
        if (!echo.empty() && caret.empty()) caret = line;
        if (echo.empty() && line == "    " + std::string(b.text)) echo = line;
      }
      REQUIRE_FALSE(echo.empty());
      CHECK(caret == std::string(4 + b.character - 1, ' ') + "^");
    }
    CHECK(threw);
  }
}

TEST_CASE("rank above 6 throws too_large", "[spec][errors]") {
  for (const char* t : {"V7", "[V7]", "T_abcdefg", "V[V2][V2][V2]", "aeV[V3][V3]", "[[[V9]9]9]"}) {
    INFO("spec '" << t << "'");
    bool threw = false;
    try {
      (void)parse_tensor_spec(t);
    } catch (const Error& e) {
      threw = true;
      CHECK(e.kind() == ErrorKind::too_large);
      CHECK(e.exit_code() == 8);
      CHECK(std::string(e.what()).find("rank") != std::string::npos);
    }
    CHECK(threw);
  }
}

TEST_CASE("Jahn scalars: e is a pseudoscalar, allowed exactly in the 11 chiral classes", "[spec][jahn]") {
  // Jahn (1949): e marks an axial factor, a a time-odd one, so "e" alone is a pseudoscalar.
  // A pseudoscalar survives only proper rotations: the 11 enantiomorphic (chiral) classes
  // (common practice; Nye 1957, optical activity of the enantiomorphous classes).
  TensorSpec e = parse_tensor_spec("e");
  CHECK(e.rank == 0);
  CHECK(e.axial);
  CHECK_FALSE(e.time_odd);
  TensorSpec ae = parse_tensor_spec("ae");
  CHECK(ae.axial);
  CHECK(ae.time_odd);
  std::set<std::string> chiral;
  for (const auto* g : GroupCatalogue::builtin().crystallographic_types())
    if (independent_count(e, g->group) > 0) chiral.insert(g->symbol);
  CHECK(chiral == std::set<std::string>{"1", "2", "222", "4", "422", "3", "32", "6", "622", "23", "432"});
}
