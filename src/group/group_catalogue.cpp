#include "group/group_catalogue.hpp"

#include "core/data_dir.hpp"
#include "core/text.hpp"
#include "data/toml_read.hpp"

#include <algorithm>
#include <filesystem>
#include <set>

namespace fs = std::filesystem;

namespace ts {

const char* magnetic_kind_name(MagneticKind k) {
  switch (k) {
  case MagneticKind::colourless: return "ordinary (colourless)";
  case MagneticKind::grey: return "grey";
  case MagneticKind::black_white: return "black-white";
  }
  return "";
}

std::array<int, 10> operation_kind_counts(const PointGroup& g) {
  std::array<int, 10> counts{};
  const PointGroup plain = g.underlying_group();
  for (const auto& op : plain.operations()) {
    OperationKind k = op.kind();
    static const int slot[7] = {0, 0, 1, 2, 3, -1, 4}; // by order 1, 2, 3, 4, 6
    counts[slot[k.order] + (k.proper ? 0 : 5)] += 1;
  }
  return counts;
}

std::string normalise_group_symbol(const std::string& s) {
  std::string out;
  for (std::size_t i = 0; i < s.size(); ++i) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    if (std::isspace(c) || c == '_') continue;
    // UTF-8 minus sign U+2212 and the primes U+2032, U+2019, U+02B9
    if (c == 0xE2 && i + 2 < s.size()) {
      unsigned char c1 = static_cast<unsigned char>(s[i + 1]), c2 = static_cast<unsigned char>(s[i + 2]);
      if (c1 == 0x88 && c2 == 0x92) { out += '-'; i += 2; continue; }
      if (c1 == 0x80 && (c2 == 0xB2 || c2 == 0x99)) { out += '\''; i += 2; continue; }
    }
    if (c == 0xCA && i + 1 < s.size() && static_cast<unsigned char>(s[i + 1]) == 0xB9) {
      out += '\'';
      ++i;
      continue;
    }
    out += static_cast<char>(c);
  }
  return out;
}

