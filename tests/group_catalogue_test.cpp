// The group catalogue against the published classification of the point groups.
// Sources: R. R. Birss, "Symmetry and Magnetism" (North-Holland, Amsterdam 1964),
// the tables of the 122 magnetic point groups;
// International Tables for Crystallography Vol. A, ch. 10 (Th. Hahn ed., 5th ed.
// 2002; the 32 classes, Schoenflies symbols, orders, Laue and polar classes) and
// Vol. D, ch. 1.5 (the magnetic point groups, their symbols in the
// Hermann-Mauguin notation with primes). No copy of those books was at hand:
// every listed value below is stated from memory of them and marked so. What can
// be computed (closure, inverses, orders, index-2 unitary subgroups, identified
// types) is computed here from the operations, not read from the catalogue.
#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "group/identify.hpp"
#include "support/dmat3.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <set>

using namespace ts;
using namespace ts::test;

namespace {

// A strict order on operations for exact set lookups (not a numeric order).
struct OpLess {
  bool operator()(const Operation& a, const Operation& b) const {
    if (a.primed != b.primed) return a.primed < b.primed;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j)
        if (a.R(i, j) != b.R(i, j)) return lexically_less(a.R(i, j), b.R(i, j));
    return false;
  }
};
using OpSet = std::set<Operation, OpLess>;

OpSet op_set(const PointGroup& g) { return OpSet(g.operations().begin(), g.operations().end()); }

bool is_closed(const OpSet& s) {
  for (const auto& a : s)
    for (const auto& b : s)
      if (!s.count(a * b)) return false;
  return true;
}

Mat3 mat(std::initializer_list<QSqrt3> v) {
  Mat3 m;
  auto it = v.begin();
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) m(i, j) = *it++;
  return m;
}

const QSqrt3 h = QSqrt3(Rational(1, 2));     // 1/2
const QSqrt3 s = QSqrt3(0, Rational(1, 2));  // sqrt(3)/2

// Exact rotations written out by hand (not through rotation_matrix, which is under test).
const Mat3 kRx90 = mat({1, 0, 0, 0, 0, -1, 0, 1, 0});
const Mat3 kRy90 = mat({0, 0, 1, 0, 1, 0, -1, 0, 0});
const Mat3 kRz90 = mat({0, -1, 0, 1, 0, 0, 0, 0, 1});
const Mat3 kR111 = mat({0, 0, 1, 1, 0, 0, 0, 1, 0}); // 120 degrees about [111]: x -> y -> z -> x
const Mat3 kRz60 = mat({h, -s, 0, s, h, 0, 0, 0, 1});

std::string joined(const std::set<std::string>& v) {
  std::string out;
  for (const auto& x : v) out += (out.empty() ? "" : " ") + x;
  return out;
}

