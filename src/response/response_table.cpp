// The response catalogue as a table in the record format of data/record_table.hpp:
// per response a "response" record and its lists, then each part with its tensor
// specs written out field by field, so reading needs no spec parser; the families
// close the table. Positions ("file:line:column") are kept relative to the
// catalogue file, so the same files elsewhere name their own path.
#include "response/response_catalogue.hpp"
#include "response/response_table.hpp"

#include "core/error.hpp"
#include "data/record_table.hpp"

#include <filesystem>

namespace ts {

namespace {

constexpr const char* kTableTag = "tensorsieve-response-table";
constexpr const char* kTableVersion = "2";
constexpr const char* kName = "response table";

std::string families_path(const std::string& catalogue_path) {
  return (std::filesystem::path(catalogue_path).parent_path() / "families.toml").string();
}

// "PATH:12:1" -> ":12:1"; a position in another file stays whole.
std::string position_suffix(const std::string& where, const std::string& path) {
  return where.rfind(path, 0) == 0 ? where.substr(path.size()) : where;
}

std::string position_at(std::string_view suffix, const std::string& path) {
  std::string s = unescaped(suffix);
  return s.empty() || s[0] == ':' ? path + s : s;
}


void write_ints(RecordWriter& w, const char* tag, const std::vector<int>& items) {
  w.field(tag);
  for (int v : items) w.field(v);
  w.end();
}

std::vector<int> read_ints(RecordReader& r, const char* tag) {
  std::vector<int> out;
  for (auto f : r.record(tag)) out.push_back(static_cast<int>(r.number(f)));
  return out;
}

void write_spec(RecordWriter& w, const char* tag, const TensorSpec& s) {
  w.field(tag).field(s.name).field(s.letters).field(s.rank).field(s.axial).field(s.time_odd).field(s.jahn);
  w.field(s.symmetries.size());
  w.end();
  for (const auto& p : s.symmetries) {
    w.field("permutation").field(p.sign);
    for (int i : p.perm) w.field(i);
    w.end();
  }
  w.list("symmetry_text", s.symmetry_text);
  write_ints(w, "onsager", s.onsager);
}

TensorSpec read_spec(RecordReader& r, const char* tag) {
  auto f = r.record(tag, 7);
  TensorSpec s;
  s.name = unescaped(f[0]);
  s.letters = unescaped(f[1]);
  s.rank = static_cast<int>(r.number(f[2]));
  s.axial = r.flag(f[3]);
  s.time_odd = r.flag(f[4]);
  s.jahn = unescaped(f[5]);
  const long long n = r.number(f[6]);
  for (long long k = 0; k < n; ++k) {
    auto p = r.record("permutation");
    if (p.empty()) fail(ErrorKind::internal, std::string(kName) + ": empty 'permutation' record");
    IndexPermutation perm;
    perm.sign = static_cast<int>(r.number(p[0]));
    for (std::size_t i = 1; i < p.size(); ++i) perm.perm.push_back(static_cast<int>(r.number(p[i])));
    s.symmetries.push_back(std::move(perm));
  }
  s.symmetry_text = r.list("symmetry_text");
  s.onsager = read_ints(r, "onsager");
  return s;
}

DriveKind drive_of(std::string_view name) {
  if (name == "current") return DriveKind::current;
  if (name == "field") return DriveKind::field;
  if (name.empty()) return DriveKind::none;
  fail(ErrorKind::internal, std::string(kName) + ": unknown drive kind '" + std::string(name) + "'");
}

} // namespace

std::string ResponseCatalogue::table_text(std::uint64_t fingerprint) const {
  RecordWriter w(kName);
  w.field(kTableTag).field(kTableVersion).field(fingerprint_hex(fingerprint));
  w.end();
  for (const auto& x : responses_) {
    w.field("response").field(x.id).field(x.name).field(x.relation).field(x.response).field(x.harmonic);
    w.field(x.time_reversal).field(x.onsager).field(x.source).field(x.status).field(position_suffix(x.where, path_));
    w.field(x.parts.size());
    w.end();
    w.list("aliases", x.aliases);
    w.list("drives", x.drives);
    for (const auto& p : x.parts) {
      w.field("part").field(p.label).field(p.spec_text).field(p.mechanism).field(p.harmonic);
      w.field(drive_kind_name(p.drive)).field(p.hall).field(p.excluded_text).field(position_suffix(p.where, path_));
      w.field(p.excluded.has_value()).field(p.summed).field(p.expansion_order);
      w.end();
      w.list("indices", p.indices);
      write_spec(w, "spec", p.spec);
      if (p.excluded) write_spec(w, "excluded_spec", *p.excluded);
    }
    w.field("expansion").field(x.expansion.has_value());
    if (x.expansion) {
      const ResponseExpansion& e = *x.expansion;
      w.field(e.field).field(drive_kind_name(e.drive)).field(e.harmonic).field(e.axial).field(e.order);
      w.field(position_suffix(e.where, path_)).field(e.terms.size());
    }
    w.end();
    if (x.expansion) {
      w.list("expansion_indices", x.expansion->indices);
      for (const auto& t : x.expansion->terms) {
        w.field("expansion_term").field(t.order).field(t.c_type).field(t.mechanism);
        w.end();
      }
    }
  }
  for (const auto& [name, ids] : families_) {
    w.field("family").field(name);
    for (const auto& id : ids) w.field(id);
    w.end();
  }
  w.field("end");
  w.end();
  return w.text();
}

std::unique_ptr<ResponseCatalogue> ResponseCatalogue::from_table(std::string_view table, const std::string& path) {
  RecordReader r(table, kName);
  auto head = r.record(kTableTag);
  if (head.size() != 2 || head[0] != kTableVersion) fail(ErrorKind::internal, "response table of another version");
  auto cat = std::make_unique<ResponseCatalogue>();
  cat->path_ = path;
  while (r.next_is("response")) {
    auto f = r.record("response", 11);
    Response x;
    x.id = unescaped(f[0]);
    x.name = unescaped(f[1]);
    x.relation = unescaped(f[2]);
    x.response = unescaped(f[3]);
    x.harmonic = unescaped(f[4]);
    x.time_reversal = unescaped(f[5]);
    x.onsager = unescaped(f[6]);
    x.source = unescaped(f[7]);
    x.status = unescaped(f[8]);
    x.where = position_at(f[9], path);
    const long long parts = r.number(f[10]);
    x.aliases = r.list("aliases");
    x.drives = r.list("drives");
    x.parts.reserve(static_cast<std::size_t>(parts));
    for (long long k = 0; k < parts; ++k) {
      auto g = r.record("part", 11);
      ResponsePart p;
      p.label = unescaped(g[0]);
      p.spec_text = unescaped(g[1]);
      p.mechanism = unescaped(g[2]);
      p.harmonic = static_cast<int>(r.number(g[3]));
      p.drive = drive_of(g[4]);
      p.hall = r.flag(g[5]);
      p.excluded_text = unescaped(g[6]);
      p.where = position_at(g[7], path);
      const bool excluded = r.flag(g[8]);
      p.summed = r.flag(g[9]);
      p.expansion_order = static_cast<int>(r.number(g[10]));
      p.indices = r.list("indices");
      p.spec = read_spec(r, "spec");
      if (excluded) p.excluded = read_spec(r, "excluded_spec");
      x.parts.push_back(std::move(p));
    }
    auto e = r.record("expansion");
    if (e.empty()) fail(ErrorKind::internal, "response table: an empty 'expansion' record");
    if (r.flag(e[0])) {
      if (e.size() != 8) fail(ErrorKind::internal, "response table: an 'expansion' record of another length");
      ResponseExpansion ex;
      ex.field = unescaped(e[1]);
      ex.drive = drive_of(e[2]);
      ex.harmonic = static_cast<int>(r.number(e[3]));
      ex.axial = r.flag(e[4]);
      ex.order = static_cast<int>(r.number(e[5]));
      ex.where = position_at(e[6], path);
      const long long terms = r.number(e[7]);
      ex.indices = r.list("expansion_indices");
      for (long long k = 0; k < terms; ++k) {
        auto t = r.record("expansion_term", 3);
        ex.terms.push_back({static_cast<int>(r.number(t[0])), r.flag(t[1]), unescaped(t[2])});
      }
      x.expansion = std::move(ex);
    }
    cat->responses_.push_back(std::move(x));
  }
  while (r.next_is("family")) {
    auto f = r.record("family");
    if (f.empty()) fail(ErrorKind::internal, "response table: a family without a name");
    std::vector<std::string>& ids = cat->families_[unescaped(f[0])];
    for (std::size_t i = 1; i < f.size(); ++i) ids.push_back(unescaped(f[i]));
  }
  r.record("end", 0);
  return cat;
}

std::uint64_t response_table_fingerprint(std::string_view table) {
  RecordReader r(table, kName);
  if (!r.next_is(kTableTag)) return 0;
  auto f = r.record(kTableTag);
  if (f.size() != 2 || f[0] != kTableVersion) return 0;
  return fingerprint_from_hex(f[1]);
}

std::uint64_t response_data_fingerprint(const std::string& catalogue_path) {
  std::vector<std::string> files{catalogue_path};
  std::error_code ec;
  if (std::filesystem::is_regular_file(families_path(catalogue_path), ec)) files.push_back(families_path(catalogue_path));
  return files_fingerprint(files);
}

} // namespace ts
