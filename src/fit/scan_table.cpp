#include "fit/scan_table.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <sstream>

namespace ts {

namespace {

constexpr double kPi = 3.14159265358979323846;

struct QuantityInfo {
  ScanQuantity q;
  const char* name;
  std::vector<const char*> aliases;
  enum Kind { angle, field, current, reading, intensity, text } kind;
};

const std::vector<QuantityInfo>& quantities() {
  static const std::vector<QuantityInfo> list = {
      {ScanQuantity::phi, "phi", {"phi", "angle", "bar_angle", "azimuth", "current_angle"}, QuantityInfo::angle},
      {ScanQuantity::phi_b, "phi_B", {"phi_b", "phib", "field_angle", "phi_field"}, QuantityInfo::angle},
      {ScanQuantity::theta_b, "theta_B", {"theta_b", "thetab", "field_polar"}, QuantityInfo::angle},
      {ScanQuantity::field, "B", {"b", "field", "mu0h"}, QuantityInfo::field},
      {ScanQuantity::current, "I", {"i", "current", "i_rms"}, QuantityInfo::current},
      {ScanQuantity::x, "X", {"x", "lockin_x", "v_x", "vx"}, QuantityInfo::reading},
      {ScanQuantity::y, "Y", {"y", "lockin_y", "v_y", "vy"}, QuantityInfo::reading},
      {ScanQuantity::value, "V", {"v", "value", "signal", "voltage", "r", "resistance"}, QuantityInfo::reading},
      {ScanQuantity::sigma, "sigma", {"sigma", "err", "error", "uncertainty", "dv", "sigma_v"}, QuantityInfo::reading},
      {ScanQuantity::intensity, "intensity", {"intensity", "counts", "shg"}, QuantityInfo::intensity},
      {ScanQuantity::channel, "channel", {"channel", "polarisation", "polarization"}, QuantityInfo::text},
  };
  return list;
}

struct Unit {
  const char* name;
  double factor;
  const char* dimension; // readings: what the unit measures; conflicting dimensions are refused
};

const std::vector<Unit>& units_of(QuantityInfo::Kind k) {
  static const std::vector<Unit> angle{{"deg", kPi / 180.0, "angle"}, {"rad", 1.0, "angle"}};
  static const std::vector<Unit> field{{"t", 1.0, "field"}, {"mt", 1e-3, "field"}, {"ut", 1e-6, "field"}};
  static const std::vector<Unit> current{
      {"a", 1.0, "current"}, {"ma", 1e-3, "current"}, {"ua", 1e-6, "current"}, {"na", 1e-9, "current"}};
  static const std::vector<Unit> reading{{"v", 1.0, "voltage"},        {"mv", 1e-3, "voltage"},
                                         {"uv", 1e-6, "voltage"},      {"nv", 1e-9, "voltage"},
                                         {"ohm", 1.0, "resistance"},   {"mohm", 1e-3, "resistance"},
                                         {"kohm", 1e3, "resistance"},  {"arb", 1.0, "arbitrary units"},
                                         {"au", 1.0, "arbitrary units"}};
  static const std::vector<Unit> intensity{{"arb", 1.0, "arbitrary units"}, {"au", 1.0, "arbitrary units"},
                                           {"counts", 1.0, "arbitrary units"}};
  static const std::vector<Unit> none{};
  switch (k) {
  case QuantityInfo::angle: return angle;
  case QuantityInfo::field: return field;
  case QuantityInfo::current: return current;
  case QuantityInfo::reading: return reading;
  case QuantityInfo::intensity: return intensity;
  case QuantityInfo::text: return none;
  }
  return none;
}

std::string units_text(QuantityInfo::Kind k) {
  std::string s;
  for (const auto& u : units_of(k)) s += (s.empty() ? "" : ", ") + std::string(u.name);
  return s;
}

std::string lower(std::string s) {
  // µ (U+00B5) and μ (U+03BC) as in "µV" read as u.
  for (const char* micro : {"\xC2\xB5", "\xCE\xBC"})
    for (std::size_t p; (p = s.find(micro)) != std::string::npos;) s.replace(p, 2, "u");
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

const QuantityInfo* find_alias(const std::string& name) {
  for (const auto& qi : quantities())
    for (const char* a : qi.aliases)
      if (name == a) return &qi;
  return nullptr;
}

const QuantityInfo& info(ScanQuantity q) { return quantities()[static_cast<int>(q)]; }

std::string pos(const std::string& path, int line, int column) {
  return path + ":" + std::to_string(line) + ":" + std::to_string(column);
}

struct Cell {
  std::string text;
  int column = 1; // 1-based character position
};

std::string trim(const std::string& s) {
  std::size_t a = s.find_first_not_of(" \t\r"), b = s.find_last_not_of(" \t\r");
  return a == std::string::npos ? "" : s.substr(a, b - a + 1);
}

std::vector<Cell> split(const std::string& line, char sep) {
  std::vector<Cell> cells;
  if (sep == ' ') {
    std::size_t i = 0;
    while (i < line.size()) {
      while (i < line.size() && (line[i] == ' ' || line[i] == '\t' || line[i] == '\r')) ++i;
      if (i >= line.size()) break;
      std::size_t j = i;
      while (j < line.size() && line[j] != ' ' && line[j] != '\t' && line[j] != '\r') ++j;
      cells.push_back({line.substr(i, j - i), static_cast<int>(i) + 1});
      i = j;
    }
    return cells;
  }
  std::size_t start = 0;
  while (true) {
    std::size_t end = line.find(sep, start);
    std::string raw = line.substr(start, end == std::string::npos ? std::string::npos : end - start);
    std::size_t lead = raw.find_first_not_of(" \t\r");
    cells.push_back({trim(raw), static_cast<int>(start + (lead == std::string::npos ? 0 : lead)) + 1});
    if (end == std::string::npos) break;
    start = end + 1;
  }
  return cells;
}

ScanColumn read_header(const Cell& c, int index, const std::string& path, int line) {
  const std::string where = pos(path, line, c.column);
  if (c.text.empty())
    fail(ErrorKind::bad_file, "an empty column name in the header", where, valid_scan_headers());
  const std::string name = lower(c.text);
  ScanColumn col;
  col.header = c.text;
  col.index = index;
  const QuantityInfo* qi = find_alias(name);
  std::string unit;
  if (!qi) {
    std::size_t us = name.rfind('_');
    if (us != std::string::npos) {
      qi = find_alias(name.substr(0, us));
      unit = name.substr(us + 1);
    }
  }
  if (!qi)
    fail(ErrorKind::bad_file, "unknown column '" + c.text + "'", where, valid_scan_headers());
  col.quantity = qi->q;
  if (!unit.empty()) {
    const auto& us = units_of(qi->kind);
    auto it = std::find_if(us.begin(), us.end(), [&](const Unit& u) { return unit == u.name; });
    if (it == us.end())
      fail(ErrorKind::bad_file, "column '" + c.text + "': unknown unit '" + unit + "' for " + qi->name, where,
           us.empty() ? std::string("no unit for this column") : "a unit among " + units_text(qi->kind));
    col.unit = c.text.substr(c.text.size() - unit.size());
    col.to_si = it->factor;
  } else if (qi->kind == QuantityInfo::angle) {
    // Degrees and radians are both common for angles; guessing would turn a scan by 57°.
    fail(ErrorKind::bad_file, "column '" + c.text + "' is an angle without a unit", where,
         std::string(qi->aliases[0]) + "_deg or " + qi->aliases[0] + "_rad");
  }
  return col;
}

std::string unit_dimension(const ScanColumn& c) {
  const auto& qi = info(c.quantity);
  if (c.unit.empty()) return qi.kind == QuantityInfo::reading ? "SI units" : "";
  for (const auto& u : units_of(qi.kind))
    if (lower(c.unit) == u.name) return u.dimension;
  return "";
}

double read_number(const Cell& c, const ScanColumn& col, char sep, const std::string& path, int line) {
  const std::string where = pos(path, line, c.column);
  const std::string named = "column '" + col.header + "'";
  if (c.text.empty()) fail(ErrorKind::bad_file, "empty cell in " + named, where, "a number such as 12.5 or 1.2e-6");
  if (sep != ',' && c.text.find(',') != std::string::npos)
    fail(ErrorKind::bad_file, "'" + c.text + "' in " + named + " has a decimal comma", where,
         "a decimal point, e.g. " + [&] {
           std::string s = c.text;
           std::replace(s.begin(), s.end(), ',', '.');
           return s;
         }());
  const std::string l = lower(c.text);
  if (l.find("nan") != std::string::npos || l.find("inf") != std::string::npos)
    fail(ErrorKind::bad_file, "'" + c.text + "' in " + named + " is not a finite number", where,
         "a finite number; leave out a point that was not measured");
  if (l.find('x') != std::string::npos || l.find('p') != std::string::npos)
    fail(ErrorKind::bad_file, "'" + c.text + "' in " + named + " is not a decimal number", where,
         "a decimal number such as 12.5 or 1.2e-6");
  errno = 0;
  char* end = nullptr;
  double v = std::strtod(c.text.c_str(), &end);
  if (end == c.text.c_str() || *end != '\0')
    fail(ErrorKind::bad_file, "'" + c.text + "' in " + named + " is not a number", where,
         "a decimal number such as 12.5 or 1.2e-6");
  if (errno == ERANGE || !std::isfinite(v))
    fail(ErrorKind::bad_file, "'" + c.text + "' in " + named + " is out of the range of a double", where,
         "a number between about 1e-300 and 1e300 in magnitude");
  return v;
}

void check_columns(const ScanTable& t, const std::string& where) {
  // Two columns of one quantity: refused, and with different units said so.
  for (std::size_t i = 0; i < t.columns.size(); ++i)
    for (std::size_t j = 0; j < i; ++j)
      if (t.columns[i].quantity == t.columns[j].quantity)
        fail(ErrorKind::bad_file,
             "columns '" + t.columns[j].header + "' and '" + t.columns[i].header + "' both hold " +
                 info(t.columns[i].quantity).name +
                 (t.columns[i].unit != t.columns[j].unit ? " (with conflicting units)" : ""),
             where, "one column per quantity");
  // The readings (X, Y, value, uncertainty) must be in one kind of unit.
  std::string dim, first;
  for (const auto& c : t.columns) {
    if (info(c.quantity).kind != QuantityInfo::reading) continue;
    std::string d = unit_dimension(c);
    if (dim.empty()) {
      dim = d;
      first = c.header;
    } else if (d != dim) {
      fail(ErrorKind::bad_file, "column '" + c.header + "' is in " + d + " but '" + first + "' is in " + dim +
                                    ": conflicting units",
           where, "the readings and their uncertainty in one kind of unit (V, mV, uV, nV; or ohm; or arb)");
    }
  }
  bool reading = false;
  for (auto q : {ScanQuantity::x, ScanQuantity::y, ScanQuantity::value, ScanQuantity::intensity})
    reading = reading || t.has(q);
  if (!reading)
    fail(ErrorKind::bad_file, "no column holds a reading", where,
         "a column X, Y or V (a lock-in reading or a value, e.g. V_uV) or intensity (optics)");
  if (t.has(ScanQuantity::intensity) && (t.has(ScanQuantity::x) || t.has(ScanQuantity::y) || t.has(ScanQuantity::value)))
    fail(ErrorKind::bad_file, "both an optical intensity and an electrical reading", where,
         "one scan per file: intensity (with channel) or X/Y/V");
}

} // namespace

const char* scan_quantity_name(ScanQuantity q) { return info(q).name; }

bool ScanTable::has(ScanQuantity q) const {
  return std::any_of(columns.begin(), columns.end(), [q](const ScanColumn& c) { return c.quantity == q; });
}

std::string ScanTable::header_of(ScanQuantity q) const {
  for (const auto& c : columns)
    if (c.quantity == q) return c.header;
  return scan_quantity_name(q);
}

std::string valid_scan_headers() {
  std::string s = "columns named (a unit after the last underscore) ";
  for (const auto& qi : quantities()) {
    s += std::string(qi.aliases[0]);
    const std::string u = units_text(qi.kind);
    if (!u.empty()) s += " [" + u + "]";
    s += qi.q == ScanQuantity::channel ? "" : ", ";
  }
  return s + "; angles need their unit (phi_deg); others default to SI";
}

ScanTable parse_scan_table(const std::string& text, const std::string& path) {
  ScanTable t;
  t.path = path;
  std::istringstream in(text);
  std::string raw;
  int line_no = 0;
  char sep = 0;
  std::vector<std::vector<double>> cols;
  while (std::getline(in, raw)) {
    ++line_no;
    if (line_no == 1 && raw.rfind("\xEF\xBB\xBF", 0) == 0) raw = raw.substr(3);
    std::size_t hash = raw.find('#');
    std::string line = hash == std::string::npos ? raw : raw.substr(0, hash);
    if (trim(line).empty()) continue;
    if (!sep) {
      sep = line.find('\t') != std::string::npos ? '\t'
            : line.find(';') != std::string::npos ? ';'
            : line.find(',') != std::string::npos ? ','
                                                  : ' ';
      auto cells = split(line, sep);
      for (std::size_t i = 0; i < cells.size(); ++i)
        t.columns.push_back(read_header(cells[i], static_cast<int>(i), path, line_no));
      check_columns(t, pos(path, line_no, 1));
      cols.assign(t.columns.size(), {});
      continue;
    }
    auto cells = split(line, sep);
    if (cells.size() != t.columns.size()) {
      const int col = cells.size() > t.columns.size() ? cells[t.columns.size()].column
                                                       : static_cast<int>(line.find_last_not_of(" \t\r")) + 2;
      std::string why = "row has " + std::to_string(cells.size()) + " cells, the header names " +
                        std::to_string(t.columns.size()) + " columns";
      if (sep == ',' && cells.size() > t.columns.size()) why += " (a decimal comma in a comma-separated file?)";
      fail(ErrorKind::bad_file, why, pos(path, line_no, col),
           "one cell per column (" + [&] {
             std::string h;
             for (const auto& c : t.columns) h += (h.empty() ? "" : ", ") + c.header;
             return h;
           }() + "); write decimals with a point");
    }
    for (std::size_t i = 0; i < cells.size(); ++i) {
      const ScanColumn& c = t.columns[i];
      if (c.quantity == ScanQuantity::channel) {
        if (cells[i].text.empty())
          fail(ErrorKind::bad_file, "empty cell in column '" + c.header + "'", pos(path, line_no, cells[i].column),
               "a channel such as PP, PS, SP, SS or 45-S");
        t.channels.push_back(cells[i].text);
        continue;
      }
      double v = read_number(cells[i], c, sep, path, line_no) * c.to_si;
      if (c.quantity == ScanQuantity::sigma && !(v > 0))
        fail(ErrorKind::bad_file, "uncertainty '" + cells[i].text + "' in column '" + c.header + "' is not positive",
             pos(path, line_no, cells[i].column), "a positive standard deviation");
      cols[i].push_back(v);
    }
    t.lines.push_back(line_no);
  }
  if (!sep) fail(ErrorKind::bad_file, "no header row", path, "a header naming the columns, e.g. phi_deg, V_uV");
  if (t.lines.empty()) fail(ErrorKind::bad_file, "no data rows under the header", path, "one row per measured point");
  for (std::size_t i = 0; i < t.columns.size(); ++i)
    if (t.columns[i].quantity != ScanQuantity::channel) t.values[static_cast<int>(t.columns[i].quantity)] = cols[i];
  return t;
}

ScanTable read_scan_table(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) fail(ErrorKind::bad_file, "cannot read the scan file", path, "a readable text table (CSV, TSV or columns)");
  std::ostringstream ss;
  ss << f.rdbuf();
  if (f.bad()) fail(ErrorKind::bad_file, "cannot read the scan file (is it a directory?)", path, "a readable text file");
  return parse_scan_table(ss.str(), path);
}

ScanTable scan_table_from_arrays(const std::vector<std::pair<std::string, std::vector<double>>>& columns,
                                 const std::vector<std::string>& channels, const std::string& name) {
  ScanTable t;
  t.path = name;
  std::size_t n = std::string::npos;
  int index = 0;
  for (const auto& [header, values] : columns) {
    ScanColumn c = read_header({header, index + 1}, index, name, 0);
    c.index = index++;
    if (n == std::string::npos) n = values.size();
    if (values.size() != n)
      fail(ErrorKind::bad_file, "array '" + header + "' has " + std::to_string(values.size()) + " values, the first has " +
                                    std::to_string(n), name, "arrays of one length");
    t.columns.push_back(c);
    auto& out = t.values[static_cast<int>(c.quantity)];
    for (std::size_t i = 0; i < values.size(); ++i) {
      if (!std::isfinite(values[i]))
        fail(ErrorKind::bad_file, "array '" + header + "' holds a NaN or infinite value at index " + std::to_string(i),
             name, "finite numbers");
      if (c.quantity == ScanQuantity::sigma && !(values[i] > 0))
        fail(ErrorKind::bad_file, "array '" + header + "' holds a non-positive uncertainty at index " + std::to_string(i),
             name, "positive standard deviations");
      out.push_back(values[i] * c.to_si);
    }
  }
  if (!channels.empty()) {
    if (n != std::string::npos && channels.size() != n)
      fail(ErrorKind::bad_file, "the channel list has " + std::to_string(channels.size()) + " entries, the arrays " +
                                    std::to_string(n), name, "one channel per point");
    ScanColumn c;
    c.quantity = ScanQuantity::channel;
    c.header = "channel";
    c.index = index;
    t.columns.push_back(c);
    t.channels = channels;
    n = channels.size();
  }
  check_columns(t, name);
  if (n == std::string::npos || n == 0) fail(ErrorKind::bad_file, "no points", name, "arrays with one value per point");
  for (std::size_t i = 0; i < n; ++i) t.lines.push_back(static_cast<int>(i));
  return t;
}

} // namespace ts
