// The group data checked against an outside reference: spglib 2.0.2 (Debian
// libsymspg-dev), its Hall-number database of the 530 space-group settings and
// its database of the 1651 magnetic space groups. The rotation parts of a space
// group are its point group, written in the basis of its conventional cell; we
// take them to our Cartesian frame, R_cart = B R_lat B^-1, with B the columns of
// the conventional basis vectors, and compare with our exact matrices to 1e-12.
#include "group/group_catalogue.hpp"
#include "group/identify.hpp"
#include "support/dmat3.hpp"

#include <catch2/catch.hpp>
#include <spglib.h>

#include <cstring>
#include <map>
#include <set>

using namespace ts;
using namespace ts::test;

namespace {

constexpr double kTol = 1e-12;

enum class Axes { orthogonal, hexagonal, rhombohedral };

// Conventional basis vectors as columns. Orthogonal axes: B = 1. That is right
// for monoclinic cells too, although a and c are oblique there: every point
// operation of a monoclinic group is diagonal in the cell basis (2 or m along the
// unique axis, -1), and a diagonal matrix conjugated by any B that keeps the
// unique axis perpendicular to the other two is the same diagonal matrix.
// Hexagonal axes: a1 = (1, 0, 0), a2 = (-1/2, sqrt(3)/2, 0), c = (0, 0, c) as in
// groups/README.md; c only scales z, which every operation keeps or reverses.
// Rhombohedral axes (obverse): a_r = (2/3, 1/3, 1/3), (-1/3, 1/3, 1/3),
// (-1/3, -2/3, 1/3) in hexagonal axes (International Tables Vol. A, Table 5.1.3.1,
// from memory); the reverse setting would turn the frame by 60 degrees about c,
// which maps every trigonal group in hexagonal axes onto itself.
DMat3 basis(Axes axes, double c = 1.0) {
  const double s = std::sqrt(3.0) / 2;
  const DMat3 hex{{{1, -0.5, 0}, {0, s, 0}, {0, 0, c}}};
  switch (axes) {
  case Axes::orthogonal: return dmat_identity();
  case Axes::hexagonal: return hex;
  case Axes::rhombohedral: {
    const DMat3 P{{{2.0 / 3, -1.0 / 3, -1.0 / 3}, {1.0 / 3, 1.0 / 3, -2.0 / 3}, {1.0 / 3, 1.0 / 3, 1.0 / 3}}};
    return dmul(hex, P);
  }
  }
  return dmat_identity();
}

Axes axes_of_hall(int hall) {
  const SpglibSpacegroupType t = spg_get_spacegroup_type(hall);
  if (t.number >= 143 && t.number <= 194) return std::strcmp(t.choice, "R") == 0 ? Axes::rhombohedral : Axes::hexagonal;
  return Axes::orthogonal;
}

DMat3 to_dmat(const int r[3][3]) {
  DMat3 d{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) d[i][j] = r[i][j];
  return d;
}

// Space-group operations repeat a rotation once per centring or glide/screw
// translation; the point group keeps each rotation once.
struct IntRot {
  int m[3][3];
  int timerev = 0;
  bool operator<(const IntRot& o) const {
    if (timerev != o.timerev) return timerev < o.timerev;
    return std::memcmp(m, o.m, sizeof m) < 0;
  }
};

std::vector<IntRot> hall_rotations(int hall) {
  static int rot[192][3][3];
  static double trans[192][3];
  const int n = spg_get_symmetry_from_database(rot, trans, hall);
  REQUIRE(n > 0);
  std::set<IntRot> uniq;
  for (int i = 0; i < n; ++i) {
    IntRot r{};
    std::memcpy(r.m, rot[i], sizeof r.m);
    uniq.insert(r);
  }
  return {uniq.begin(), uniq.end()};
}

std::vector<DOp> to_cartesian(const std::vector<IntRot>& rots, Axes axes, double c = 1.0) {
  const DMat3 B = basis(axes, c), Binv = dinverse(B);
  std::vector<DOp> out;
  for (const auto& r : rots) out.push_back({dmul(dmul(B, to_dmat(r.m)), Binv), r.timerev != 0});
  return out;
}

bool all_orthogonal(const std::vector<DOp>& ops) {
  return std::all_of(ops.begin(), ops.end(), [](const DOp& o) { return is_orthogonal(o.R, kTol); });
}

// spglib's point-group symbol for a set of lattice rotations.
std::string spglib_pointgroup(const std::vector<IntRot>& rots) {
  static int buf[192][3][3];
  REQUIRE(rots.size() <= 192);
  for (std::size_t k = 0; k < rots.size(); ++k) std::memcpy(buf[k], rots[k].m, sizeof buf[k]);
  char symbol[6] = {0};
  int trans_mat[3][3];
  const int number = spg_get_pointgroup(symbol, trans_mat, buf, static_cast<int>(rots.size()));
  REQUIRE(number > 0);
  std::string s(symbol);
  while (!s.empty() && s.back() == ' ') s.pop_back();
  return s;
}

// spglib names the 32 classes by their short Hermann-Mauguin symbols, spelled
// exactly as our standard entries in spglib 2.0.2 (1, -1, 2, m, 2/m, ..., -6m2,
// m-3m): no mapping is needed. It gives one symbol per type, so the settings
// 312/31m/-31m/-62m/-4m2 come back as 32/3m/-3m/-6m2/-42m, which is our `type`.
// Should a later spglib spell one differently, map it here and say so.
std::string ours_from_spglib(const std::string& s) { return s; }

const CrystalClass* crystal_class(const std::string& name) {
  for (const auto& c : GroupCatalogue::builtin().crystal_classes())
    if (c.name == name) return &c;
  return nullptr;
}

struct HallPick {
  const char* ours;     // our entry (standard or variant setting)
  int hall;             // spglib Hall number of a primitive space group with that point group and setting
  const char* full_hm;  // spglib's full HM symbol for that Hall number, to guard the choice of number
};

// One primitive space group per crystal class and per setting, chosen so that
// its cell matches our frame: unique axis b for 2, m, 2/m (with c and a as the
// variants 112, 211, ...), Pmm2 with the settings cab (P2mm) and bca (Pm2m),
// P-42m vs P-4m2, P321 vs P312, P3m1 vs P31m, P-3m1 vs P-31m, P-6m2 vs P-62m,
// hexagonal axes for every trigonal group.
const HallPick kPicks[] = {
    {"1", 1, "P 1"},           {"-1", 2, "P -1"},
    {"2", 3, "P 1 2 1"},       {"112", 4, "P 1 1 2"},          {"211", 5, "P 2 1 1"},
    {"m", 18, "P 1 m 1"},      {"11m", 19, "P 1 1 m"},         {"m11", 20, "P m 1 1"},
    {"2/m", 57, "P 1 2/m 1"},  {"112/m", 58, "P 1 1 2/m"},     {"2/m11", 59, "P 2/m 1 1"},
    {"222", 108, "P 2 2 2"},   {"mm2", 125, "P m m 2"},        {"2mm", 126, "P 2 m m"},
    {"m2m", 127, "P m 2 m"},   {"mmm", 227, "P 2/m 2/m 2/m"},
    {"4", 349, "P 4"},         {"-4", 355, "P -4"},            {"4/m", 357, "P 4/m"},
    {"422", 366, "P 4 2 2"},   {"4mm", 376, "P 4 m m"},        {"-42m", 388, "P -4 2 m"},
    {"-4m2", 392, "P -4 m 2"}, {"4/mmm", 400, "P 4/m 2/m 2/m"},
    {"3", 430, "P 3"},         {"-3", 435, "P -3"},            {"32", 439, "P 3 2 1"},
    {"312", 438, "P 3 1 2"},   {"3m", 446, "P 3 m 1"},         {"31m", 447, "P 3 1 m"},
    {"-3m", 456, "P -3 2/m 1"}, {"-31m", 454, "P -3 1 2/m"},
    {"6", 462, "P 6"},         {"-6", 468, "P -6"},            {"6/m", 469, "P 6/m"},
    {"622", 471, "P 6 2 2"},   {"6mm", 477, "P 6 m m"},        {"-6m2", 481, "P -6 m 2"},
    {"-62m", 483, "P -6 2 m"}, {"6/mmm", 485, "P 6/m 2/m 2/m"},
    {"23", 489, "P 2 3"},      {"m-3", 494, "P 2/m -3"},       {"432", 503, "P 4 3 2"},
    {"-43m", 511, "P -4 3 m"}, {"m-3m", 517, "P 4/m -3 2/m"},
};

} // namespace

