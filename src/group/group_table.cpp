// The derived catalogue as a compact text table (group_table.hpp): one record per
// line, fields separated by tabs. Operations are numbered once (a matrix index
// times two, plus one when primed), so each group is a short list of numbers.
#include "group/group_catalogue.hpp"
#include "group/group_table.hpp"

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

class TableWriter {
public:
  TableWriter& field(const std::string& s) {
    if (s.find_first_of("\t\n") != std::string::npos)
      fail(ErrorKind::internal, "a group-table field holds a tab or a line break: '" + s + "'");
    if (!first_) out_ += '\t';
    out_ += s;
    first_ = false;
    return *this;
  }
  TableWriter& field(long long v) { return field(std::to_string(v)); }
  void end() {
    out_ += '\n';
    first_ = true;
  }
  const std::string& text() const { return out_; }

private:
  std::string out_;
  bool first_ = true;
};

class TableReader {
public:
  explicit TableReader(std::string_view text) : text_(text) {}
  // The next record, which must carry `tag` (its first field); the tag is dropped.
  // With `fields` >= 0, the record must have that many fields after the tag.
  std::vector<std::string_view> record(const char* tag, int fields = -1) {
    std::vector<std::string_view> f = next();
    if (f.empty() || f[0] != tag) fail(ErrorKind::internal, std::string("group table: expected a '") + tag + "' record");
    f.erase(f.begin());
    if (fields >= 0 && f.size() != static_cast<std::size_t>(fields))
      fail(ErrorKind::internal, std::string("group table: malformed '") + tag + "' record");
    return f;
  }
  bool next_is(const char* tag) const {
    std::string_view rest = text_.substr(pos_);
    std::string_view t(tag);
    return rest.size() > t.size() && rest.compare(0, t.size(), t) == 0 &&
           (rest[t.size()] == '\t' || rest[t.size()] == '\n');
  }

private:
  std::vector<std::string_view> next() {
    std::vector<std::string_view> f;
    std::size_t eol = text_.find('\n', pos_);
    if (eol == std::string_view::npos) return f;
    std::string_view line = text_.substr(pos_, eol - pos_);
    pos_ = eol + 1;
    for (std::size_t start = 0;;) {
      std::size_t tab = line.find('\t', start);
      f.push_back(line.substr(start, tab == std::string_view::npos ? std::string_view::npos : tab - start));
      if (tab == std::string_view::npos) break;
      start = tab + 1;
    }
    return f;
  }
  std::string_view text_;
  std::size_t pos_ = 0;
};

long long number(std::string_view s) {
  long long v = 0;
  bool negative = !s.empty() && s[0] == '-';
  std::size_t i = negative ? 1 : 0;
  if (i == s.size()) fail(ErrorKind::internal, "group table: an empty number");
  for (; i < s.size(); ++i) {
    if (s[i] < '0' || s[i] > '9') fail(ErrorKind::internal, "group table: '" + std::string(s) + "' is not a number");
    v = v * 10 + (s[i] - '0');
  }
  return negative ? -v : v;
}

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

void write_operations(TableWriter& w, OperationCodes& codes, const char* tag, const std::vector<Operation>& ops) {
  w.field(tag);
  for (const auto& op : ops) w.field(codes.code(op));
  w.end();
}

void write_group(TableWriter& w, OperationCodes& codes, const PointGroup& g) {
  w.field("lattice").field(g.lattice() == LatticeKind::hexagonal ? "hexagonal" : "orthogonal");
  w.end();
  write_operations(w, codes, "operations", g.operations());
  write_operations(w, codes, "generators", g.generators());
}

Operation operation_of(std::string_view code, const std::vector<Mat3>& matrices) {
  long long c = number(code);
  if (c < 0 || static_cast<std::size_t>(c / 2) >= matrices.size())
    fail(ErrorKind::internal, "group table: operation code out of range");
  return {matrices[static_cast<std::size_t>(c / 2)], c % 2 == 1};
}

std::vector<Operation> read_operations(TableReader& r, const char* tag, const std::vector<Mat3>& matrices) {
  std::vector<Operation> ops;
  for (auto f : r.record(tag)) ops.push_back(operation_of(f, matrices));
  return ops;
}

PointGroup read_group(TableReader& r, const std::vector<Mat3>& matrices) {
  auto l = r.record("lattice", 1);
  LatticeKind lattice = l[0] == "hexagonal" ? LatticeKind::hexagonal : LatticeKind::orthogonal;
  std::vector<Operation> ops = read_operations(r, "operations", matrices);
  std::vector<Operation> gens = read_operations(r, "generators", matrices);
  return PointGroup::from_canonical(std::move(ops), lattice, std::move(gens));
}

void write_strings(TableWriter& w, const char* tag, const std::vector<std::string>& items) {
  w.field(tag);
  for (const auto& s : items) w.field(s);
  w.end();
}

