// The derived catalogue as a compact table in the record format of
// data/record_table.hpp. Operations are numbered once (a matrix index times two,
// plus one when primed), so each group is a short list of numbers.
#include "group/group_catalogue.hpp"
#include "group/group_table.hpp"
#include "data/record_table.hpp"

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <map>

namespace fs = std::filesystem;

namespace ts {

namespace {

constexpr const char* kTableTag = "tensorsieve-group-table";
constexpr const char* kTableVersion = "1";

// Numbers the distinct matrices in order of first use.
class OperationCodes {
public:
  long long code(const Operation& op) {
    for (std::size_t i = 0; i < matrices_.size(); ++i)
      if (matrices_[i] == op.R) return 2 * static_cast<long long>(i) + (op.primed ? 1 : 0);
    matrices_.push_back(op.R);
    return 2 * static_cast<long long>(matrices_.size() - 1) + (op.primed ? 1 : 0);
  }
  const std::vector<Mat3>& matrices() const { return matrices_; }

private:
  std::vector<Mat3> matrices_;
};

void write_operations(RecordWriter& w, OperationCodes& codes, const char* tag, const std::vector<Operation>& ops) {
  w.field(tag);
  for (const auto& op : ops) w.field(codes.code(op));
  w.end();
}

void write_group(RecordWriter& w, OperationCodes& codes, const PointGroup& g) {
  w.field("lattice").field(g.lattice() == LatticeKind::hexagonal ? "hexagonal" : "orthogonal");
  w.end();
  write_operations(w, codes, "operations", g.operations());
  write_operations(w, codes, "generators", g.generators());
}

Operation operation_of(const RecordReader& r, std::string_view code, const std::vector<Mat3>& matrices) {
  long long c = r.number(code);
  if (c < 0 || static_cast<std::size_t>(c / 2) >= matrices.size())
    fail(ErrorKind::internal, "group table: operation code out of range");
  return {matrices[static_cast<std::size_t>(c / 2)], c % 2 == 1};
}

std::vector<Operation> read_operations(RecordReader& r, const char* tag, const std::vector<Mat3>& matrices) {
  std::vector<Operation> ops;
  const auto fields = r.record(tag);
  ops.reserve(fields.size());
  for (auto f : fields) ops.push_back(operation_of(r, f, matrices));
  return ops;
}

std::vector<std::uint16_t> read_codes(RecordReader& r, const char* tag, std::size_t matrices) {
  const auto fields = r.record(tag);
  std::vector<std::uint16_t> codes;
  codes.reserve(fields.size());
  for (auto f : fields) {
    long long c = r.number(f);
    if (c < 0 || static_cast<std::size_t>(c / 2) >= matrices)
      fail(ErrorKind::internal, "group table: operation code out of range");
    codes.push_back(static_cast<std::uint16_t>(c));
  }
  return codes;
}

// Kept packed (point_group.hpp): most groups of the catalogue are never looked at.
PointGroup read_group(RecordReader& r, const std::shared_ptr<const std::vector<Mat3>>& matrices) {
  auto l = r.record("lattice", 1);
  LatticeKind lattice = l[0] == "hexagonal" ? LatticeKind::hexagonal : LatticeKind::orthogonal;
  PackedOperations packed;
  packed.matrices = matrices;
  packed.operations = read_codes(r, "operations", matrices->size());
  packed.generators = read_codes(r, "generators", matrices->size());
  return PointGroup::from_packed(std::move(packed), lattice);
}


// A class's source is "<dir>/groups/<file>:<line>"; the table keeps file and line,
// so the same data in another directory names its own files.
std::pair<std::string, std::string> split_source(const std::string& source) {
  std::size_t colon = source.rfind(':');
  if (colon == std::string::npos) fail(ErrorKind::internal, "group source '" + source + "' has no line number");
  return {fs::path(source.substr(0, colon)).filename().string(), source.substr(colon + 1)};
}

} // namespace

std::string GroupCatalogue::table_text(std::uint64_t fingerprint) const {
  // Matrices first, so the reader has them before any group: derive the codes in
  // a first pass over the body, then write the matrices and the body.
  OperationCodes codes;
  RecordWriter body("group table");
  for (const auto& c : classes_) {
    auto [file, line] = split_source(c.source);
    body.field("class").field(c.name).field(c.full).field(c.schoenflies).field(c.system).field(c.laue).field(c.type);
    body.field(c.setting).field(file).field(line).field(c.standard).field(c.centrosymmetric).field(c.polar);
    body.field(c.lattice == LatticeKind::hexagonal ? "hexagonal" : "orthogonal");
    body.end();
    body.list("aliases", c.aliases);
    body.list("magnetic_names", c.magnetic_names);
    write_operations(body, codes, "setting_generators", c.generators);
    body.field("symbol");
    for (const auto& tok : c.symbol) body.field(tok.text).field(codes.code(tok.op));
    body.end();
    write_group(body, codes, c.group);
  }
  auto class_index = [&](const CrystalClass* c) { return static_cast<long long>(c - classes_.data()); };
  for (const auto& [counts, c] : standard_counts_) {
    body.field("counts").field(class_index(c));
    for (int n : counts) body.field(n);
    body.end();
  }
  for (const auto& g : groups_) {
    body.field("named").field(g.symbol).field(g.type_symbol).field(g.family).field(g.unitary_type);
    body.field(g.schoenflies).field(static_cast<long long>(g.kind)).field(class_index(g.crystal));
    body.field(g.is_type_standard).field(g.type_index);
    body.end();
    write_group(body, codes, g.group);
  }
  for (const auto& [key, index] : by_symbol_) {
    body.field("key").field(key).field(static_cast<long long>(index));
    body.end();
  }
  RecordWriter head("group table");
  head.field(kTableTag).field(kTableVersion).field(fingerprint_hex(fingerprint));
  head.end();
  for (const auto& m : codes.matrices()) {
    head.field("matrix");
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) {
        const QSqrt3& x = m(i, j);
        head.field(x.rational_part().num()).field(x.rational_part().den());
        head.field(x.sqrt3_part().num()).field(x.sqrt3_part().den());
      }
    head.end();
  }
  return head.text() + body.text() + "end\n";
}