TEST_CASE("spglib: one Hall number per class and setting gives exactly our operations", "[spglib]") {
  // Source: spglib 2.0.2, Debian libsymspg-dev, Hall-number database.
  const auto& cat = GroupCatalogue::builtin();
  std::set<std::string> covered;
  for (const auto& pick : kPicks) {
    INFO("our " << pick.ours << " vs Hall number " << pick.hall);
    const SpglibSpacegroupType t = spg_get_spacegroup_type(pick.hall);
    CHECK(std::string(t.international_full) == pick.full_hm);
    const CrystalClass* found = crystal_class(pick.ours);
    REQUIRE(found);
    const CrystalClass& cls = *found;
    const auto rots = hall_rotations(pick.hall);
    const auto cart = to_cartesian(rots, axes_of_hall(pick.hall));
    REQUIRE(all_orthogonal(cart));
    CHECK(set_distance(cart, to_dops(cls.group.operations()), kTol) < kTol);
    const std::string pg = spglib_pointgroup(rots);
    CHECK(ours_from_spglib(pg) == cls.type);
    CHECK(ours_from_spglib(t.pointgroup_international) == cls.type);
    covered.insert(cls.name);
  }
  // The picks cover every entry of groups/*.toml: the 32 classes and every variant.
  CHECK(covered.size() == cat.crystal_classes().size());
  CHECK(cat.standard_classes().size() == 32);
}

