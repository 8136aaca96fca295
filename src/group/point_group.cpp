#include "group/point_group.hpp"

#include <algorithm>
#include <cmath>
#include <mutex>
#include <set>

namespace ts {

namespace {
// Sorts by keys computed once per operation: kind() is exact matrix arithmetic,
// and calling it inside every comparison made sorting the largest start-up cost.
template <typename Less>
void stable_sort_by_kind(std::vector<Operation>& ops, Less less) {
  std::vector<OperationKind> kinds;
  kinds.reserve(ops.size());
  for (const auto& op : ops) kinds.push_back(op.kind());
  std::vector<std::size_t> order(ops.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return less(ops[a], kinds[a], ops[b], kinds[b]);
  });
  std::vector<Operation> sorted;
  sorted.reserve(ops.size());
  for (std::size_t i : order) sorted.push_back(std::move(ops[i]));
  ops = std::move(sorted);
}

void sort_canonical(std::vector<Operation>& ops) {
  stable_sort_by_kind(ops, [](const Operation& a, const OperationKind& ka, const Operation& b,
                              const OperationKind& kb) { return canonical_less(a.primed, ka, b.primed, kb); });
}

// A point operation of a crystal maps its lattice onto itself: its matrix in
// the lattice basis is integral (the trace test alone lets through a 2-fold
// about [210] of a square lattice, which preserves no lattice).
bool preserves_lattice(const Mat3& R, LatticeKind lattice) {
  Mat3 B = Mat3::identity(); // columns: lattice basis vectors in Cartesian components
  if (lattice == LatticeKind::hexagonal) {
    B(0, 1) = QSqrt3(Rational(-1, 2));
    B(1, 1) = QSqrt3(0, Rational(1, 2));
  }
  Mat3 W = B.inverse() * R * B;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      if (!W(i, j).is_rational() || !W(i, j).rational_part().is_integer()) return false;
  return true;
}
// The closure of operations taken from a known group: no checks and no sorting,
// since only its size and membership are asked for.
std::vector<Operation> closure_within_group(const std::vector<Operation>& gens) {
  std::vector<Operation> ops{Operation::identity()};
  for (std::size_t i = 0; i < ops.size(); ++i)
    for (const auto& gen : gens) {
      Operation p = ops[i] * gen;
      if (std::find(ops.begin(), ops.end(), p) == ops.end()) ops.push_back(p);
    }
  return ops;
}
} // namespace

PointGroup PointGroup::from_closed_set(std::vector<Operation> ops, LatticeKind lattice) {
  PointGroup g;
  sort_canonical(ops);
  g.ops_ = std::move(ops);
  g.lattice_ = lattice;
  return g;
}

struct PointGroup::Packed {
  PackedOperations codes;
  std::once_flag once;
  std::vector<Operation> ops, generators;

  void decode() {
    const std::vector<Mat3>& m = *codes.matrices;
    auto decoded = [&](const std::vector<std::uint16_t>& list) {
      std::vector<Operation> out;
      out.reserve(list.size());
      for (std::uint16_t c : list) out.push_back({m[c / 2], c % 2 == 1});
      return out;
    };
    ops = decoded(codes.operations);
    generators = decoded(codes.generators);
  }
};

const std::vector<Operation>& PointGroup::ops() const {
  if (!packed_) return ops_;
  std::call_once(packed_->once, [p = packed_.get()] { p->decode(); });
  return packed_->ops;
}

std::size_t PointGroup::order() const { return packed_ ? packed_->codes.operations.size() : ops_.size(); }

PointGroup PointGroup::from_packed(PackedOperations packed, LatticeKind lattice) {
  if (!packed.matrices || packed.operations.empty())
    fail(ErrorKind::internal, "a packed group needs its matrices and at least the identity");
  for (const auto* list : {&packed.operations, &packed.generators})
    for (std::uint16_t c : *list)
      if (c / 2 >= packed.matrices->size()) fail(ErrorKind::internal, "a packed operation code is out of range");
  PointGroup g{Unfilled{}};
  g.lattice_ = lattice;
  g.packed_ = std::make_shared<Packed>();
  g.packed_->codes = std::move(packed);
  return g;
}

void PointGroup::fill_caches() const {
  if (!packed_) generators();
}

PointGroup PointGroup::sorted_subset(std::vector<Operation> ops) const {
  PointGroup g;
  g.ops_ = std::move(ops);
  g.lattice_ = lattice_;
  return g;
}

