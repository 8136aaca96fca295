#include "response/response_catalogue.hpp"
#include "core/text.hpp"
#include "response/response_expansion.hpp"

#include "core/data_dir.hpp"
#include "core/error.hpp"
#include "data/toml_read.hpp"

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <map>
#include <set>

namespace ts {

const std::vector<std::string>& response_harmonics() {
  static const std::vector<std::string> v{"1ω", "2ω", "3ω", "DC", "2ω+DC", "static"};
  return v;
}

const std::vector<std::string>& response_drives() {
  static const std::vector<std::string> v{"E", "B", "M", "j", "H", "gradT", "light", "stress", "strain", "temperature"};
  return v;
}

const std::vector<std::string>& response_statuses() {
  static const std::vector<std::string> v{"checked", "title checked", "from memory", "common practice"};
  return v;
}

const std::vector<std::string>& response_index_roles() {
  static const std::vector<std::string> v{"E",  "j", "h", "B",     "M",      "S",          "Js",   "P",    "H", "light",
                                          "k",  "g", "Q", "stress", "strain", "indicatrix", "heat", "gradT", "joule",
                                          "helicity"};
  return v;
}

const char* drive_kind_name(DriveKind k) {
  switch (k) {
  case DriveKind::current: return "current";
  case DriveKind::field: return "field";
  case DriveKind::none: break;
  }
  return "";
}

std::string normalise_response_key(const std::string& s) {
  std::string out;
  for (unsigned char c : s) {
    if (c == ' ' || c == '_' || c == '\t' || c == '-') {
      if (!out.empty() && out.back() != '-') out += '-';
      continue;
    }
    out += static_cast<char>(std::tolower(c));
  }
  while (!out.empty() && out.back() == '-') out.pop_back();
  return out;
}

namespace {

// Ids are what users type and scenario files store: keep them plain.
bool valid_key(const std::string& s) {
  if (s.empty() || !std::islower(static_cast<unsigned char>(s.front())) || s.back() == '-') return false;
  for (std::size_t i = 0; i < s.size(); ++i) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    if (!(std::islower(c) || std::isdigit(c) || c == '-')) return false;
    if (c == '-' && s[i + 1] == '-') return false;
  }
  return true;
}

// Reading one table with exact messages: where the table starts, which entry,
// which key, and what would be valid.
using TableReader = toml_read::Table;

TensorSpec spec_at(const TableReader& r, const char* key, const std::string& text) {
  try {
    return parse_tensor_spec(text);
  } catch (const Error& e) {
    r.error(key, "bad tensor spec: " + e.problem(), e.valid());
  }
}

// Every citation carries its tag in brackets; status repeats the first one.
void check_source_tags(const TableReader& r, const std::string& source, const std::string& status) {
  const auto& tags = response_statuses();
  if (std::find(tags.begin(), tags.end(), status) == tags.end())
    r.error("status", "unknown status '" + status + "'", join(tags, ", "));
  std::string first;
  for (std::size_t open = source.find('['); open != std::string::npos; open = source.find('[', open + 1)) {
    std::size_t close = source.find(']', open);
    if (close == std::string::npos) break;
    std::string tag = source.substr(open + 1, close - open - 1);
    if (std::find(tags.begin(), tags.end(), tag) != tags.end()) {
      first = tag;
      break;
    }
  }
  if (first.empty())
    r.error("source", "no citation carries a status tag",
            "each citation followed by [checked], [title checked], [from memory] or [common practice]");
  if (first != status)
    r.error("status", "'" + status + "' differs from the tag of the first source, [" + first + "]",
            "the tag of the first (primary) citation in 'source'");
}

// The roles make contraction computable: check them against the spec, and
// for transport parts check that the harmonic is the number of drive indices.
void read_roles(const TableReader& r, ResponsePart& p) {
  p.indices = r.list("indices", true);
  const auto& roles = response_index_roles();
  for (const auto& x : p.indices)
    if (std::find(roles.begin(), roles.end(), x) == roles.end())
      r.error("indices", "unknown role '" + x + "'", join(roles, ", "));
  if (static_cast<int>(p.indices.size()) != p.spec.rank)
    r.error("indices", "gives " + std::to_string(p.indices.size()) + " roles for a rank-" + std::to_string(p.spec.rank) +
                           " spec", "one role per index, the response first");
  const toml::node* h = r.table().get("harmonic");
  if (!h || !h->value<int64_t>() || *h->value<int64_t>() < 0 || *h->value<int64_t>() > 6)
    r.error("harmonic", h ? "must be an integer from 0 to 6" : "is missing", "the power of the drive, e.g. 2 for a 2ω response");
  p.harmonic = static_cast<int>(*h->value<int64_t>());
  std::string drive = r.text("drive", false);
  if (drive.empty()) return;
  if (drive == "current") p.drive = DriveKind::current;
  else if (drive == "field") p.drive = DriveKind::field;
  else r.error("drive", "unknown drive kind '" + drive + "'", "current (E = rho·j) or field (j = sigma·E)");
  const std::string in = p.drive == DriveKind::current ? "j" : "E", out = p.drive == DriveKind::current ? "E" : "j";
  int drives = 0, halls = 0, joules = 0;
  for (std::size_t i = 0; i < p.indices.size(); ++i) {
    const std::string& x = p.indices[i];
    if (x == "h") ++halls;
    else if (x == in) ++drives;
    else if (x == "joule" && p.drive == DriveKind::current) ++joules;
    else if (x == out && i == 0) continue;
    else if (x != "B" && x != "M")
      r.error("indices", "role '" + x + "' at index " + std::to_string(i + 1) + " is not part of a " + drive +
                             "-driven transport tensor",
              out + " first (or one h), then " + in + ", B, M" +
                  (p.drive == DriveKind::current ? " or joule (the heat gradient along the normal, ∝ I²)" : ""));
  }
  bool response_first = p.indices.empty() ? false : (p.indices[0] == out || halls == 1);
  if (!response_first || halls > 1)
    r.error("indices", "a transport part needs the response " + out + " as its first index, or one Hall-vector index h");
  // Joule heating is ∝ I², so each joule index carries two powers of the drive.
  const int powers = drives + halls + 2 * joules;
  if (powers != p.harmonic)
    r.error("harmonic", "is " + std::to_string(p.harmonic) + " but the part has " + std::to_string(powers) +
                            " powers of the drive " + in + (halls ? " (the Hall vector counts one: E = h × j)" : "") +
                            (joules ? " (a joule index counts two: the heating is ∝ I²)" : ""),
            std::to_string(powers));
}

ResponsePart parse_part(const toml::table& t, const std::string& file, const std::string& id, std::size_t index) {
  TableReader r(t, file, "response '" + id + "', part " + std::to_string(index + 1));
  r.only_keys({"label", "spec", "indices", "harmonic", "drive", "mechanism", "hall", "excluded", "summed"},
              "(docs/responses.md)");
  ResponsePart p;
  p.where = toml_read::at(file, t.source());
  p.label = r.text("label");
  p.spec_text = r.text("spec");
  p.mechanism = r.text("mechanism", false);
  p.hall = r.flag("hall");
  p.summed = !t.get("summed") || r.flag("summed");
  p.spec = spec_at(r, "spec", p.spec_text);
  read_roles(r, p);
  p.excluded_text = r.text("excluded", false);
  if (t.get("excluded")) {
    if (p.excluded_text.empty()) r.error("excluded", "is empty", "a tensor spec, e.g. \"trD_: axial, time-even\"");
    TensorSpec ex = spec_at(r, "excluded", p.excluded_text);
    if (ex.rank >= p.spec.rank)
      r.error("excluded", "must be a piece of lower rank than the part's spec (rank " + std::to_string(ex.rank) +
                              " is not below " + std::to_string(p.spec.rank) + ")");
    if (ex.axial != p.spec.axial || ex.time_odd != p.spec.time_odd)
      r.error("excluded", "must have the parity and time parity of the part's spec (" + p.spec.description() + ")");
    p.excluded = ex;
  }
  return p;
}

int small_integer(const TableReader& r, const char* key, int lo, int hi, const std::string& valid) {
  const toml::node* n = r.table().get(key);
  if (!n || !n->value<int64_t>() || *n->value<int64_t>() < lo || *n->value<int64_t>() > hi)
    r.error(key, n ? "must be an integer from " + std::to_string(lo) + " to " + std::to_string(hi) : "is missing", valid);
  return static_cast<int>(*n->value<int64_t>());
}

ResponseExpansion parse_expansion(const toml::table& t, const std::string& file, const std::string& id) {
  TableReader r(t, file, "response '" + id + "', expansion");
  r.only_keys({"field", "indices", "drive", "harmonic", "axial", "order", "term"}, "(docs/responses.md)");
  ResponseExpansion e;
  e.where = toml_read::at(file, t.source());
  e.field = r.text("field");
  if (e.field != "B" && e.field != "M") r.error("field", "'" + e.field + "' cannot be expanded", "B or M");
  e.indices = r.list("indices", true);
  if (e.indices.size() < 2) r.error("indices", "needs the response and at least one drive", "e.g. [\"E\", \"j\", \"j\"]");
  for (const auto& x : e.indices)
    if (x != "E" && x != "j" && x != "h")
      r.error("indices", "role '" + x + "' cannot start an expansion", "E, j (and h for a Hall vector)");
  const std::string drive = r.text("drive");
  if (drive == "current") e.drive = DriveKind::current;
  else if (drive == "field") e.drive = DriveKind::field;
  else r.error("drive", "unknown drive kind '" + drive + "'", "current (E = rho·j) or field (j = sigma·E)");
  e.harmonic = small_integer(r, "harmonic", 1, 6, "the power of the drive, e.g. 2 for a 2ω response");
  e.axial = r.flag("axial");
  e.order = small_integer(r, "order", 1, max_expansion_order(e), "the default order of the expansion");
  if (const toml::node* terms = t.get("term")) {
    const toml::array* arr = terms->as_array();
    if (!arr) r.error("term", "must be [[response.expansion.term]] tables");
    for (std::size_t i = 0; i < arr->size(); ++i) {
      const toml::table* tt = (*arr)[i].as_table();
      if (!tt) r.error("term", "must hold tables");
      TableReader tr(*tt, file, "response '" + id + "', expansion term " + std::to_string(i + 1));
      tr.only_keys({"order", "type", "mechanism"}, "(docs/responses.md)");
      ExpansionTerm term;
      term.order = small_integer(tr, "order", 1, max_expansion_order(e), "an order of the expansion");
      const std::string type = tr.text("type");
      if (type != "i" && type != "c") tr.error("type", "'" + type + "' is not a time character", "i or c");
      term.c_type = type == "c";
      term.mechanism = tr.text("mechanism");
      e.terms.push_back(std::move(term));
    }
  }
  return e;
}

Response parse_response(const toml::table& t, const std::string& file, std::size_t index) {
  const toml::node* idn = t.get("id");
  std::string id = idn && idn->value<std::string>() ? *idn->value<std::string>() : "#" + std::to_string(index + 1);
  TableReader r(t, file, "response '" + id + "'");
  r.only_keys({"id", "name", "aliases", "relation", "response", "drives", "harmonic", "time_reversal", "onsager",
               "source", "status", "part", "expansion"},
              "(docs/responses.md)");
  Response out;
  out.where = toml_read::at(file, t.source());
  out.id = r.text("id");
  if (!valid_key(out.id)) r.error("id", "'" + out.id + "' is not a valid id", "lowercase letters, digits and single hyphens, e.g. anomalous-hall");
  out.name = r.text("name");
  out.aliases = r.list("aliases", false);
  for (const auto& a : out.aliases)
    if (!valid_key(a)) r.error("aliases", "'" + a + "' is not a valid alias", "lowercase letters, digits and single hyphens");
  out.relation = r.text("relation");
  out.response = r.text("response");
  out.drives = r.list("drives", true);
  for (const auto& d : out.drives)
    if (std::find(response_drives().begin(), response_drives().end(), d) == response_drives().end())
      r.error("drives", "unknown drive '" + d + "'", join(response_drives(), ", "));
  out.harmonic = r.text("harmonic");
  if (std::find(response_harmonics().begin(), response_harmonics().end(), out.harmonic) == response_harmonics().end())
    r.error("harmonic", "unknown harmonic '" + out.harmonic + "'", join(response_harmonics(), ", "));
  out.time_reversal = r.text("time_reversal");
  out.onsager = r.text("onsager");
  out.source = r.text("source");
  out.status = r.text("status");
  check_source_tags(r, out.source, out.status);

  if (const toml::node* ex = t.get("expansion")) {
    if (!ex->as_table()) r.error("expansion", "must be a [response.expansion] table");
    out.expansion = parse_expansion(*ex->as_table(), file, out.id);
    out.parts = expansion_parts(*out.expansion, out.expansion->order, out.expansion->where, ErrorKind::bad_file);
  }
  const toml::node* parts = t.get("part");
  if (!parts && out.expansion) return out;
  if (!parts) fail(ErrorKind::bad_file, "response '" + out.id + "' has no [[response.part]]", r.at(),
                   "one or more [[response.part]] tables with label and spec");
  const toml::array* arr = parts->as_array();
  if (!arr || arr->empty()) r.error("part", "must be one or more [[response.part]] tables");
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::table* pt = (*arr)[i].as_table();
    if (!pt) fail(ErrorKind::bad_file, "response '" + out.id + "': 'part' must hold tables",
                  toml_read::at(file, (*arr)[i].source()), "[[response.part]] tables");
    out.parts.push_back(parse_part(*pt, file, out.id, i));
  }
  return out;
}

} // namespace

