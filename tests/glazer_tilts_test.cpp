// Glazer tilt systems: parsing, the built supercell, and its space group.
#include "core/error.hpp"
#include "lowering/glazer_tilts.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <map>
#include <set>

using namespace ts;

namespace {

using IMat = std::array<std::array<int, 3>, 3>;

IMat product(const IMat& a, const IMat& b) {
  IMat c{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int k = 0; k < 3; ++k) c[i][j] += a[i][k] * b[k][j];
  return c;
}

std::set<IMat> rotation_set(const TiltedPerovskite& t) {
  return {t.point_rotations_pseudocubic.begin(), t.point_rotations_pseudocubic.end()};
}

int bad_spec_position(const std::string& symbol) {
  try {
    parse_glazer_symbol(symbol);
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_spec);
    CHECK(e.location().find(symbol) != std::string::npos);
    CHECK_FALSE(e.valid().empty());
    const std::string tag = "character ";
    const auto p = e.location().rfind(tag);
    REQUIRE(p != std::string::npos);
    return std::stoi(e.location().substr(p + tag.size()));
  }
  FAIL("no error for \"" << symbol << "\"");
  return 0;
}

struct Expected {
  const char* glazer;
  int number;
  const char* symbol;
  const char* point_group;
  std::size_t order;
};

// Howard & Stokes, "Group-theoretical analysis of octahedral tilting in
// perovskites", Acta Cryst. B54, 782 (1998), the 15 tilt systems and their
// space groups (Table 1 and Fig. 2 there). Stated here from memory.
// The point group of each space group and its order: ITA vol. A, Table 3.1.2.1
// (common practice).
const Expected kHowardStokes[] = {
    {"a0a0a0", 221, "Pm-3m", "m-3m", 48},   {"a0a0c+", 127, "P4/mbm", "4/mmm", 16},
    {"a0b+b+", 139, "I4/mmm", "4/mmm", 16}, {"a+a+a+", 204, "Im-3", "m-3", 24},
    {"a+b+c+", 71, "Immm", "mmm", 8},       {"a0a0c-", 140, "I4/mcm", "4/mmm", 16},
    {"a0b-b-", 74, "Imma", "mmm", 8},       {"a-a-a-", 167, "R-3c", "-3m", 12},
    {"a0b-c-", 12, "C2/m", "2/m", 4},       {"a-b-b-", 15, "C2/c", "2/m", 4},
    {"a-b-c-", 2, "P-1", "-1", 2},          {"a0b+c-", 63, "Cmcm", "mmm", 8},
    {"a+b-b-", 62, "Pnma", "mmm", 8},       {"a+b-c-", 11, "P2_1/m", "2/m", 4},
    {"a+a+c-", 137, "P4_2/nmc", "4/mmm", 16},
};

} // namespace

TEST_CASE("Glazer symbols parse into senses and magnitude classes", "[glazer]") {
  const TiltSystem t = parse_glazer_symbol("a+b-b-");
  CHECK(t.glazer == "a+b-b-");
  CHECK(t.sense == std::array<char, 3>{'+', '-', '-'});
  CHECK(t.magnitude_class == std::array<int, 3>{0, 1, 1});

  const TiltSystem u = parse_glazer_symbol("a0a0c-");
  CHECK(u.sense == std::array<char, 3>{'0', '0', '-'});
  CHECK(u.magnitude_class == std::array<int, 3>{0, 0, 2});

  CHECK(parse_glazer_symbol("a-a-a-").magnitude_class == std::array<int, 3>{0, 0, 0});
  CHECK(parse_glazer_symbol("a0b+c-").magnitude_class == std::array<int, 3>{0, 1, 2});

  // Other spellings of the same symbol.
  for (const char* s : {"a\u2070a\u2070c\u207B", "a^0a^0c^-", "a0a0c\u2212", "  a0a0c-  ", "A0A0C-"}) {
    INFO(s);
    const TiltSystem v = parse_glazer_symbol(s);
    CHECK(v.glazer == "a0a0c-");
    CHECK(v.sense == u.sense);
    CHECK(v.magnitude_class == u.magnitude_class);
  }
}

