#include "group/point_group.hpp"

#include <algorithm>
#include <bitset>
#include <cmath>
#include <set>

namespace ts {

namespace {
void sort_canonical(std::vector<Operation>& ops) {
  std::stable_sort(ops.begin(), ops.end(), canonical_less);
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
} // namespace

PointGroup PointGroup::from_closed_set(std::vector<Operation> ops, LatticeKind lattice) {
  PointGroup g;
  sort_canonical(ops);
  g.ops_ = std::move(ops);
  g.lattice_ = lattice;
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
  for (std::size_t i = 0; i < ops_.size(); ++i)
    if (ops_[i] == g) return static_cast<int>(i);
  return -1;
}

bool PointGroup::is_magnetic() const {
  return std::any_of(ops_.begin(), ops_.end(), [](const Operation& o) { return o.primed; });
}
bool PointGroup::is_grey() const { return contains(Operation::time_reversal()); }

PointGroup PointGroup::unitary_part() const {
  std::vector<Operation> u;
  for (const auto& o : ops_)
    if (!o.primed) u.push_back(o);
  return from_closed_set(std::move(u), lattice_);
}

PointGroup PointGroup::underlying_group() const {
  std::vector<Operation> u;
  for (auto o : ops_) {
    o.primed = false;
    if (std::find(u.begin(), u.end(), o) == u.end()) u.push_back(o);
  }
  return from_closed_set(std::move(u), lattice_);
}

PointGroup PointGroup::with_time_reversal() const {
  if (is_grey()) return *this;
  std::vector<Operation> u = underlying_group().ops_;
  std::size_t n = u.size();
  for (std::size_t i = 0; i < n; ++i) u.push_back({u[i].R, true});
  return from_closed_set(std::move(u), lattice_);
}

std::vector<Operation> PointGroup::generators() const {
  if (!generators_cache_.empty() || ops_.size() == 1) return generators_cache_;
  // Greedy: add the first operation (in canonical order, highest order first)
  // not yet generated, until the closure is the whole group.
  std::vector<Operation> by_order = ops_;
  std::stable_sort(by_order.begin(), by_order.end(), [](const Operation& a, const Operation& b) {
    OperationKind ka = a.kind(), kb = b.kind();
    if (a.primed != b.primed) return !a.primed;
    return ka.order > kb.order;
  });
  std::vector<Operation> gens;
  std::vector<Operation> span{Operation::identity()};
  for (const auto& cand : by_order) {
    if (std::find(span.begin(), span.end(), cand) != span.end()) continue;
    gens.push_back(cand);
    span = generate(gens, lattice_, 96).ops_;
    if (span.size() == ops_.size()) break;
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
  const std::size_t n = ops_.size();
  std::vector<int> table = multiplication_table(*this);
  using Set = std::bitset<128>;
  auto close = [&](Set s) {
    std::vector<int> members;
    for (std::size_t i = 0; i < n; ++i)
      if (s[i]) members.push_back(static_cast<int>(i));
    for (std::size_t a = 0; a < members.size(); ++a)
      for (std::size_t b = 0; b < members.size(); ++b) {
        int p = table[members[a] * n + members[b]];
        if (!s[p]) {
          s[p] = true;
          members.push_back(p);
        }
      }
    return s;
  };
  std::vector<Set> cyclic;
  for (std::size_t i = 0; i < n; ++i) {
    Set s;
    s[0] = true; // identity is ops_[0] in canonical order
    s[i] = true;
    cyclic.push_back(close(s));
  }
  std::set<std::string> seen;
  std::vector<Set> all;
  auto add = [&](const Set& s) {
    std::string k = s.to_string();
    if (seen.insert(k).second) all.push_back(s);
  };
  for (const auto& c : cyclic) add(c);
  for (std::size_t i = 0; i < all.size(); ++i)
    for (const auto& c : cyclic)
      if ((all[i] | c) != all[i]) add(close(all[i] | c));
  std::sort(all.begin(), all.end(), [](const Set& a, const Set& b) {
    if (a.count() != b.count()) return a.count() > b.count();
    return a.to_string() > b.to_string();
  });
  std::vector<PointGroup> result;
  for (const auto& s : all) {
    std::vector<Operation> ops;
    for (std::size_t i = 0; i < n; ++i)
      if (s[i]) ops.push_back(ops_[i]);
    result.push_back(from_closed_set(std::move(ops), lattice_));
  }
  return result;
}

bool PointGroup::is_subgroup_of(const PointGroup& other) const {
  return std::all_of(ops_.begin(), ops_.end(), [&](const Operation& o) { return other.contains(o); });
}

std::vector<Operation> PointGroup::coset_representatives(const PointGroup& H) const {
  if (!H.is_subgroup_of(*this)) fail(ErrorKind::internal, "coset of a group that is not a subgroup");
  std::vector<Operation> reps;
  std::vector<bool> covered(ops_.size(), false);
  for (std::size_t i = 0; i < ops_.size(); ++i) {
    if (covered[i]) continue;
    reps.push_back(ops_[i]);
    for (const auto& h : H.ops_) covered[index_of(ops_[i] * h)] = true;
  }
  return reps;
}

PointGroup PointGroup::conjugated(const Mat3& Q) const {
  Mat3 Qi = Q.transpose();
  std::vector<Operation> ops;
  for (const auto& o : ops_) ops.push_back({Q * o.R * Qi, o.primed});
  return from_closed_set(std::move(ops), lattice_);
}

PointGroup PointGroup::intersection(const PointGroup& other) const {
  std::vector<Operation> ops;
  for (const auto& o : ops_)
    if (other.contains(o)) ops.push_back(o);
  return from_closed_set(std::move(ops), lattice_);
}

} // namespace ts