// The standard type symbols of each family (the 32 crystallographic types), in the
// tables of International Tables for Crystallography Vol. D (2003), ch. 1.5, Table 1.5.7.1,
// and Bradley and Cracknell, The Mathematical Theory of Symmetry in Solids (1972), Table 7.1
// (from memory): where a type occurs in two orientations (4'mm' and 4'm'm, 4'/mmm' and
// 4'/mm'm) these are the names those tables give. Written in the modern
// notation with -3 for the rotoinversion (Birss writes m3m, m'3m, ...).
const std::map<std::string, std::set<std::string>> kFamilies = {
    {"1", {"1", "11'"}},
    {"-1", {"-1", "-11'", "-1'"}},
    {"2", {"2", "21'", "2'"}},
    {"m", {"m", "m1'", "m'"}},
    {"2/m", {"2/m", "2/m1'", "2'/m", "2/m'", "2'/m'"}},
    {"222", {"222", "2221'", "2'2'2"}},
    {"mm2", {"mm2", "mm21'", "m'm2'", "m'm'2"}},
    {"mmm", {"mmm", "mmm1'", "m'mm", "m'm'm", "m'm'm'"}},
    {"4", {"4", "41'", "4'"}},
    {"-4", {"-4", "-41'", "-4'"}},
    {"4/m", {"4/m", "4/m1'", "4'/m", "4/m'", "4'/m'"}},
    {"422", {"422", "4221'", "4'22'", "42'2'"}},
    {"4mm", {"4mm", "4mm1'", "4'mm'", "4m'm'"}},
    {"-42m", {"-42m", "-42m1'", "-4'2'm", "-4'2m'", "-42'm'"}},
    {"4/mmm", {"4/mmm", "4/mmm1'", "4/m'mm", "4'/mmm'", "4'/m'm'm", "4/mm'm'", "4/m'm'm'"}},
    {"3", {"3", "31'"}},
    {"-3", {"-3", "-31'", "-3'"}},
    {"32", {"32", "321'", "32'"}},
    {"3m", {"3m", "3m1'", "3m'"}},
    {"-3m", {"-3m", "-3m1'", "-3'm", "-3'm'", "-3m'"}},
    {"6", {"6", "61'", "6'"}},
    {"-6", {"-6", "-61'", "-6'"}},
    {"6/m", {"6/m", "6/m1'", "6'/m", "6/m'", "6'/m'"}},
    {"622", {"622", "6221'", "6'22'", "62'2'"}},
    {"6mm", {"6mm", "6mm1'", "6'mm'", "6m'm'"}},
    {"-6m2", {"-6m2", "-6m21'", "-6'm'2", "-6'm2'", "-6m'2'"}},
    {"6/mmm", {"6/mmm", "6/mmm1'", "6/m'mm", "6'/mmm'", "6'/m'mm'", "6/mm'm'", "6/m'm'm'"}},
    {"23", {"23", "231'"}},
    {"m-3", {"m-3", "m-31'", "m'-3'"}},
    {"432", {"432", "4321'", "4'32'"}},
    {"-43m", {"-43m", "-43m1'", "-4'3m'"}},
    {"m-3m", {"m-3m", "m-3m1'", "m'-3'm", "m-3m'", "m'-3'm'"}},
};

} // namespace

TEST_CASE("catalogue: 32 classes and 122 magnetic types = 32 + 32 + 58", "[catalogue]") {
  // Birss 1964; ITC Vol. D ch. 1.5 (from memory): 32 colourless, 32 grey, 58 black-white.
  const auto& cat = GroupCatalogue::builtin();
  CHECK(cat.standard_classes().size() == 32);
  CHECK(cat.crystallographic_types().size() == 32);
  const auto types = cat.types();
  REQUIRE(types.size() == 122);
  int colourless = 0, grey = 0, bw = 0;
  std::set<std::string> symbols;
  for (const auto* t : types) {
    symbols.insert(t->symbol);
    CHECK(t->is_type_standard);
    CHECK(t->type_symbol == t->symbol);
    CHECK(t->crystal->standard);
    colourless += t->kind == MagneticKind::colourless;
    grey += t->kind == MagneticKind::grey;
    bw += t->kind == MagneticKind::black_white;
  }
  CHECK(symbols.size() == 122);
  CHECK(colourless == 32);
  CHECK(grey == 32);
  CHECK(bw == 58);
}

TEST_CASE("catalogue: the 32 classes with their Schoenflies symbols and orders", "[catalogue]") {
  // ITA Vol. A Table 10.1.2.2 (from memory).
  const std::map<std::string, std::pair<std::string, std::size_t>> expected = {
      {"1", {"C1", 1}},     {"-1", {"Ci", 2}},     {"2", {"C2", 2}},      {"m", {"Cs", 2}},
      {"2/m", {"C2h", 4}},  {"222", {"D2", 4}},    {"mm2", {"C2v", 4}},   {"mmm", {"D2h", 8}},
      {"4", {"C4", 4}},     {"-4", {"S4", 4}},     {"4/m", {"C4h", 8}},   {"422", {"D4", 8}},
      {"4mm", {"C4v", 8}},  {"-42m", {"D2d", 8}},  {"4/mmm", {"D4h", 16}}, {"3", {"C3", 3}},
      {"-3", {"C3i", 6}},   {"32", {"D3", 6}},     {"3m", {"C3v", 6}},    {"-3m", {"D3d", 12}},
      {"6", {"C6", 6}},     {"-6", {"C3h", 6}},    {"6/m", {"C6h", 12}},  {"622", {"D6", 12}},
      {"6mm", {"C6v", 12}}, {"-6m2", {"D3h", 12}}, {"6/mmm", {"D6h", 24}}, {"23", {"T", 12}},
      {"m-3", {"Th", 24}},  {"432", {"O", 24}},    {"-43m", {"Td", 24}},  {"m-3m", {"Oh", 48}},
  };
  const auto& cat = GroupCatalogue::builtin();
  std::set<std::string> seen;
  for (const auto* c : cat.standard_classes()) {
    INFO("class " << c->name);
    auto it = expected.find(c->name);
    REQUIRE(it != expected.end());
    CHECK(c->schoenflies == it->second.first);
    CHECK(c->group.order() == it->second.second);
    seen.insert(c->name);
  }
  CHECK(seen.size() == expected.size());
  // A setting is the same type: same order, Schoenflies symbol and kind counts.
  for (const auto& c : cat.crystal_classes()) {
    INFO("setting " << c.name << " of type " << c.type);
    auto it = expected.find(c.type);
    REQUIRE(it != expected.end());
    CHECK(c.group.order() == it->second.second);
    CHECK(c.schoenflies == it->second.first);
    CHECK(cat.crystallographic_type_of(c.group)->name == c.type);
  }
}

