#include "group/identify.hpp"

#include "core/big_qsqrt3.hpp"

#include <algorithm>

namespace ts {

// Scale a direction so its squared length is rational where possible
// (components that are all multiples of √3 are divided by √3).
bool rational_length(Vec3& v) {
  bool all_sqrt3 = true;
  for (const auto& c : v)
    if (!c.rational_part().is_zero()) all_sqrt3 = false;
  if (all_sqrt3)
    for (auto& c : v) c = QSqrt3(c.sqrt3_part());
  return dot(v, v).is_rational();
}

std::vector<Vec3> candidate_lines(const PointGroup& g) {
  std::vector<Vec3> lines;
  auto add = [&](Vec3 v) {
    if (is_zero(v) || !rational_length(v)) return;
    for (const auto& l : lines)
      if (parallel(l, v)) return;
    lines.push_back(v);
  };
  for (const auto& op : g.operations()) add(op.kind().axis);
  std::size_t axes = lines.size();
  for (std::size_t i = 0; i < axes; ++i)
    for (std::size_t j = i + 1; j < axes; ++j) add(cross(lines[i], lines[j]));
  const Vec3 e[3] = {{QSqrt3(1), QSqrt3(0), QSqrt3(0)}, {QSqrt3(0), QSqrt3(1), QSqrt3(0)}, {QSqrt3(0), QSqrt3(0), QSqrt3(1)}};
  for (const auto& b : e) add(b);
  std::size_t now = lines.size();
  for (std::size_t i = 0; i < now; ++i)
    for (const auto& b : e) add(cross(lines[i], b));
  return lines;
}

namespace {

// Does the frame with rows r carry op g onto some operation of the standard group?
// Frames of films come from measured lattice parameters (a = 3.91, c = 4.1 gives a
// (101) normal [168100, 0, 152881]), whose squared lengths outgrow 64 bits in the
// comparison, so the check runs on big rationals.
using BigVec3 = std::array<BigQSqrt3, 3>;

BigVec3 big(const Vec3& v) { return {BigQSqrt3(v[0]), BigQSqrt3(v[1]), BigQSqrt3(v[2])}; }

BigQSqrt3 big_dot(const BigVec3& a, const BigVec3& b) { return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]; }

BigVec3 big_apply(const Mat3& m, const BigVec3& v) {
  BigVec3 out;
  for (int i = 0; i < 3; ++i) out[i] = BigQSqrt3(m(i, 0)) * v[0] + BigQSqrt3(m(i, 1)) * v[1] + BigQSqrt3(m(i, 2)) * v[2];
  return out;
}

bool maps_into(const std::array<BigVec3, 3>& r, const std::array<BigQSqrt3, 3>& n2, const Operation& g,
               const PointGroup& standard) {
  BigQSqrt3 X[3][3];
  for (int i = 0; i < 3; ++i) {
    BigVec3 gr = big_apply(g.R, r[i]);
    for (int j = 0; j < 3; ++j) X[j][i] = big_dot(r[j], gr);
  }
  for (const auto& h : standard.operations()) {
    if (h.primed != g.primed) continue;
    bool ok = true;
    for (int i = 0; i < 3 && ok; ++i)
      for (int j = 0; j < 3 && ok; ++j) {
        const QSqrt3& hv = h.R(i, j);
        if (hv.sign() != X[i][j].sign()) {
          ok = false;
        } else if (!hv.is_zero()) {
          BigQSqrt3 bh(hv);
          ok = bh * bh * n2[i] * n2[j] == X[i][j] * X[i][j];
        }
      }
    if (ok) return true;
  }
  return false;
}

// The frame rows as big vectors with their squared lengths; false when a length is irrational.
bool big_frame(const std::array<Vec3, 3>& r, std::array<BigVec3, 3>* rows, std::array<BigQSqrt3, 3>* n2) {
  for (int i = 0; i < 3; ++i) {
    (*rows)[i] = big(r[i]);
    (*n2)[i] = big_dot((*rows)[i], (*rows)[i]);
    if (!(*n2)[i].is_rational()) return false;
  }
  return true;
}

} // namespace

bool frame_carries(const std::array<Vec3, 3>& r, const PointGroup& g, const PointGroup& target) {
  if (g.order() != target.order()) return false;
  std::array<BigVec3, 3> rows;
  std::array<BigQSqrt3, 3> n2;
  if (!big_frame(r, &rows, &n2)) return false;
  for (const auto& op : g.generators())
    if (!maps_into(rows, n2, op, target)) return false;
  return true;
}