namespace {

int system_rank(const std::string& stem) {
  static const char* order[] = {"triclinic", "monoclinic", "orthorhombic", "tetragonal",
                                "trigonal",  "hexagonal",  "cubic"};
  for (int i = 0; i < 7; ++i)
    if (stem == order[i]) return i;
  return 7;
}

CrystalClass parse_entry(const toml::table& t, const std::string& file) {
  using toml_read::get_required;
  CrystalClass c;
  c.source = toml_read::at(file, t.source());
  c.name = get_required<std::string>(t, "name", file, "a Hermann-Mauguin symbol", "a [[group]] entry");
  const std::string entry = "group " + c.name;
  const std::string at = c.source + " (" + entry + ")";
  c.full = get_required<std::string>(t, "full", file, "the full Hermann-Mauguin symbol", entry);
  c.schoenflies = get_required<std::string>(t, "schoenflies", file, "a Schoenflies symbol", entry);
  c.system = get_required<std::string>(t, "system", file, "a crystal system", entry);
  c.laue = get_required<std::string>(t, "laue", file, "a Laue class", entry);
  c.type = get_required<std::string>(t, "type", file, "the standard entry's name", entry);
  c.setting = get_required<std::string>(t, "setting", file, "a description of the setting", entry);
  c.standard = get_required<bool>(t, "standard", file, "true or false", entry);
  c.centrosymmetric = get_required<bool>(t, "centrosymmetric", file, "true or false", entry);
  c.polar = get_required<bool>(t, "polar", file, "true or false", entry);
  auto order = get_required<std::int64_t>(t, "order", file, "the number of operations", entry);
  std::string lattice = get_required<std::string>(t, "lattice", file, "\"orthogonal\" or \"hexagonal\"", entry);
  if (lattice == "orthogonal")
    c.lattice = LatticeKind::orthogonal;
  else if (lattice == "hexagonal")
    c.lattice = LatticeKind::hexagonal;
  else
    fail(ErrorKind::bad_file, "unknown lattice '" + lattice + "'", toml_read::position_of(t, "lattice", file),
         "\"orthogonal\" or \"hexagonal\"");
  c.aliases = toml_read::get_strings(t, "aliases", file, false, entry, false);
  c.magnetic_names = toml_read::get_strings(t, "magnetic_names", file, false, entry, false);
  for (const auto& g : toml_read::get_strings(t, "generators", file, true, entry, false))
    c.generators.push_back(parse_operation(g, c.lattice, at));
  c.group = PointGroup::generate(c.generators, c.lattice, 48, at);
  require_lattice_group(c.group, at);
  if (static_cast<std::int64_t>(c.group.order()) != order)
    fail(ErrorKind::bad_file,
         "generators give " + std::to_string(c.group.order()) + " operations, 'order' says " +
             std::to_string(order),
         toml_read::position_of(t, "order", file) + " (" + entry + ")",
         "order = " + std::to_string(c.group.order()) + ", or generators that give " + std::to_string(order) +
             " operations");
  auto sym = t.get("symbol");
  if (!sym || !sym->as_array()) fail(ErrorKind::bad_file, "missing array 'symbol'", at, "[[text, operation], ...]");
  std::string joined;
  for (auto& el : *sym->as_array()) {
    auto pair = el.as_array();
    std::string here = toml_read::at(file, el.source());
    if (!pair || pair->size() != 2 || !(*pair)[0].value<std::string>() || !(*pair)[1].value<std::string>())
      fail(ErrorKind::bad_file, "each symbol token is [text, operation]", here, "[\"4\", \"4+ [001]\"]");
    SymbolToken tok{*(*pair)[0].value<std::string>(),
                    parse_operation(*(*pair)[1].value<std::string>(), c.lattice, here)};
    if (!c.group.contains(tok.op))
      fail(ErrorKind::bad_file, "symbol token '" + tok.text + "' names an operation outside the group", here);
    joined += tok.text;
    c.symbol.push_back(tok);
  }
  if (joined != c.name)
    fail(ErrorKind::bad_file, "symbol tokens spell '" + joined + "', not the name '" + c.name + "'", at);
  return c;
}

// The symbol of a black-white group: a token is primed when its operation is
// not in the unitary subgroup H.
std::string primed_symbol(const std::vector<SymbolToken>& tokens, const PointGroup& H,
                          std::vector<int>* pattern) {
  std::string s;
  for (const auto& tok : tokens) {
    bool prime = tok.op != Operation::identity() && !H.contains(tok.op);
    s += tok.text;
    if (prime) s += "'";
    if (tok.op != Operation::identity()) pattern->push_back(prime ? 1 : 0);
  }
  return s;
}

// Alias spellings differ from the name by leading/trailing "1" positions
// ("321" for "32", "12/m1" for "2/m"); carry them over to derived symbols.
bool alias_frame(const std::string& name, const std::string& alias, std::string* prefix, std::string* suffix) {
  for (std::size_t p = 0; p + name.size() <= alias.size(); ++p) {
    if (alias.compare(p, name.size(), name) != 0) continue;
    std::string pre = alias.substr(0, p), suf = alias.substr(p + name.size());
    if (pre.find_first_not_of('1') == std::string::npos && suf.find_first_not_of('1') == std::string::npos) {
      *prefix = pre;
      *suffix = suf;
      return true;
    }
  }
  return false;
}

std::string lower(std::string s) {
  for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

} // namespace

std::unique_ptr<GroupCatalogue> GroupCatalogue::load(const std::string& data_dir) {
  auto cat = std::make_unique<GroupCatalogue>();
  fs::path dir = fs::path(data_dir) / "groups";
  std::vector<fs::path> files;
  std::error_code ec;
  for (const auto& e : fs::directory_iterator(dir, ec))
    if (e.path().extension() == ".toml") files.push_back(e.path());
  if (ec || files.empty())
    fail(ErrorKind::bad_file, "no group files (*.toml) in " + dir.string(), "", "groups/<system>.toml files");
  std::sort(files.begin(), files.end(), [](const fs::path& a, const fs::path& b) {
    int ra = system_rank(a.stem().string()), rb = system_rank(b.stem().string());
    return ra != rb ? ra < rb : a < b;
  });
  for (const auto& f : files) {
    const toml::table root =
        toml_read::parse_file(f.string(), "group file", "TOML (https://toml.io), schema in groups/README.md");
    auto arr = root["group"].as_array();
    if (!arr) fail(ErrorKind::bad_file, "no [[group]] entries", f.string(), "[[group]] tables, groups/README.md");
    for (auto& el : *arr) {
      auto t = el.as_table();
      if (!t) fail(ErrorKind::bad_file, "'group' must be an array of tables", toml_read::at(f.string(), el.source()));
      cat->classes_.push_back(parse_entry(*t, f.string()));
    }
  }
  std::set<std::string> names;
  for (const auto& c : cat->classes_)
    if (!names.insert(c.name).second) fail(ErrorKind::bad_file, "group '" + c.name + "' is defined twice", c.source);
  // The counts of the 32 standard groups, computed once: identification asks for them
  // about a hundred times while the catalogue loads.
  for (const auto& c : cat->classes_)
    if (c.standard) cat->standard_counts_.emplace_back(operation_kind_counts(c.group), &c);
  for (const auto& c : cat->classes_) {
    auto std_it = std::find_if(cat->classes_.begin(), cat->classes_.end(),
                               [&](const CrystalClass& s) { return s.standard && s.name == c.type; });
    if (std_it == cat->classes_.end())
      fail(ErrorKind::bad_file, "type '" + c.type + "' has no standard entry", c.source);
    if (operation_kind_counts(std_it->group) != operation_kind_counts(c.group))
      fail(ErrorKind::bad_file, "setting '" + c.name + "' is not of type '" + c.type + "'", c.source);
  }
  cat->derive_magnetic_groups();
  return cat;
}

std::vector<const CrystalClass*> GroupCatalogue::standard_classes() const {
  std::vector<const CrystalClass*> out;
  for (const auto& c : classes_)
    if (c.standard) out.push_back(&c);
  return out;
}

const CrystalClass* GroupCatalogue::crystallographic_type_of(const PointGroup& g) const {
  auto counts = operation_kind_counts(g);
  for (const auto& [standard_counts, c] : standard_counts_)
    if (standard_counts == counts) return c;
  return nullptr;
}

void GroupCatalogue::derive_magnetic_groups() {
  struct Candidate {
    NamedGroup g;
    std::vector<int> pattern;
    std::vector<std::string> alias_symbols;
  };
  std::vector<Candidate> cands;
  for (const auto& c : classes_) {
    std::vector<std::pair<std::string, std::string>> frames; // alias prefix/suffix
    for (const auto& a : c.aliases) {
      std::string pre, suf;
      if (alias_frame(c.name, normalise_group_symbol(a), &pre, &suf)) frames.emplace_back(pre, suf);
    }
    auto with_aliases = [&](const std::string& sym, bool grey) {
      std::vector<std::string> out;
      for (const auto& [pre, suf] : frames) out.push_back(grey ? pre + c.name + suf + "1'" : pre + sym + suf);
      return out;
    };
    Candidate plain;
    plain.g = {c.name, "", c.type, c.type, c.schoenflies, MagneticKind::colourless, &c, c.group};
    plain.alias_symbols = with_aliases(c.name, false);
    // The full Hermann-Mauguin symbol names the colourless and the grey group too.
    const std::string full = normalise_group_symbol(c.full);
    if (full != c.name) plain.alias_symbols.push_back(full);
    cands.push_back(plain);
    Candidate grey;
    grey.g = {c.name + "1'", "", c.type, c.type, c.schoenflies + "1'", MagneticKind::grey, &c,
              c.group.with_time_reversal()};
    grey.alias_symbols = with_aliases(c.name, true);
    if (full != c.name) grey.alias_symbols.push_back(full + "1'");
    cands.push_back(grey);
    for (const auto& H : c.group.subgroups()) {
      if (2 * H.order() != c.group.order()) continue;
      std::vector<Operation> ops;
      for (auto op : c.group.operations()) {
        op.primed = !H.contains(op);
        ops.push_back(op);
      }
      Candidate bw;
      std::string sym = primed_symbol(c.symbol, H, &bw.pattern);
      const CrystalClass* ht = crystallographic_type_of(H);
      bw.g = {sym, "", c.type, ht->name, c.schoenflies + "(" + ht->schoenflies + ")", MagneticKind::black_white, &c,
              PointGroup::from_closed_set(ops, c.lattice)};
      bw.alias_symbols = with_aliases(sym, false);
      cands.push_back(bw);
    }
  }
  for (const auto& c : classes_)
    for (const auto& n : c.magnetic_names) {
      bool derived = std::any_of(cands.begin(), cands.end(), [&](const Candidate& k) {
        return k.g.crystal == &c && k.g.kind == MagneticKind::black_white && k.g.symbol == n;
      });
      if (!derived)
        fail(ErrorKind::bad_file, "magnetic_names lists '" + n + "', which is not a black-white group of " + c.name,
             c.source, "symbols of the black-white groups derived in this setting (tensorsieve groups -m -s)");
    }
  // Types: (family, kind, unitary type). The standard representative comes from a
  // standard setting; where several orientations of H exist there, the data file's
  // magnetic_names decide, else the symbol with primes earliest.
  struct TypeInfo {
    std::size_t rep;
    int index;
  };
  std::map<std::tuple<std::string, int, std::string>, TypeInfo> types;
  int next_index = 0;
  auto key_of = [](const NamedGroup& g) { return std::make_tuple(g.family, static_cast<int>(g.kind), g.unitary_type); };
  for (std::size_t i = 0; i < cands.size(); ++i) {
    const auto& cand = cands[i];
    if (!cand.g.crystal->standard) continue;
    auto key = key_of(cand.g);
    auto it = types.find(key);
    if (it == types.end()) {
      types[key] = {i, next_index++};
      continue;
    }
    const auto& names = cand.g.crystal->magnetic_names;
    const auto& cur = cands[it->second.rep];
    bool cur_named = std::find(names.begin(), names.end(), cur.g.symbol) != names.end();
    bool new_named = std::find(names.begin(), names.end(), cand.g.symbol) != names.end();
    if ((new_named && !cur_named) || (new_named == cur_named && cand.pattern > cur.pattern)) it->second.rep = i;
  }
  for (auto& cand : cands) {
    auto it = types.find(key_of(cand.g));
    if (it == types.end())
      fail(ErrorKind::internal, "magnetic group " + cand.g.symbol + " has no standard type");
    cand.g.type_symbol = cands[it->second.rep].g.symbol;
    cand.g.type_index = it->second.index;
  }
  for (const auto& [key, info] : types) cands[info.rep].g.is_type_standard = true;
  for (auto& cand : cands) {
    std::size_t idx = groups_.size();
    groups_.push_back(cand.g);
    std::vector<std::string> keys{cand.g.symbol};
    keys.insert(keys.end(), cand.alias_symbols.begin(), cand.alias_symbols.end());
    for (const auto& k : keys) {
      auto [it, inserted] = by_symbol_.emplace(normalise_group_symbol(k), idx);
      if (!inserted && groups_[it->second].group != cand.g.group)
        fail(ErrorKind::internal, "symbol " + k + " names two different groups");
    }
  }
  for (std::size_t i = 0; i < groups_.size(); ++i) {
    const auto& g = groups_[i];
    if (!g.is_type_standard) continue;
    by_symbol_.emplace("schoenflies:" + lower(g.schoenflies), i);
  }
}

std::vector<const NamedGroup*> GroupCatalogue::types() const {
  std::vector<const NamedGroup*> out(122, nullptr);
  std::vector<const NamedGroup*> extra;
  for (const auto& g : groups_)
    if (g.is_type_standard) {
      if (g.type_index >= 0 && g.type_index < 122)
        out[g.type_index] = &g;
      else
        extra.push_back(&g);
    }
  out.erase(std::remove(out.begin(), out.end(), nullptr), out.end());
  out.insert(out.end(), extra.begin(), extra.end());
  return out;
}

std::vector<const NamedGroup*> GroupCatalogue::crystallographic_types() const {
  std::vector<const NamedGroup*> out;
  for (const auto* g : types())
    if (g->kind == MagneticKind::colourless) out.push_back(g);
  return out;
}

const NamedGroup* GroupCatalogue::find(const std::string& symbol) const {
  std::string key = normalise_group_symbol(symbol);
  if (auto it = by_symbol_.find(key); it != by_symbol_.end()) return &groups_[it->second];
  static const std::map<std::string, std::string> synonyms = {
      {"s6", "c3i"}, {"c3i", "s6"}, {"s2", "ci"}, {"ci", "s2"}, {"c1h", "cs"},
      {"vd", "d2d"}, {"vh", "d2h"}, {"v", "d2"}, {"c1i", "ci"}};
  std::string low = lower(key);
  auto try_schoenflies = [&](const std::string& s) -> const NamedGroup* {
    if (auto it = by_symbol_.find("schoenflies:" + s); it != by_symbol_.end()) return &groups_[it->second];
    return nullptr;
  };
  if (auto g = try_schoenflies(low)) return g;
  // Substitute synonyms in each part of "G", "G1'", "G(H)".
  for (const auto& [from, to] : synonyms) {
    for (std::size_t p = low.find(from); p != std::string::npos; p = low.find(from, p + 1)) {
      bool starts = p == 0 || low[p - 1] == '(';
      std::size_t e = p + from.size();
      bool ends = e == low.size() || low[e] == '(' || low[e] == ')' || low[e] == '1';
      if (!starts || !ends) continue;
      std::string alt = low.substr(0, p) + to + low.substr(e);
      if (auto g = try_schoenflies(alt)) return g;
    }
  }
  return find_without_overbars(key);
}

// Plain text often loses the overbar: "m3m" for m-3m, "43m" for -43m, "6m2" for -6m2.
// Such a spelling is read only when it names no group itself and exactly one placement
// of bars over its digits 1, 3, 4 and 6 gives a group: "3m" stays 3m (C3v), never -3m.
const NamedGroup* GroupCatalogue::find_without_overbars(const std::string& key) const {
  if (key.find('-') != std::string::npos) return nullptr;
  std::vector<std::size_t> digits;
  for (std::size_t i = 0; i < key.size(); ++i)
    if (key[i] == '1' || key[i] == '3' || key[i] == '4' || key[i] == '6') digits.push_back(i);
  if (digits.empty() || digits.size() > 4) return nullptr;
  const NamedGroup* found = nullptr;
  for (unsigned mask = 1; mask < (1u << digits.size()); ++mask) {
    std::string barred;
    for (std::size_t i = 0, d = 0; i < key.size(); ++i) {
      if (d < digits.size() && digits[d] == i) {
        if (mask & (1u << d)) barred += '-';
        ++d;
      }
      barred += key[i];
    }
    auto it = by_symbol_.find(barred);
    if (it == by_symbol_.end()) continue;
    const NamedGroup* g = &groups_[it->second];
    if (found && found != g) return nullptr; // two readings: refuse rather than guess
    found = g;
  }
  return found;
}

std::vector<std::string> GroupCatalogue::closest_symbols(const std::string& symbol, std::size_t how_many) const {
  std::string key = normalise_group_symbol(symbol);
  std::vector<std::pair<std::size_t, std::string>> scored;
  std::set<std::string> seen;
  for (const auto& g : groups_) {
    if (!seen.insert(g.symbol).second) continue;
    scored.emplace_back(edit_distance(key, normalise_group_symbol(g.symbol)), g.symbol);
  }
  std::stable_sort(scored.begin(), scored.end(),
                   [](const auto& a, const auto& b) { return a.first < b.first; });
  std::vector<std::string> out;
  for (std::size_t i = 0; i < scored.size() && out.size() < how_many; ++i) out.push_back(scored[i].second);
  return out;
}

const NamedGroup& GroupCatalogue::get(const std::string& symbol) const {
  if (normalise_group_symbol(symbol).empty())
    fail(ErrorKind::unknown_name, "empty point-group symbol", "",
         "a Hermann-Mauguin symbol (e.g. 4mm, m'm2') or a Schoenflies symbol (C4v); `tensorsieve groups` lists all");
  if (const NamedGroup* g = find(symbol)) return *g;
  std::string near;
  for (const auto& s : closest_symbols(symbol)) near += (near.empty() ? "" : ", ") + s;
  fail(ErrorKind::unknown_name, "unknown point group '" + symbol + "'", "",
       "a Hermann-Mauguin symbol with primes (e.g. 4mm, 4'/m'm'm, m'm2', 3m1') or a Schoenflies symbol "
       "(C4v, C4v1', C4v(C2v)); closest: " + near + "; `tensorsieve groups` lists all");
}

const NamedGroup& GroupCatalogue::grey_of(const NamedGroup& g) const {
  const NamedGroup* grey = find(g.crystal->name + "1'");
  if (g.kind != MagneticKind::colourless || !grey)
    fail(ErrorKind::internal, "no grey group for " + g.symbol);
  return *grey;
}

const NamedGroup& GroupCatalogue::get(const std::string& symbol, PlainSymbol reading) const {
  const NamedGroup& g = get(symbol);
  if (g.kind == MagneticKind::colourless && reading == PlainSymbol::nonmagnetic) return grey_of(g);
  return g;
}

} // namespace ts