std::unique_ptr<ResponseCatalogue> ResponseCatalogue::load(const std::string& path) {
  const toml::table root =
      toml_read::parse_file(path, "response catalogue", "TOML (https://toml.io), schema in docs/responses.md");
  for (const auto& [k, v] : root)
    if (k.str() != "response")
      fail(ErrorKind::bad_file, "unknown top-level key '" + std::string(k.str()) + "'", toml_read::at(path, v.source()),
           "only [[response]] tables");
  const toml::array* arr = root["response"].as_array();
  if (!arr || arr->empty())
    fail(ErrorKind::bad_file, "no [[response]] entries", path, "[[response]] tables (docs/responses.md)");

  auto cat = std::make_unique<ResponseCatalogue>();
  cat->path_ = path;
  std::map<std::string, std::string> taken; // id or alias -> where it was defined
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::table* t = (*arr)[i].as_table();
    if (!t) fail(ErrorKind::bad_file, "'response' must be an array of tables", toml_read::at(path, (*arr)[i].source()));
    Response r = parse_response(*t, path, i);
    std::vector<std::string> keys{r.id};
    keys.insert(keys.end(), r.aliases.begin(), r.aliases.end());
    for (const auto& k : keys) {
      auto [it, fresh] = taken.emplace(k, r.id + " (" + r.where + ")");
      if (!fresh)
        fail(ErrorKind::bad_file, "response '" + r.id + "': '" + k + "' is already used by " + it->second, r.where,
             "ids and aliases unique across the catalogue");
    }
    cat->responses_.push_back(std::move(r));
  }
  const std::string families = (std::filesystem::path(path).parent_path() / "families.toml").string();
  std::error_code ec;
  if (std::filesystem::is_regular_file(families, ec)) cat->load_families(families);
  return cat;
}

