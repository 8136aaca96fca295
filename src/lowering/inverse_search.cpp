#include "lowering/inverse_search.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <bitset>
#include <memory>

namespace ts {

namespace {

using OpSet = std::bitset<128>; // 96, the order of m-3m1', is the largest magnetic point group

OpSet members(const PointGroup& parent, const PointGroup& h) {
  OpSet s;
  for (const auto& op : h.operations()) s[static_cast<std::size_t>(parent.index_of(op))] = true;
  return s;
}

bool inside(const OpSet& a, const OpSet& b) { return (a & ~b).none(); }

// Sign with which an operation acts on a vector of the given kind, beyond R itself.
int vector_sign(const Operation& op, QuantityKind k) {
  bool axial = k == QuantityKind::axial_odd || k == QuantityKind::axial_even;
  bool odd = k == QuantityKind::axial_odd || k == QuantityKind::polar_odd;
  return (axial && op.det() < 0 ? -1 : 1) * (odd && op.primed ? -1 : 1);
}

Vec3 combination(const std::array<Vec3, 3>& c, int a, int b, int d) {
  Vec3 v;
  for (int i = 0; i < 3; ++i) v[i] = c[0][i] * QSqrt3(a) + c[1][i] * QSqrt3(b) + c[2][i] * QSqrt3(d);
  return v;
}

// Coefficient sets for "generic" combinations of a fixed space; each candidate
// is checked exactly, so an unlucky choice only costs a retry.
constexpr int generic[][3] = {{1, 2, 5}, {3, 7, 11}, {1, -4, 9}};

std::optional<Producer> vector_producer(const PointGroup& parent, const PointGroup& h, QuantityKind k) {
  Mat3 sum;
  for (const auto& op : h.operations()) sum = sum + op.R.scaled(QSqrt3(vector_sign(op, k)));
  std::array<Vec3, 3> cols;
  for (int j = 0; j < 3; ++j) cols[j] = {sum(0, j), sum(1, j), sum(2, j)};
  std::vector<Vec3> nonzero;
  for (const auto& c : cols)
    if (!is_zero(c)) nonzero.push_back(c);
  if (nonzero.empty()) return std::nullopt;
  int dim = 1;
  Vec3 normal{};
  for (std::size_t a = 0; a < nonzero.size() && dim == 1; ++a)
    for (std::size_t b = a + 1; b < nonzero.size(); ++b)
      if (!is_zero(cross(nonzero[a], nonzero[b]))) {
        dim = 2;
        normal = cross(nonzero[a], nonzero[b]);
        break;
      }
  if (dim == 2 && !sum.det().is_zero()) dim = 3;
  std::vector<Vec3> candidates = nonzero;
  for (const auto& g : generic) candidates.push_back(combination(cols, g[0], g[1], g[2]));
  for (const auto& v : candidates) {
    if (is_zero(v)) continue;
    if (stabiliser(parent, {k, v, Mat3::identity()}) == h) {
      Producer p;
      p.kind = k;
      p.direction = v;
      p.free_dimensions = dim;
      p.plane_normal = normal;
      return p;
    }
  }
  return std::nullopt;
}

std::optional<Producer> strain_producer(const PointGroup& parent, const PointGroup& h) {
  // Invariant strains: the projections R E Rᵀ summed over h of the six basis strains.
  std::array<Mat3, 6> projected;
  const int pairs[6][2] = {{0, 0}, {1, 1}, {2, 2}, {1, 2}, {0, 2}, {0, 1}};
  for (int b = 0; b < 6; ++b) {
    Mat3 e;
    e(pairs[b][0], pairs[b][1]) = QSqrt3(1);
    e(pairs[b][1], pairs[b][0]) = QSqrt3(1);
    Mat3 s;
    for (const auto& op : h.operations()) s = s + op.R * e * op.R.transpose();
    projected[b] = s;
  }
  const int weights[][6] = {{1, 2, 5, 7, 11, 13}, {3, 17, 19, 23, 29, 31}};
  for (const auto& w : weights) {
    Mat3 e;
    for (int b = 0; b < 6; ++b) e = e + projected[b].scaled(QSqrt3(w[b]));
    if (stabiliser(parent, {QuantityKind::strain, {}, e}) == h) {
      Producer p;
      p.kind = QuantityKind::strain;
      p.strain = e;
      return p;
    }
  }
  return std::nullopt;
}

struct SubgroupCache {
  std::vector<std::pair<PointGroup, std::unique_ptr<std::vector<PointGroup>>>> entries;
};

} // namespace

const std::vector<PointGroup>& cached_subgroups(const PointGroup& g) {
  static SubgroupCache cache;
  for (const auto& [key, value] : cache.entries)
    if (key == g) return *value;
  auto subs = std::make_unique<std::vector<PointGroup>>(g.subgroups());
  cache.entries.emplace_back(g, std::move(subs));
  return *cache.entries.back().second;
}

std::vector<Producer> single_producers(const PointGroup& parent, const PointGroup& h) {
  std::vector<Producer> out;
  for (QuantityKind k : {QuantityKind::polar_even, QuantityKind::axial_odd, QuantityKind::polar_odd,
                         QuantityKind::axial_even})
    if (auto p = vector_producer(parent, h, k)) out.push_back(*p);
  if (auto p = strain_producer(parent, h)) out.push_back(*p);
  return out;
}

InverseResult find_minimal_breaking(const PointGroup& parent, const Observation& observation) {
  if (!observation.allowed_in) fail(ErrorKind::internal, "an observation without a predicate");
  InverseResult res;
  res.predicate_calls = 1;
  res.allowed_in_parent = observation.allowed_in(parent);
  if (res.allowed_in_parent) return res;
  if (parent.order() > 128) fail(ErrorKind::too_large, "the parent group has more than 128 operations");

  // Largest first: a group is maximal among the allowing ones exactly when it
  // allows the signal and lies in no allowing group found before it, because
  // every larger allowing group either was found or lies in one that was.
  std::vector<const PointGroup*> order;
  for (const auto& s : cached_subgroups(parent))
    if (s.order() < parent.order()) order.push_back(&s);
  std::stable_sort(order.begin(), order.end(),
                   [](const PointGroup* a, const PointGroup* b) { return a->order() > b->order(); });
  res.subgroups = order.size();
  std::vector<OpSet> found;
  for (const PointGroup* h : order) {
    OpSet s = members(parent, *h);
    if (std::any_of(found.begin(), found.end(), [&](const OpSet& f) { return inside(s, f); })) continue;
    ++res.predicate_calls;
    if (!observation.allowed_in(*h)) continue;
    found.push_back(s);
    MinimalBreaking m;
    m.group = *h;
    m.index = parent.order() / h->order();
    std::vector<Operation> reps = parent.coset_representatives(*h);
    m.variants = reps.size();
    std::vector<PointGroup> seen;
    for (const auto& g : reps) {
      std::vector<Operation> conj;
      for (const auto& op : h->operations()) conj.push_back(g * op * g.inverse());
      PointGroup c = PointGroup::from_closed_set(std::move(conj), parent.lattice());
      if (std::find(seen.begin(), seen.end(), c) == seen.end()) seen.push_back(std::move(c));
    }
    m.orientations = seen.size();
    m.producers = single_producers(parent, *h);
    if (observation.survives_equal_domains) m.cancels_with_equal_domains = !observation.survives_equal_domains(parent, *h);
    res.maximal.push_back(std::move(m));
  }
  return res;
}

} // namespace ts