TEST_CASE("spglib: every one of the 530 Hall settings is one of our settings", "[spglib]") {
  // Source: spglib 2.0.2, Debian libsymspg-dev, Hall-number database (all 530
  // settings: cell choices, origin choices, axis permutations, R and H axes).
  const auto& cat = GroupCatalogue::builtin();
  std::map<std::string, std::vector<const CrystalClass*>> by_fingerprint;
  for (const auto& c : cat.crystal_classes()) by_fingerprint[fingerprint(to_dops(c.group.operations()))].push_back(&c);
  REQUIRE(by_fingerprint.size() == cat.crystal_classes().size()); // no two settings share an operation set

  std::map<std::string, int> hits;
  for (int hall = 1; hall <= 530; ++hall) {
    const SpglibSpacegroupType t = spg_get_spacegroup_type(hall);
    INFO("Hall number " << hall << " (" << t.international_full << ", choice '" << t.choice << "')");
    const auto rots = hall_rotations(hall);
    const Axes axes = axes_of_hall(hall);
    const auto cart = to_cartesian(rots, axes);
    REQUIRE(all_orthogonal(cart));
    auto it = by_fingerprint.find(fingerprint(cart));
    REQUIRE(it != by_fingerprint.end());
    const CrystalClass& cls = *it->second.front();
    CHECK(set_distance(cart, to_dops(cls.group.operations()), kTol) < kTol);
    CHECK(ours_from_spglib(spglib_pointgroup(rots)) == cls.type);
    if (axes == Axes::rhombohedral) {
      // The rhombohedral cell fixes no c/a; the point group must not depend on it.
      const auto other = to_cartesian(rots, axes, 2.7);
      REQUIRE(all_orthogonal(other));
      CHECK(set_distance(other, cart, kTol) < kTol);
    }
    ++hits[cls.name];
  }
  // Every setting we tabulate occurs in spglib's database, so none is invented.
  for (const auto& c : cat.crystal_classes()) {
    INFO("our setting " << c.name);
    CHECK(hits[c.name] > 0);
  }
  // Settings spglib has are all ours: the loop above REQUIREs a match for each.
  // Counts fixed by the database itself (spglib 2.0.2): 230 types, 530 settings.
  int total = 0;
  for (const auto& [name, n] : hits) total += n;
  CHECK(total == 530);
}