std::uint64_t group_table_fingerprint(std::string_view text) {
  RecordReader r(text, "group table");
  auto f = r.record(kTableTag);
  if (f.size() != 2 || f[0] != kTableVersion) return 0;
  return fingerprint_from_hex(f[1]);
}

std::unique_ptr<GroupCatalogue> GroupCatalogue::from_table(std::string_view text, const std::string& data_dir) {
  auto cat = std::make_unique<GroupCatalogue>();
  RecordReader r(text, "group table");
  auto head = r.record(kTableTag);
  if (head.size() != 2 || head[0] != kTableVersion) fail(ErrorKind::internal, "group table of another version");
  std::vector<Mat3> matrices;
  while (r.next_is("matrix")) {
    auto f = r.record("matrix", 36);
    Mat3 m;
    for (int k = 0; k < 9; ++k)
      m.m[k / 3][k % 3] = QSqrt3(Rational(r.number(f[4 * k]), r.number(f[4 * k + 1])),
                                 Rational(r.number(f[4 * k + 2]), r.number(f[4 * k + 3])));
    matrices.push_back(m);
  }
  const auto shared = std::make_shared<const std::vector<Mat3>>(matrices);
  const fs::path groups_dir = fs::path(data_dir) / "groups";
  while (r.next_is("class")) {
    auto f = r.record("class", 13);
    CrystalClass c;
    c.name = unescaped(f[0]);
    c.full = unescaped(f[1]);
    c.schoenflies = unescaped(f[2]);
    c.system = unescaped(f[3]);
    c.laue = unescaped(f[4]);
    c.type = unescaped(f[5]);
    c.setting = unescaped(f[6]);
    c.source = (groups_dir / unescaped(f[7])).string() + ":" + std::string(f[8]);
    c.standard = f[9] == "1";
    c.centrosymmetric = f[10] == "1";
    c.polar = f[11] == "1";
    c.lattice = f[12] == "hexagonal" ? LatticeKind::hexagonal : LatticeKind::orthogonal;
    c.aliases = r.list("aliases");
    c.magnetic_names = r.list("magnetic_names");
    c.generators = read_operations(r, "setting_generators", matrices);
    auto sym = r.record("symbol");
    if (sym.size() % 2 != 0) fail(ErrorKind::internal, "group table: malformed 'symbol' record");
    for (std::size_t i = 0; i < sym.size(); i += 2)
      c.symbol.push_back({unescaped(sym[i]), operation_of(r, sym[i + 1], matrices)});
    c.group = read_group(r, shared);
    cat->classes_.push_back(std::move(c));
  }
  auto crystal = [&](std::string_view f) {
    long long i = r.number(f);
    if (i < 0 || static_cast<std::size_t>(i) >= cat->classes_.size())
      fail(ErrorKind::internal, "group table: class index out of range");
    return &cat->classes_[static_cast<std::size_t>(i)];
  };
  while (r.next_is("counts")) {
    auto f = r.record("counts", 11);
    std::array<int, 10> counts{};
    for (int k = 0; k < 10; ++k) counts[k] = static_cast<int>(r.number(f[k + 1]));
    cat->standard_counts_.emplace_back(counts, crystal(f[0]));
  }
  while (r.next_is("named")) {
    auto f = r.record("named", 9);
    NamedGroup g;
    g.symbol = unescaped(f[0]);
    g.type_symbol = unescaped(f[1]);
    g.family = unescaped(f[2]);
    g.unitary_type = unescaped(f[3]);
    g.schoenflies = unescaped(f[4]);
    g.kind = static_cast<MagneticKind>(r.number(f[5]));
    g.crystal = crystal(f[6]);
    g.is_type_standard = f[7] == "1";
    g.type_index = static_cast<int>(r.number(f[8]));
    g.group = read_group(r, shared);
    cat->groups_.push_back(std::move(g));
  }
  while (r.next_is("key")) {
    auto f = r.record("key", 2);
    long long i = r.number(f[1]);
    if (i < 0 || static_cast<std::size_t>(i) >= cat->groups_.size())
      fail(ErrorKind::internal, "group table: group index out of range");
    cat->by_symbol_.emplace(unescaped(f[0]), static_cast<std::size_t>(i));
  }
  r.record("end");
  return cat;
}

std::uint64_t group_data_fingerprint(const std::string& data_dir) {
  std::vector<fs::path> files;
  std::error_code ec;
  for (const auto& e : fs::directory_iterator(fs::path(data_dir) / "groups", ec))
    if (e.path().extension() == ".toml") files.push_back(e.path());
  if (ec || files.empty()) return 0;
  std::sort(files.begin(), files.end());
  std::vector<std::string> paths;
  for (const auto& f : files) paths.push_back(f.string());
  return files_fingerprint(paths);
}

} // namespace ts
