#include "report/screen_report.hpp"

#include "core/error.hpp"
#include "report/json_text.hpp"
#include "report/report_format.hpp"

#include <sstream>

namespace ts {

namespace {

std::string verdict(int count) { return count > 0 ? "allowed (" + std::to_string(count) + ")" : "forbidden"; }

std::string magnetic_group_text(const ScreenRow& r) {
  if (r.bns_number.empty()) return "-";
  return r.bns_number + " (type " + std::string(r.magnetic_type == 1 ? "I" : r.magnetic_type == 2 ? "II"
                                                 : r.magnetic_type == 3 ? "III" : "IV") + ")";
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n") == std::string::npos) return s;
  std::string q = "\"";
  for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}

std::string csv_line(const std::vector<std::string>& cells) {
  std::string s;
  for (std::size_t i = 0; i < cells.size(); ++i) s += (i ? "," : "") + csv_field(cells[i]);
  return s + "\n";
}

toml::table response_table(const ScreenRequest& q, const std::vector<int>& counts) {
  toml::table t;
  for (std::size_t k = 0; k < q.responses.size(); ++k)
    t.insert(q.responses[k], toml::table{{"allowed", counts[k] > 0}, {"independent", static_cast<std::int64_t>(counts[k])}});
  return t;
}

} // namespace

ScreenFormat parse_screen_format(const std::string& name) {
  if (name == "text") return ScreenFormat::text;
  if (name == "markdown") return ScreenFormat::markdown;
  if (name == "csv") return ScreenFormat::csv;
  if (name == "jsonl") return ScreenFormat::jsonl;
  fail(ErrorKind::usage, "unknown screening format '" + name + "'", "--format", "text, markdown, csv or jsonl");
}

std::string write_screen(const ScreenRequest& q, const std::vector<ScreenRow>& rows, ScreenFormat f) {
  std::ostringstream os;
  if (f == ScreenFormat::jsonl) {
    for (const auto& r : rows) {
      toml::table t{{"file", r.file}};
      if (!r.error.empty()) {
        t.insert("error", r.error);
      } else {
        t.insert("point_group", r.point_group);
        t.insert("setting", r.setting);
        t.insert("space_group", r.space_group);
        t.insert("bns_number", r.bns_number);
        t.insert("magnetic_type", static_cast<std::int64_t>(r.magnetic_type));
        t.insert("responses", response_table(q, r.counts[0]));
        toml::array cuts;
        for (std::size_t c = 0; c < q.cuts.size(); ++c)
          cuts.push_back(toml::table{{"cut", q.cuts[c]}, {"point_group", r.cut_groups[c]},
                                     {"responses", response_table(q, r.counts[c + 1])}});
        t.insert("cuts", cuts);
      }
      os << json_line(t);
    }
    return os.str();
  }
  std::vector<std::string> header{"file", "point group", "crystal-axes symbol", "space group", "magnetic (BNS)"};
  for (const auto& id : q.responses) header.push_back(id);
  for (const auto& cut : q.cuts) {
    header.push_back(cut + " point group");
    for (const auto& id : q.responses) header.push_back(cut + " " + id);
  }
  if (f == ScreenFormat::csv) {
    for (auto& h : header)
      for (auto& c : h)
        if (c == ' ') c = '_';
    header.push_back("error");
    os << csv_line(header);
    for (const auto& r : rows) {
      std::vector<std::string> cells{r.file};
      if (r.error.empty()) {
        cells.insert(cells.end(), {r.point_group, r.setting, r.space_group, r.bns_number});
        for (int n : r.counts[0]) cells.push_back(std::to_string(n));
        for (std::size_t c = 0; c < q.cuts.size(); ++c) {
          cells.push_back(r.cut_groups[c]);
          for (int n : r.counts[c + 1]) cells.push_back(std::to_string(n));
        }
      } else {
        cells.resize(header.size() - 1);
      }
      cells.push_back(r.error);
      os << csv_line(cells);
    }
    return os.str();
  }
  std::vector<std::vector<std::string>> table;
  std::vector<std::string> errors;
  for (const auto& r : rows) {
    std::vector<std::string> cells{r.file};
    if (r.error.empty()) {
      cells.insert(cells.end(), {r.point_group, r.setting.empty() ? "-" : r.setting, r.space_group.empty() ? "-" : r.space_group,
                                 magnetic_group_text(r)});
      for (int n : r.counts[0]) cells.push_back(verdict(n));
      for (std::size_t c = 0; c < q.cuts.size(); ++c) {
        cells.push_back(r.cut_groups[c]);
        for (int n : r.counts[c + 1]) cells.push_back(verdict(n));
      }
    } else {
      cells.push_back("failed, see below");
      errors.push_back(r.file + ": " + r.error);
    }
    table.push_back(cells);
  }
  const Format grid_format = f == ScreenFormat::markdown ? Format::markdown : Format::text;
  os << grid(header, table, grid_format);
  os << "\nallowed (n): the response is allowed with n independent components; forbidden: every component vanishes.\n";
  if (!errors.empty()) {
    os << "\nfailed files:\n";
    for (const auto& e : errors) os << (f == ScreenFormat::markdown ? "- " : "  ") << e << "\n";
  }
  return os.str();
}

} // namespace ts