TEST_CASE("spglib: the magnetic space-group database yields exactly our 122 magnetic point groups", "[spglib]") {
  // Source: spglib 2.0.2, Debian libsymspg-dev, magnetic space-group database
  // (1651 types, BNS/OG numbers). The point group of a magnetic space group is
  // the set of its (rotation, time reversal) pairs: colourless for type I, grey
  // for types II and IV (IV: time reversal only with a translation), black-white
  // for type III.
  const auto& cat = GroupCatalogue::builtin();
  std::map<std::string, std::vector<const NamedGroup*>> by_fingerprint;
  for (const auto& g : cat.groups()) by_fingerprint[fingerprint(to_dops(g.group.operations()))].push_back(&g);
  REQUIRE(by_fingerprint.size() == cat.groups().size()); // every derived group is a distinct operation set

  static int rot[384][3][3];
  static double trans[384][3];
  static int timerev[384];
  std::map<MagneticKind, std::set<std::string>> types_by_kind;
  int counts[5] = {0, 0, 0, 0, 0};
  for (int uni = 1; uni <= 1651; ++uni) {
    const SpglibMagneticSpacegroupType mt = spg_get_magnetic_spacegroup_type(uni);
    INFO("UNI " << uni << " (BNS " << mt.bns_number << ", type " << mt.type << ")");
    REQUIRE(mt.type >= 1);
    REQUIRE(mt.type <= 4);
    ++counts[mt.type];
    const int n = spg_get_magnetic_symmetry_from_database(rot, trans, timerev, uni, 0);
    REQUIRE(n > 0);
    std::set<IntRot> uniq;
    for (int i = 0; i < n; ++i) {
      IntRot r{};
      std::memcpy(r.m, rot[i], sizeof r.m);
      r.timerev = timerev[i];
      uniq.insert(r);
    }
    const std::vector<IntRot> rots(uniq.begin(), uniq.end());
    // The database gives the cell of the default Hall setting (hexagonal axes for
    // R groups); the BNS number's space-group part fixes the crystal family.
    std::vector<DOp> cart = to_cartesian(rots, mt.number >= 143 && mt.number <= 194 ? Axes::hexagonal : Axes::orthogonal);
    if (!all_orthogonal(cart) && mt.number >= 143 && mt.number <= 194) cart = to_cartesian(rots, Axes::rhombohedral);
    REQUIRE(all_orthogonal(cart));
    auto it = by_fingerprint.find(fingerprint(cart));
    REQUIRE(it != by_fingerprint.end());
    const NamedGroup& g = *it->second.front();
    CHECK(set_distance(cart, to_dops(g.group.operations()), kTol) < kTol);
    const MagneticKind expected = mt.type == 1 ? MagneticKind::colourless
                                  : mt.type == 3 ? MagneticKind::black_white
                                                 : MagneticKind::grey;
    CHECK(g.kind == expected);
    types_by_kind[g.kind].insert(g.type_symbol);
  }
  // The well-known split of the 1651 magnetic space-group types (from memory; the
  // same numbers as the database itself): 230 type I, 230 type II, 674 type III,
  // 517 type IV.
  CHECK(counts[1] == 230);
  CHECK(counts[2] == 230);
  CHECK(counts[3] == 674);
  CHECK(counts[4] == 517);
  CHECK(types_by_kind[MagneticKind::colourless].size() == 32);
  CHECK(types_by_kind[MagneticKind::grey].size() == 32);
  CHECK(types_by_kind[MagneticKind::black_white].size() == 58);
  std::set<std::string> found, ours;
  for (const auto& [kind, set] : types_by_kind) found.insert(set.begin(), set.end());
  for (const auto* t : cat.types()) ours.insert(t->symbol);
  CHECK(found == ours);
}