TEST_CASE("catalogue: 11 centrosymmetric and 10 polar classes, Laue groups", "[catalogue]") {
  // ITA Vol. A section 10.1.1 (from memory): the 11 Laue classes are the
  // centrosymmetric ones; the 10 polar (pyroelectric) classes leave a direction fixed.
  const std::set<std::string> centro = {"-1", "2/m", "mmm", "4/m", "4/mmm", "-3", "-3m", "6/m", "6/mmm", "m-3", "m-3m"};
  const std::set<std::string> polar = {"1", "2", "m", "mm2", "4", "4mm", "3", "3m", "6", "6mm"};
  const auto& cat = GroupCatalogue::builtin();
  const Operation inversion{Mat3::identity().scaled(QSqrt3(-1)), false};
  std::set<std::string> got_centro, got_polar;
  for (const auto& c : cat.crystal_classes()) {
    INFO("setting " << c.name);
    const bool has_inversion = c.group.contains(inversion);
    // Polar iff the average of the rotation matrices (the projector onto the
    // vectors every operation leaves fixed) is not zero.
    Mat3 sum;
    for (const auto& op : c.group.operations()) sum = sum + op.R;
    bool fixed_vector = false;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) fixed_vector = fixed_vector || !sum(i, j).is_zero();
    CHECK(c.centrosymmetric == has_inversion);
    CHECK(c.polar == fixed_vector);
    if (c.standard && has_inversion) got_centro.insert(c.name);
    if (c.standard && fixed_vector) got_polar.insert(c.name);
    // The Laue entry holds exactly G together with -1 G, in the same setting.
    const CrystalClass* laue = nullptr;
    for (const auto& l : cat.crystal_classes())
      if (l.name == c.laue) laue = &l;
    REQUIRE(laue);
    OpSet expected = op_set(c.group);
    for (const auto& op : c.group.operations()) expected.insert(inversion * op);
    CHECK(op_set(laue->group).size() == expected.size());
    CHECK((op_set(laue->group) == expected));
  }
  CHECK(joined(got_centro) == joined(centro));
  CHECK(joined(got_polar) == joined(polar));
}

TEST_CASE("catalogue: every group is a group, of order dividing 48 (96 grey)", "[catalogue]") {
  const auto& cat = GroupCatalogue::builtin();
  REQUIRE(!cat.groups().empty());
  for (const auto& g : cat.groups()) {
    INFO("group " << g.symbol << " (" << g.crystal->name << " setting)");
    const OpSet ops = op_set(g.group);
    REQUIRE(ops.size() == g.group.order()); // no repeated operation
    CHECK(ops.count(Operation::identity()) == 1);
    CHECK(is_closed(ops));
    for (const auto& op : ops) {
      CHECK(ops.count(op.inverse()) == 1);
      CHECK(op * op.inverse() == Operation::identity());
      CHECK(op.R.is_orthogonal());
    }
    const std::size_t n = ops.size();
    const PointGroup plain = g.group.underlying_group();
    CHECK((op_set(plain) == op_set(g.crystal->group))); // primes dropped: the class it came from
    switch (g.kind) {
    case MagneticKind::colourless:
      CHECK(48 % n == 0);
      CHECK(!g.group.is_magnetic());
      break;
    case MagneticKind::grey:
      CHECK(96 % n == 0);
      CHECK(g.group.is_grey());
      CHECK(n == 2 * plain.order());
      break;
    case MagneticKind::black_white: {
      CHECK(48 % n == 0);
      CHECK(!g.group.is_grey());
      CHECK(n == plain.order());
      // H = the unprimed operations: a subgroup of index 2, and the primed ones are G - H.
      const PointGroup H = g.group.unitary_part();
      const OpSet hs = op_set(H);
      CHECK(2 * hs.size() == n);
      CHECK(hs.count(Operation::identity()) == 1);
      CHECK(is_closed(hs));
      CHECK(cat.crystallographic_type_of(H)->name == g.unitary_type);
      for (const auto& op : ops)
        if (op.primed) CHECK(!hs.count(Operation{op.R, false}));
      break;
    }
    }
  }
}