PointGroup PointGroup::generate(const std::vector<Operation>& generators, LatticeKind lattice,
                                std::size_t max_order, const std::string& where) {
  for (const auto& gen : generators) {
    if (!gen.R.is_orthogonal())
      fail(ErrorKind::bad_group, "generator " + gen.R.str() + " is not an orthogonal matrix", where,
           "orthogonal 3x3 matrices (rotations, reflections, rotoinversions)");
    try {
      (void)gen.kind();
    } catch (const Error& e) {
      fail(ErrorKind::bad_group, e.problem(), where, e.valid());
    }

  }
  std::vector<Operation> ops{Operation::identity()};
  for (std::size_t i = 0; i < ops.size(); ++i) {
    for (const auto& gen : generators) {
      Operation p = ops[i] * gen;
      if (std::find(ops.begin(), ops.end(), p) != ops.end()) continue;
      try {
        (void)p.kind();
      } catch (const Error&) {
        fail(ErrorKind::bad_group,
             "the generators produce " + p.R.str() + ", which is not a crystallographic operation", where,
             "generators of one of the 32 crystallographic point groups (or their magnetic versions)");
      }
      ops.push_back(p);
      if (ops.size() > max_order)
        fail(ErrorKind::bad_group,
             "the generators do not close within " + std::to_string(max_order) + " operations", where,
             "generators of a crystallographic point group (order at most 48, 96 with time reversal)");
    }
  }
  return from_closed_set(std::move(ops), lattice);
}

void require_lattice_group(const PointGroup& g, const std::string& where) {
  for (const auto& op : g.operations())
    if (!preserves_lattice(op.R, g.lattice()))
      fail(ErrorKind::bad_group,
           "operation " + op.symbol(g.lattice()) + " maps no lattice of these axes onto itself (its matrix in the " +
               (g.lattice() == LatticeKind::hexagonal ? std::string("hexagonal") : std::string("orthogonal")) +
               " lattice basis is not integral)",
           where,
           "operations of a crystal's point group: 2 along [100], [110], ... (orthogonal axes); 3 and 6 along [001] "
           "with hexagonal axes");
}

bool PointGroup::contains(const Operation& g) const { return index_of(g) >= 0; }

int PointGroup::index_of(const Operation& g) const {
  const std::vector<Operation>& all = ops();
  for (std::size_t i = 0; i < all.size(); ++i)
    if (all[i] == g) return static_cast<int>(i);
  return -1;
}

bool PointGroup::is_magnetic() const {
  return std::any_of(ops().begin(), ops().end(), [](const Operation& o) { return o.primed; });
}
bool PointGroup::is_grey() const { return contains(Operation::time_reversal()); }

PointGroup PointGroup::unitary_part() const {
  std::vector<Operation> u;
  for (const auto& o : ops())
    if (!o.primed) u.push_back(o);
  return sorted_subset(std::move(u));
}

PointGroup PointGroup::underlying_group() const {
  std::vector<Operation> u;
  for (auto o : ops()) {
    o.primed = false;
    if (std::find(u.begin(), u.end(), o) == u.end()) u.push_back(o);
  }
  return from_closed_set(std::move(u), lattice_);
}

PointGroup PointGroup::with_time_reversal() const {
  if (is_grey()) return *this;
  std::vector<Operation> u = underlying_group().ops();
  std::size_t n = u.size();
  for (std::size_t i = 0; i < n; ++i) u.push_back({u[i].R, true});
  return from_closed_set(std::move(u), lattice_);
}

std::vector<Operation> PointGroup::generators() const {
  if (packed_) {
    ops();
    return packed_->generators;
  }
  if (!generators_cache_.empty() || ops().size() == 1) return generators_cache_;
  // Greedy: add the first operation (in canonical order, highest order first)
  // not yet generated, until the closure is the whole group.
  std::vector<Operation> by_order = ops();
  stable_sort_by_kind(by_order, [](const Operation& a, const OperationKind& ka, const Operation& b,
                                   const OperationKind& kb) {
    if (a.primed != b.primed) return !a.primed;
    return ka.order > kb.order;
  });
  std::vector<Operation> gens;
  std::vector<Operation> span{Operation::identity()};
  for (const auto& cand : by_order) {
    if (std::find(span.begin(), span.end(), cand) != span.end()) continue;
    gens.push_back(cand);
    span = closure_within_group(gens);
    if (span.size() == ops().size()) break;
  }
  generators_cache_ = gens;
  return gens;
}

std::vector<int> multiplication_table(const PointGroup& g) {
  // Products are located by their floating-point image and confirmed exactly,
  // so the table is exact while the search stays cheap.
  const auto& ops = g.operations();
  const std::size_t n = ops.size();
  std::vector<std::array<double, 10>> keys(n);
  for (std::size_t i = 0; i < n; ++i) {
    for (int r = 0; r < 3; ++r)
      for (int c = 0; c < 3; ++c) keys[i][r * 3 + c] = ops[i].R(r, c).to_double();
    keys[i][9] = ops[i].primed ? 1.0 : 0.0;
  }
  std::vector<int> table(n * n, -1);
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = 0; j < n; ++j) {
      std::array<double, 10> p{};
      for (int r = 0; r < 3; ++r)
        for (int c = 0; c < 3; ++c) {
          double s = 0;
          for (int k = 0; k < 3; ++k) s += keys[i][r * 3 + k] * keys[j][k * 3 + c];
          p[r * 3 + c] = s;
        }
      p[9] = (keys[i][9] != keys[j][9]) ? 1.0 : 0.0;
      for (std::size_t k = 0; k < n; ++k) {
        double dist = 0;
        for (int t = 0; t < 10; ++t) dist += std::fabs(p[t] - keys[k][t]);
        if (dist < 1e-6) {
          table[i * n + j] = static_cast<int>(k);
          break;
        }
      }
      if (table[i * n + j] < 0 || ops[table[i * n + j]] != ops[i] * ops[j])
        fail(ErrorKind::internal, "operation set is not closed under multiplication");
    }
  return table;
}