TEST_CASE("bad Glazer symbols are refused at the offending character", "[glazer][errors]") {
  CHECK(bad_spec_position("a0x0c-") == 3);   // not an axis letter
  CHECK(bad_spec_position("b0a0c-") == 1);   // x must be a
  CHECK(bad_spec_position("a0c0c-") == 3);   // y must be b or a
  CHECK(bad_spec_position("a0a0c*") == 6);   // not a tilt
  CHECK(bad_spec_position("a0a0c") == 6);    // ends early
  CHECK(bad_spec_position("a0a0c-x") == 7);  // trailing text
  CHECK(bad_spec_position("a0a+c-") == 4);   // equal letters, one untilted
  CHECK(bad_spec_position("a\u2070b\u00B2c-") == 4); // a superscript two is no tilt
  CHECK_THROWS_AS(parse_glazer_symbol(""), Error);
  CHECK_THROWS_WITH(parse_glazer_symbol("a0x0c-"), Catch::Contains("letter for the y axis"));

  TiltSystem broken = parse_glazer_symbol("a+b-b-");
  broken.magnitude_class = {0, 2, 2};
  CHECK_THROWS_AS(build_tilted_perovskite(broken), Error);
  broken = parse_glazer_symbol("a+b-b-");
  broken.sense[0] = '?';
  CHECK_THROWS_AS(build_tilted_perovskite(broken), Error);
}

TEST_CASE("the 15 tilt systems of Howard & Stokes (1998) get their published space groups", "[glazer][spglib]") {
  const std::vector<std::string> all = all_glazer_tilt_systems();
  REQUIRE(all.size() == 15);
  std::set<std::string> listed(all.begin(), all.end());
  for (const Expected& e : kHowardStokes) {
    INFO(e.glazer);
    CHECK(listed.count(e.glazer) == 1);
    const TiltedPerovskite t = build_tilted_perovskite(parse_glazer_symbol(e.glazer));
    CHECK(t.symmetry.space_group_number == e.number);
    CHECK(t.symmetry.space_group_symbol == e.symbol);
    CHECK(t.symmetry.point_group_symbol == e.point_group);
    CHECK(t.symmetry.point_operations.size() == e.order);
    REQUIRE(t.point_rotations_pseudocubic.size() == e.order);

    // A group: closed under products, with no repeats.
    const std::set<IMat> g = rotation_set(t);
    CHECK(g.size() == e.order);
    for (const IMat& a : g)
      for (const IMat& b : g) CHECK(g.count(product(a, b)) == 1);
  }
}

TEST_CASE("tilt point groups sit in the pseudocubic frame as expected", "[glazer][spglib]") {
  const IMat four_z{{{0, -1, 0}, {1, 0, 0}, {0, 0, 1}}};
  const IMat three_111{{{0, 0, 1}, {1, 0, 0}, {0, 1, 0}}}; // x -> y -> z -> x
  const IMat two_x{{{1, 0, 0}, {0, -1, 0}, {0, 0, -1}}};
  const IMat two_011{{{-1, 0, 0}, {0, 0, 1}, {0, 1, 0}}};
  const IMat four_x{{{1, 0, 0}, {0, 0, -1}, {0, 1, 0}}};

  // One tilt about z: the 4-fold axis is the tilt axis (common practice).
  for (const char* s : {"a0a0c-", "a0a0c+"}) {
    const std::set<IMat> g = rotation_set(build_tilted_perovskite(parse_glazer_symbol(s)));
    CHECK(g.count(four_z) == 1);
    for (const IMat& r : g) CHECK(std::abs(r[2][2]) == 1); // z stays ±z
  }
  // Equal anti-phase tilts about x, y, z: the 3-fold axis is [111].
  {
    const std::set<IMat> g = rotation_set(build_tilted_perovskite(parse_glazer_symbol("a-a-a-")));
    CHECK(g.count(three_111) == 1);
    for (const IMat& r : g) {
      const int sx = r[0][0] + r[0][1] + r[0][2], sy = r[1][0] + r[1][1] + r[1][2], sz = r[2][0] + r[2][1] + r[2][2];
      CHECK((std::abs(sx) == 1 && sx == sy && sy == sz)); // [111] -> ±[111]
    }
  }
  // a+b-b-: orthorhombic axes along [100], [011] and [01-1] of the parent.
  {
    const std::set<IMat> g = rotation_set(build_tilted_perovskite(parse_glazer_symbol("a+b-b-")));
    CHECK(g.count(two_x) == 1);
    CHECK(g.count(two_011) == 1);
    CHECK(g.count(four_x) == 0);
  }
  // a+a+a+ (Im-3): the 3-fold about [111] but no 4-fold anywhere.
  {
    const std::set<IMat> g = rotation_set(build_tilted_perovskite(parse_glazer_symbol("a+a+a+")));
    CHECK(g.count(three_111) == 1);
    CHECK(g.count(four_z) == 0);
    CHECK(g.count(four_x) == 0);
  }
}