TEST_CASE("catalogue: the type symbols of every family", "[catalogue]") {
  // Birss 1964; ITC Vol. D ch. 1.5 (from memory): see kFamilies.
  const auto& cat = GroupCatalogue::builtin();
  std::map<std::string, std::set<std::string>> got;
  for (const auto* t : cat.types()) got[t->family].insert(t->symbol);
  std::size_t total = 0;
  for (const auto& [family, expected] : kFamilies) {
    INFO("family " << family);
    CHECK(joined(got[family]) == joined(expected));
    total += expected.size();
  }
  CHECK(total == 122);
  CHECK(got.size() == kFamilies.size());
  // The grey type of a family G is G1' and the black-white ones carry a prime on a
  // position (-1' is black-white: the prime sits on -1): kind and spelling agree.
  for (const auto* t : cat.types()) {
    INFO("type " << t->symbol);
    CHECK((t->symbol == t->family + "1'") == (t->kind == MagneticKind::grey));
    CHECK((t->symbol.find('\'') != std::string::npos) == (t->kind != MagneticKind::colourless));
  }
}

TEST_CASE("catalogue: every spelling in every setting parses back to its own operations and type", "[catalogue]") {
  const auto& cat = GroupCatalogue::builtin();
  for (const auto& g : cat.groups()) {
    INFO("symbol " << g.symbol << " (" << g.crystal->name << " setting)");
    const NamedGroup* back = cat.find(g.symbol);
    REQUIRE(back);
    CHECK((back->group == g.group));
    // The type named in the catalogue is the one identification finds from the
    // operations alone.
    const Identification id = identify(g.group, cat);
    REQUIRE(id.type);
    CHECK(id.type->symbol == g.type_symbol);
    const NamedGroup& type = cat.get(g.type_symbol);
    CHECK(type.family == g.family);
    CHECK(type.kind == g.kind);
    CHECK(type.unitary_type == g.unitary_type);
  }
}