std::vector<std::string> read_strings(TableReader& r, const char* tag) {
  std::vector<std::string> out;
  for (auto f : r.record(tag)) out.emplace_back(f);
  return out;
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
  TableWriter body;
  for (const auto& c : classes_) {
    auto [file, line] = split_source(c.source);
    body.field("class").field(c.name).field(c.full).field(c.schoenflies).field(c.system).field(c.laue).field(c.type);
    body.field(c.setting).field(file).field(line).field(c.standard).field(c.centrosymmetric).field(c.polar);
    body.field(c.lattice == LatticeKind::hexagonal ? "hexagonal" : "orthogonal");
    body.end();
    write_strings(body, "aliases", c.aliases);
    write_strings(body, "magnetic_names", c.magnetic_names);
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
  TableWriter head;
  char hex[17];
  std::snprintf(hex, sizeof hex, "%016llx", static_cast<unsigned long long>(fingerprint));
  head.field(kTableTag).field(kTableVersion).field(hex);
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
  TableReader r(text);
  auto f = r.record(kTableTag);
  if (f.size() != 2 || f[0] != kTableVersion) return 0;
  std::uint64_t v = 0;
  for (char ch : f[1]) {
    int d = ch >= '0' && ch <= '9' ? ch - '0' : ch >= 'a' && ch <= 'f' ? ch - 'a' + 10 : -1;
    if (d < 0) return 0;
    v = v * 16 + static_cast<std::uint64_t>(d);
  }
  return v;
}

std::unique_ptr<GroupCatalogue> GroupCatalogue::from_table(std::string_view text, const std::string& data_dir) {
  auto cat = std::make_unique<GroupCatalogue>();
  TableReader r(text);
  auto head = r.record(kTableTag);
  if (head.size() != 2 || head[0] != kTableVersion) fail(ErrorKind::internal, "group table of another version");
  std::vector<Mat3> matrices;
  while (r.next_is("matrix")) {
    auto f = r.record("matrix", 36);
    Mat3 m;
    for (int k = 0; k < 9; ++k)
      m.m[k / 3][k % 3] = QSqrt3(Rational(number(f[4 * k]), number(f[4 * k + 1])),
                                 Rational(number(f[4 * k + 2]), number(f[4 * k + 3])));
    matrices.push_back(m);
  }
  const fs::path groups_dir = fs::path(data_dir) / "groups";
  while (r.next_is("class")) {
    auto f = r.record("class", 13);
    CrystalClass c;
    c.name = f[0];
    c.full = f[1];
    c.schoenflies = f[2];
    c.system = f[3];
    c.laue = f[4];
    c.type = f[5];
    c.setting = f[6];
    c.source = (groups_dir / std::string(f[7])).string() + ":" + std::string(f[8]);
    c.standard = f[9] == "1";
    c.centrosymmetric = f[10] == "1";
    c.polar = f[11] == "1";
    c.lattice = f[12] == "hexagonal" ? LatticeKind::hexagonal : LatticeKind::orthogonal;
    c.aliases = read_strings(r, "aliases");
    c.magnetic_names = read_strings(r, "magnetic_names");
    c.generators = read_operations(r, "setting_generators", matrices);
    auto sym = r.record("symbol");
    if (sym.size() % 2 != 0) fail(ErrorKind::internal, "group table: malformed 'symbol' record");
    for (std::size_t i = 0; i < sym.size(); i += 2)
      c.symbol.push_back({std::string(sym[i]), operation_of(sym[i + 1], matrices)});
    c.group = read_group(r, matrices);
    cat->classes_.push_back(std::move(c));
  }
  auto crystal = [&](std::string_view f) {
    long long i = number(f);
    if (i < 0 || static_cast<std::size_t>(i) >= cat->classes_.size())
      fail(ErrorKind::internal, "group table: class index out of range");
    return &cat->classes_[static_cast<std::size_t>(i)];
  };
  while (r.next_is("counts")) {
    auto f = r.record("counts", 11);
    std::array<int, 10> counts{};
    for (int k = 0; k < 10; ++k) counts[k] = static_cast<int>(number(f[k + 1]));
    cat->standard_counts_.emplace_back(counts, crystal(f[0]));
  }
  while (r.next_is("named")) {
    auto f = r.record("named", 9);
    NamedGroup g;
    g.symbol = f[0];
    g.type_symbol = f[1];
    g.family = f[2];
    g.unitary_type = f[3];
    g.schoenflies = f[4];
    g.kind = static_cast<MagneticKind>(number(f[5]));
    g.crystal = crystal(f[6]);
    g.is_type_standard = f[7] == "1";
    g.type_index = static_cast<int>(number(f[8]));
    g.group = read_group(r, matrices);
    cat->groups_.push_back(std::move(g));
  }
  while (r.next_is("key")) {
    auto f = r.record("key", 2);
    long long i = number(f[1]);
    if (i < 0 || static_cast<std::size_t>(i) >= cat->groups_.size())
      fail(ErrorKind::internal, "group table: group index out of range");
    cat->by_symbol_.emplace(std::string(f[0]), static_cast<std::size_t>(i));
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
  // FNV-1a (64 bit) over each file's name and bytes: a change of any data file,
  // or a file added or removed, gives another fingerprint.
  std::uint64_t h = 14695981039346656037ull;
  auto mix = [&](const std::string& bytes) {
    for (unsigned char ch : bytes) {
      h ^= ch;
      h *= 1099511628211ull;
    }
    h ^= 0xff; // separates the name from the content and one file from the next
    h *= 1099511628211ull;
  };
  for (const auto& f : files) {
    std::ifstream in(f, std::ios::binary);
    if (!in) return 0;
    mix(f.filename().string());
    mix(std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()));
  }
  return h;
}

} // namespace ts