std::vector<PointGroup> PointGroup::subgroups() const {
  const std::size_t n = ops().size();
  std::vector<int> table = multiplication_table(*this);
  // A subset of the operations as a bit mask (at most 96 operations); as a number,
  // its order is that of the mask read from the last operation to the first.
  __extension__ typedef unsigned __int128 Set;
  auto bit = [](int i) { return Set(1) << i; };
  auto count = [](Set s) {
    return __builtin_popcountll(static_cast<std::uint64_t>(s)) + __builtin_popcountll(static_cast<std::uint64_t>(s >> 64));
  };
  // The subgroup generated by a few operations: the identity (ops_[0] in canonical
  // order) multiplied on the right by the generators until nothing new appears,
  // so each closure costs (its order) x (number of generators) table look-ups.
  auto closure = [&](const std::vector<int>& gens) {
    Set s = bit(0);
    std::vector<int> members{0};
    for (std::size_t a = 0; a < members.size(); ++a)
      for (int g : gens) {
        int p = table[members[a] * n + g];
        if (!((s >> p) & 1)) {
          s |= bit(p);
          members.push_back(p);
        }
      }
    return s;
  };
  struct Found {
    Set members;
    std::vector<int> gens;
  };
  std::vector<Found> all;
  std::set<Set> seen, joined;
  std::vector<std::pair<Set, int>> cyclic; // each cyclic subgroup once, with a generator
  for (std::size_t i = 0; i < n; ++i) {
    Set c = closure({static_cast<int>(i)});
    if (seen.insert(c).second) {
      cyclic.emplace_back(c, static_cast<int>(i));
      all.push_back({c, {static_cast<int>(i)}});
    }
  }
  // Every subgroup is generated by cyclic subgroups: join them one at a time.
  for (std::size_t i = 0; i < all.size(); ++i)
    for (const auto& [c, g] : cyclic) {
      Set u = all[i].members | c;
      if (u == all[i].members || !joined.insert(u).second) continue;
      std::vector<int> gens = all[i].gens;
      gens.push_back(g);
      Set s = closure(gens);
      if (seen.insert(s).second) all.push_back({s, std::move(gens)});
    }
  std::sort(all.begin(), all.end(), [&](const Found& a, const Found& b) {
    int ca = count(a.members), cb = count(b.members);
    if (ca != cb) return ca > cb;
    return a.members > b.members;
  });
  std::vector<PointGroup> result;
  const std::vector<Operation>& mine = ops();
  for (const auto& f : all) {
    std::vector<Operation> subset;
    for (std::size_t i = 0; i < n; ++i)
      if ((f.members >> i) & 1) subset.push_back(mine[i]);
    result.push_back(sorted_subset(std::move(subset)));
  }
  return result;
}

bool PointGroup::is_subgroup_of(const PointGroup& other) const {
  return std::all_of(ops().begin(), ops().end(), [&](const Operation& o) { return other.contains(o); });
}

std::vector<Operation> PointGroup::coset_representatives(const PointGroup& H) const {
  if (!H.is_subgroup_of(*this)) fail(ErrorKind::internal, "coset of a group that is not a subgroup");
  std::vector<Operation> reps;
  const std::vector<Operation>& mine = ops();
  std::vector<bool> covered(mine.size(), false);
  for (std::size_t i = 0; i < mine.size(); ++i) {
    if (covered[i]) continue;
    reps.push_back(mine[i]);
    for (const auto& h : H.ops()) covered[index_of(mine[i] * h)] = true;
  }
  return reps;
}

PointGroup PointGroup::conjugated(const Mat3& Q) const {
  Mat3 Qi = Q.transpose();
  std::vector<Operation> turned;
  for (const auto& o : ops()) turned.push_back({Q * o.R * Qi, o.primed});
  return from_closed_set(std::move(turned), lattice_);
}

PointGroup PointGroup::intersection(const PointGroup& other) const {
  std::vector<Operation> common;
  for (const auto& o : ops())
    if (other.contains(o)) common.push_back(o);
  return sorted_subset(std::move(common));
}

} // namespace ts