TEST_CASE("catalogue: orientation variants of primed symbols", "[catalogue]") {
  // Each variant is the same type in another orientation (Birss 1964, from memory:
  // the type is fixed by G and the class of H; here the prime positions were worked
  // out by hand from the settings in groups/README.md).
  const std::vector<std::pair<std::string, std::string>> variants = {
      {"mm'2'", "m'm2'"},   {"2'mm'", "m'm2'"},   {"2'm'm", "m'm2'"},     {"m'2'm", "m'm2'"},
      {"m2'm'", "m'm2'"},   {"2m'm'", "m'm'2"},   {"m'2m'", "m'm'2"},     {"mm'm", "m'mm"},
      {"mmm'", "m'mm"},     {"m'mm'", "m'm'm"},   {"mm'm'", "m'm'm"},     {"112'", "2'"},
      {"11m'", "m'"},       {"112'/m", "2'/m"},   {"112/m'", "2/m'"},     {"112'/m'", "2'/m'"},
      {"2'11", "2'"},       {"m'11", "m'"},       {"2'/m11", "2'/m"},     {"2/m'11", "2/m'"},
      {"4'm'm", "4'mm'"},   {"4'2'2", "4'22'"},   {"4'/mm'm", "4'/mmm'"}, {"4'/m'mm'", "4'/m'm'm"},
      {"-4'm2'", "-4'2'm"}, {"-4'm'2", "-4'2m'"}, {"-4m'2'", "-42'm'"},   {"312'", "32'"},
      {"31m'", "3m'"},      {"-3'1m", "-3'm"},    {"-3'1m'", "-3'm'"},    {"-31m'", "-3m'"},
      {"-6'2'm", "-6'm2'"}, {"-6'2m'", "-6'm'2"}, {"-62'm'", "-6m'2'"},   {"6'2'2", "6'22'"},
      {"6'm'm", "6'mm'"},   {"6'/mm'm", "6'/mmm'"}, {"6'/m'm'm", "6'/m'mm'"},
  };
  const auto& cat = GroupCatalogue::builtin();
  for (const auto& [variant, type] : variants) {
    INFO(variant << " should be of type " << type);
    const NamedGroup* g = cat.find(variant);
    REQUIRE(g);
    CHECK(g->symbol == variant);
    CHECK(g->type_symbol == type);
    const NamedGroup& standard = cat.get(type);
    CHECK(standard.is_type_standard);
    CHECK((g->group != standard.group)); // a different setting: different operations
    CHECK(g->group.order() == standard.group.order());
    CHECK(operation_kind_counts(g->group) == operation_kind_counts(standard.group));
    CHECK(operation_kind_counts(g->group.unitary_part()) == operation_kind_counts(standard.group.unitary_part()));
    CHECK(identify(g->group, cat).type == &standard);
  }
  // m'm2' and mm'2': one type, two settings; the mirror that carries the prime differs.
  const NamedGroup& a = cat.get("m'm2'");
  const NamedGroup& b = cat.get("mm'2'");
  CHECK(a.type_symbol == b.type_symbol);
  CHECK((a.group != b.group));
  const Operation mx = parse_operation("m [100]", LatticeKind::orthogonal);
  const Operation my = parse_operation("m [010]", LatticeKind::orthogonal);
  CHECK(a.group.contains(my));
  CHECK(!a.group.contains(mx));
  CHECK(b.group.contains(mx));
  CHECK(!b.group.contains(my));
  CHECK((a.group.conjugated(kRz90) == b.group));
}

TEST_CASE("catalogue: lookup by Schoenflies symbol, aliases and spellings", "[catalogue]") {
  const auto& cat = GroupCatalogue::builtin();
  // Schoenflies: G, G1' (grey) and G(H) (black-white with unitary subgroup H);
  // S6 and C3i are two names of one class (ITA Vol. A, from memory).
  const std::vector<std::pair<std::string, std::string>> schoenflies = {
      {"C4v", "4mm"},         {"C4v1'", "4mm1'"},     {"D4h(D2h)", "4'/mmm'"}, {"D4h(C4v)", "4/m'mm"},
      {"D4h(D2d)", "4'/m'm'm"}, {"D4h(C4h)", "4/mm'm'"}, {"D4h(D4)", "4/m'm'm'"}, {"C2v(Cs)", "m'm2'"},
      {"C2v(C2)", "m'm'2"},   {"D2h(C2v)", "m'mm"},   {"D2h(C2h)", "m'm'm"},   {"D2h(D2)", "m'm'm'"},
      {"D3d(D3)", "-3'm'"},   {"D3d(C3v)", "-3'm"},   {"D3d(C3i)", "-3m'"},    {"Oh(O)", "m'-3'm'"},
      {"Oh(Td)", "m'-3'm"},   {"Oh(Th)", "m-3m'"},    {"Ci", "-1"},            {"S6", "-3"},
      {"C3i", "-3"},          {"Td", "-43m"},         {"c4v", "4mm"},          {"D6h1'", "6/mmm1'"},
  };
  for (const auto& [symbol, hm] : schoenflies) {
    INFO("Schoenflies " << symbol);
    const NamedGroup* g = cat.find(symbol);
    REQUIRE(g);
    CHECK(g->symbol == hm);
  }
  // Aliases listed in groups/*.toml (321, 3m1, -3m1, 121, 1m1, 12/m1) name the
  // same operations as their entry, primes included; spaces and unicode primes
  // and minus signs are only spelling.
  const std::vector<std::pair<std::string, std::string>> aliases = {
      {"321", "32"},    {"3m1", "3m"},     {"-3m1", "-3m"},     {"121", "2"},        {"1m1", "m"},
      {"12/m1", "2/m"}, {"1 2/m 1", "2/m"}, {"32'1", "32'"},    {"3m'1", "3m'"},     {"-3'm1", "-3'm"},
      {"12'1", "2'"},   {"12'/m'1", "2'/m'"}, {"4 m m", "4mm"}, {"m'm2'", "m'm2'"},
      {"\xe2\x88\x92" "4\xe2\x80\xb2" "2m\xe2\x80\xb2", "-4'2m'"}, // U+2212 minus, U+2032 primes
  };
  for (const auto& [alias, name] : aliases) {
    INFO("alias " << alias);
    const NamedGroup* g = cat.find(alias);
    REQUIRE(g);
    CHECK((g->group == cat.get(name).group));
  }
  // "2/m 1 1" is no alias but the name of the unique-axis-a setting, spaced out.
  const NamedGroup* a = cat.find("2/m 1 1");
  REQUIRE(a);
  CHECK(a->symbol == "2/m11");
  CHECK((a->group != cat.get("2/m").group));
  CHECK(a->type_symbol == "2/m");
  // 321' is the grey group of 321, not a primed 32.
  CHECK(cat.get("321'").kind == MagneticKind::grey);
}