void ResponseCatalogue::load_families(const std::string& path) {
  const toml::table root =
      toml_read::parse_file(path, "family file", "TOML arrays of response ids, FAMILY = [\"id\", ...]");
  std::map<std::string, std::string> placed;
  for (const auto& [k, v] : root) {
    const std::string name(k.str());
    const toml::array* ids = v.as_array();
    if (!ids || name == "all")
      fail(ErrorKind::bad_file, "family '" + name + "' must be an array of response ids (and not be called all)",
           toml_read::at(path, v.source()), "FAMILY = [\"id\", ...]");
    for (const auto& el : *ids) {
      auto id = el.value<std::string>();
      if (!id || !find(*id) || find(*id)->id != *id)
        fail(ErrorKind::bad_file, "family '" + name + "': not a catalogue id", toml_read::at(path, el.source()),
             "ids from `tensorsieve responses`");
      if (!placed.emplace(*id, name).second)
        fail(ErrorKind::bad_file, "response '" + *id + "' is in two families", toml_read::at(path, el.source()),
             "each id in one family");
      families_[name].push_back(*id);
    }
  }
}

std::vector<std::string> ResponseCatalogue::expand(const std::string& id_family_or_alias) const {
  std::vector<std::string> out;
  const std::string key = normalise_response_key(id_family_or_alias);
  if (key == "all") {
    for (const auto& r : responses_) out.push_back(r.id);
    return out;
  }
  if (auto it = families_.find(key); it != families_.end()) {
    for (const auto& r : responses_)
      if (std::find(it->second.begin(), it->second.end(), r.id) != it->second.end()) out.push_back(r.id);
    return out;
  }
  return {get(id_family_or_alias).id};
}