TEST_CASE("an equal magnitude between an in-phase and an anti-phase tilt adds no symmetry", "[glazer][spglib]") {
  // No operation of m-3m turns an in-phase tilt into an anti-phase one (they
  // belong to different points of the cubic Brillouin zone), so such an
  // equality is accidental (common practice). Pairs: (with, without) the equality.
  const std::pair<const char*, const char*> pairs[] = {
      {"a+a-a-", "a+b-b-"}, {"a+a+a-", "a+a+c-"}, {"a+a-c-", "a+b-c-"},
      {"a0b+b-", "a0b+c-"}, {"a+b+b-", "a+b+c-"},
  };
  for (const auto& [with, without] : pairs) {
    INFO(with << " vs " << without);
    const TiltedPerovskite a = build_tilted_perovskite(parse_glazer_symbol(with));
    const TiltedPerovskite b = build_tilted_perovskite(parse_glazer_symbol(without));
    CHECK(a.symmetry.space_group_number == b.symmetry.space_group_number);
    CHECK(rotation_set(a) == rotation_set(b));
  }
}

TEST_CASE("the tilted cell is a corner-sharing network of near-rigid octahedra", "[glazer]") {
  for (const char* s : {"a+b-c-", "a-b-c-", "a-a-a-", "a0a0c+"}) {
    INFO(s);
    const TiltedPerovskite t = build_tilted_perovskite(parse_glazer_symbol(s));
    const CrystalStructure& c = t.cell;
    std::map<std::string, int> count;
    for (const AtomSite& a : c.sites) ++count[a.species];
    CHECK(count["A"] == 8);
    CHECK(count["B"] == 8);
    CHECK(count["O"] == 24);
    CHECK(c.sites.size() == 40);
    CHECK_FALSE(c.magnetic);

    // Minimum-image B-O distances: every B has 6 O at about 1.95 A (half the
    // pseudocubic 3.9 A) and every O has exactly 2 B there.
    auto distance = [&](const AtomSite& p, const AtomSite& q) {
      std::array<double, 3> d{};
      for (int k = 0; k < 3; ++k) {
        d[k] = p.frac[k] - q.frac[k];
        d[k] -= std::round(d[k]);
      }
      const auto r = fractional_to_cartesian(c, d);
      return std::sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
    };
    std::map<std::size_t, int> b_of_o;
    for (std::size_t i = 0; i < c.sites.size(); ++i) {
      if (c.sites[i].species != "B") continue;
      int n = 0;
      for (std::size_t j = 0; j < c.sites.size(); ++j) {
        if (c.sites[j].species != "O") continue;
        const double d = distance(c.sites[i], c.sites[j]);
        if (d < 2.4) {
          ++n;
          ++b_of_o[j];
          CHECK(d == Approx(1.95).epsilon(0.001));
        }
      }
      CHECK(n == 6);
    }
    CHECK(b_of_o.size() == 24);
    for (const auto& [o, n] : b_of_o) CHECK(n == 2);
  }
  // Untilted: the ideal cubic cell, B-O exactly 1.95 A.
  const TiltedPerovskite cubic = build_tilted_perovskite(parse_glazer_symbol("a0a0a0"));
  CHECK(cubic.cell.lattice[0][0] == Approx(7.8));
  CHECK(cubic.cell.lattice[2][2] == Approx(7.8));
}