TEST_CASE("catalogue: unknown symbols fail with the closest names", "[catalogue]") {
  const auto& cat = GroupCatalogue::builtin();
  CHECK(cat.find("4nm") == nullptr);
  CHECK(cat.find("C5v") == nullptr);
  CHECK(cat.find("m'm'2'") == nullptr); // not a group: 2 = m m must be unprimed when both mirrors are primed
  const auto near = cat.closest_symbols("4nm");
  CHECK(std::find(near.begin(), near.end(), "4mm") != near.end());
  try {
    (void)cat.get("4nm");
    FAIL("get() accepted an unknown symbol");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::unknown_name);
    CHECK(e.exit_code() == 3);
    CHECK_THAT(e.problem(), Catch::Contains("4nm"));
    CHECK_THAT(e.valid(), Catch::Contains("4mm"));
  }
  const auto near_primed = cat.closest_symbols("m'm2");
  CHECK(std::find(near_primed.begin(), near_primed.end(), "m'm2'") != near_primed.end());
}

TEST_CASE("identify: each of the 122 types in rotated frames", "[catalogue][identify]") {
  const auto& cat = GroupCatalogue::builtin();
  for (const auto* t : cat.types()) {
    std::vector<std::pair<std::string, Mat3>> rotations = {
        {"none", Mat3::identity()},        {"90 about x", kRx90}, {"90 about y", kRy90},
        {"90 about z", kRz90},             {"120 about [111]", kR111},
        {"90 about x, then 120 about [111]", kR111 * kRx90},
    };
    if (t->group.lattice() == LatticeKind::hexagonal) {
      rotations.push_back({"60 about z", kRz60});
      rotations.push_back({"90 about x, then 60 about z", kRz60 * kRx90});
    }
    for (const auto& [label, Q] : rotations) {
      INFO("type " << t->symbol << ", frame turned " << label);
      const PointGroup rotated = t->group.conjugated(Q);
      // conjugated() is itself checked against Q g Q^T term by term.
      OpSet expected;
      for (const auto& op : t->group.operations()) expected.insert(Operation{Q * op.R * Q.transpose(), op.primed});
      REQUIRE((op_set(rotated) == expected));

      const Identification id = identify(rotated, cat);
      REQUIRE(id.type);
      CHECK(id.type == t);
      if (id.same_setting) CHECK((id.same_setting->group == rotated));
      if (label == std::string("none")) CHECK(id.same_setting == t);

      // The standard axes, normalised, are the rows of a rotation that carries the
      // rotated group back onto the standard one.
      DMat3 q{};
      for (int r = 0; r < 3; ++r) {
        double n2 = 0;
        for (int c = 0; c < 3; ++c) n2 += id.standard_axes[r][c].to_double() * id.standard_axes[r][c].to_double();
        REQUIRE(n2 > 0);
        for (int c = 0; c < 3; ++c) q[r][c] = id.standard_axes[r][c].to_double() / std::sqrt(n2);
      }
      CHECK(is_orthogonal(q, 1e-12));
      CHECK(ddet(q) == Approx(1.0).margin(1e-12));
      std::vector<DOp> back;
      for (const auto& op : rotated.operations()) back.push_back({dmul(dmul(q, to_dmat(op.R)), dtranspose(q)), op.primed});
      CHECK(set_distance(back, to_dops(t->group.operations()), 1e-12) < 1e-12);
    }
  }
}