const Response* ResponseCatalogue::find(const std::string& id_or_alias) const {
  const std::string key = normalise_response_key(id_or_alias);
  for (const auto& r : responses_)
    if (r.id == key) return &r;
  for (const auto& r : responses_)
    if (std::find(r.aliases.begin(), r.aliases.end(), key) != r.aliases.end()) return &r;
  return nullptr;
}

std::vector<std::string> ResponseCatalogue::closest_ids(const std::string& id_or_alias, std::size_t how_many) const {
  const std::string key = normalise_response_key(id_or_alias);
  std::vector<std::pair<std::size_t, std::string>> scored;
  for (const auto& r : responses_) {
    std::size_t best = edit_distance(key, r.id);
    for (const auto& a : r.aliases) best = std::min(best, edit_distance(key, a));
    // A typed fragment of an id ("hall") should rank that id high.
    if (!key.empty() && r.id.find(key) != std::string::npos) best = std::min<std::size_t>(best, 1);
    scored.emplace_back(best, r.id);
  }
  std::stable_sort(scored.begin(), scored.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
  std::vector<std::string> out;
  for (std::size_t i = 0; i < scored.size() && out.size() < how_many; ++i) out.push_back(scored[i].second);
  return out;
}

const Response& ResponseCatalogue::get(const std::string& id_or_alias) const {
  if (const Response* r = find(id_or_alias)) return *r;
  fail(ErrorKind::unknown_name, "unknown response '" + id_or_alias + "'", "",
       "a response id or alias; closest: " + join(closest_ids(id_or_alias), ", ") +
           "; `tensorsieve responses` lists all");
}

int independent_count(const ResponsePart& part, const PointGroup& group) {
  int n = independent_count(part.spec, group);
  if (part.excluded) n -= independent_count(*part.excluded, group);
  if (n < 0)
    fail(ErrorKind::internal, "the excluded piece '" + part.excluded_text + "' of part '" + part.label +
                                  "' has more components than the part itself: it is not a summand of the spec",
         part.where);
  return n;
}

std::string PartForm::verdict() const {
  const int n = independent();
  std::string s = n > 0 ? "allowed: " + std::to_string(n) + " independent component" + (n == 1 ? "" : "s")
                        : std::string("forbidden");
  if (part && part->excluded && excluded > 0) {
    const std::string ex = part->excluded->name;
    s += n > 0 ? " (" + std::to_string(form.independent()) + " of " + part->spec.name + " less " +
                     std::to_string(excluded) + " of " + ex + ", which does not enter)"
               : " (only " + ex + " survives, which does not enter)";
  }
  return s;
}

std::vector<PartForm> response_forms(const Response& r, const PointGroup& group, const Frame& frame) {
  std::vector<PartForm> out;
  for (const auto& p : r.parts) {
    PartForm pf;
    pf.part = &p;
    pf.form = allowed_form(p.spec, group, frame);
    if (p.excluded) pf.excluded = independent_count(*p.excluded, group);
    if (pf.independent() < 0)
      fail(ErrorKind::internal, "the excluded piece '" + p.excluded_text + "' of part '" + p.label +
                                    "' has more components than the part itself: it is not a summand of the spec",
           p.where);
    out.push_back(std::move(pf));
  }
  return out;
}

} // namespace ts