Identification identify(const PointGroup& group, const GroupCatalogue& catalogue) {
  Identification id;
  const CrystalClass* family = catalogue.crystallographic_type_of(group);
  if (!family) fail(ErrorKind::bad_group, "the operations do not form a crystallographic point group");
  MagneticKind kind = MagneticKind::colourless;
  std::string unitary = family->name;
  if (group.is_grey()) {
    kind = MagneticKind::grey;
  } else if (group.is_magnetic()) {
    kind = MagneticKind::black_white;
    PointGroup H = group.unitary_part();
    if (2 * H.order() != group.order())
      fail(ErrorKind::bad_group, "the unprimed operations are not an index-2 subgroup");
    const CrystalClass* ht = catalogue.crystallographic_type_of(H);
    if (!ht) fail(ErrorKind::bad_group, "the unprimed operations do not form a crystallographic point group");
    unitary = ht->name;
  }
  for (const auto* t : catalogue.types())
    if (t->family == family->name && t->kind == kind && t->unitary_type == unitary) id.type = t;
  if (!id.type) fail(ErrorKind::bad_group, "no magnetic point-group type matches these operations");
  for (const auto& g : catalogue.groups())
    if (g.group.order() == group.order() && g.group.lattice() == group.lattice() && g.group == group) {
      id.same_setting = &g;
      break;
    }
  const PointGroup& standard = id.type->group;
  std::vector<Operation> gens = group.generators();
  const std::array<Vec3, 3> unit{Vec3{QSqrt3(1), QSqrt3(0), QSqrt3(0)}, Vec3{QSqrt3(0), QSqrt3(1), QSqrt3(0)},
                                 Vec3{QSqrt3(0), QSqrt3(0), QSqrt3(1)}};
  if (frame_carries(unit, group, standard)) {
    id.standard_axes = unit; // already in the standard setting
    return id;
  }
  std::vector<Vec3> lines = candidate_lines(group);
  for (const auto& zl : lines)
    for (int zs : {1, -1}) {
      Vec3 z = zs > 0 ? zl : -zl;
      for (const auto& xl : lines)
        for (int xs : {1, -1}) {
          Vec3 x = xs > 0 ? xl : -xl;
          if (!dot(x, z).is_zero()) continue;
          Vec3 y = cross(z, x);
          if (!rational_length(y)) continue;
          std::array<Vec3, 3> r{x, y, z};
          std::array<BigVec3, 3> rows;
          std::array<BigQSqrt3, 3> n2;
          if (!big_frame(r, &rows, &n2)) continue;
          if (std::all_of(gens.begin(), gens.end(), [&](const Operation& g) { return maps_into(rows, n2, g, standard); })) {
            id.standard_axes = r;
            return id;
          }
        }
    }
  fail(ErrorKind::internal, "found the type " + id.type->symbol + " but no rotation to its standard setting");
}

std::string elements_in_words(const PointGroup& g, LatticeKind lattice, std::size_t max_items) {
  const bool grey = g.is_grey();
  std::vector<std::string> words;
  for (const auto& op : g.operations()) {
    if (grey && op.primed) continue;
    const OperationKind k = op.kind();
    if (k.order == 1 && k.proper) continue;   // 1 (and 1', implied by a grey type)
    if (k.sense < 0) continue;                // one entry per axis: n+ stands for n-
    std::string sym = op.symbol(lattice);     // "m' [110]", "4+ [001]", "-1"
    std::size_t space = sym.find(' ');
    std::string head = sym.substr(0, space), dir = space == std::string::npos ? "" : sym.substr(space + 1);
    const std::string prime = op.primed ? "'" : "";
    std::string word;
    if (!k.proper && k.order == 1) word = "inversion centre" + prime;
    else if (!k.proper && k.order == 2) word = "mirror" + prime + " ⊥ " + dir;
    else word = std::string(k.proper ? "" : "-") + std::to_string(k.order) + prime + " ∥ " + dir;
    if (std::find(words.begin(), words.end(), word) == words.end()) words.push_back(word);
  }
  if (words.empty()) return "no element but the identity";
  std::string out;
  for (std::size_t i = 0; i < words.size() && i < max_items; ++i) out += (i ? ", " : "") + words[i];
  if (words.size() > max_items) out += ", ... (" + std::to_string(words.size()) + " elements in all)";
  return out;
}

} // namespace ts
