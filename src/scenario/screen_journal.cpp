#include "scenario/screen_journal.hpp"

#include "core/error.hpp"

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sstream>

namespace ts {

namespace {

const char* const kMagic = "#tensorsieve-screen-journal 1";

std::string escaped(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '\\') out += "\\\\";
    else if (c == '\t') out += "\\t";
    else if (c == '\n') out += "\\n";
    else if (c == '\r') out += "\\r";
    else out += c;
  }
  return out;
}

bool unescaped(const std::string& s, std::string* out) {
  out->clear();
  for (std::size_t i = 0; i < s.size(); ++i) {
    if (s[i] != '\\') {
      *out += s[i];
      continue;
    }
    if (++i == s.size()) return false;
    if (s[i] == '\\') *out += '\\';
    else if (s[i] == 't') *out += '\t';
    else if (s[i] == 'n') *out += '\n';
    else if (s[i] == 'r') *out += '\r';
    else return false;
  }
  return true;
}

std::vector<std::string> split(const std::string& s, char sep) {
  std::vector<std::string> parts;
  std::size_t start = 0;
  while (true) {
    const std::size_t stop = s.find(sep, start);
    parts.push_back(s.substr(start, stop == std::string::npos ? std::string::npos : stop - start));
    if (stop == std::string::npos) return parts;
    start = stop + 1;
  }
}

template <typename T> std::string joined(const std::vector<T>& v, char sep) {
  std::ostringstream os;
  for (std::size_t i = 0; i < v.size(); ++i) os << (i ? std::string(1, sep) : "") << v[i];
  return os.str();
}

bool small_int(const std::string& s, int* v) {
  if (s.empty() || s.size() > 9 || s.find_first_not_of("0123456789") != std::string::npos) return false;
  *v = std::stoi(s);
  return true;
}

} // namespace

std::string screen_signature(const ScreenRequest& r) {
  std::ostringstream os;
  os.precision(17);
  os << "responses=" << joined(r.responses, ',') << " cuts=" << joined(r.cuts, ',') << " symprec=" << r.options.symprec
     << " occupancy=" << (r.options.occupancy == OccupancyPolicy::refuse ? "refuse" : "ignore")
     << " max_atoms=" << r.options.max_atoms;
  return escaped(os.str());
}

std::string journal_line(const ScreenRow& row) {
  std::vector<std::string> counts;
  for (const auto& c : row.counts) counts.push_back(joined(c, ','));
  const std::string fields[] = {row.file,        row.error,       row.point_group,       row.setting,
                                row.bns_number,  std::to_string(row.magnetic_type), row.space_group,
                                joined(row.cut_groups, '\x1f'), joined(counts, ';')};
  std::string line = "row";
  for (const auto& f : fields) line += "\t" + escaped(f);
  return line + "\tend";
}

bool parse_journal_line(const std::string& line, ScreenRow* row) {
  const std::vector<std::string> raw = split(line, '\t');
  if (raw.size() != 11 || raw.front() != "row" || raw.back() != "end") return false;
  std::vector<std::string> f(9);
  for (std::size_t i = 0; i < 9; ++i)
    if (!unescaped(raw[i + 1], &f[i])) return false;
  ScreenRow r;
  r.file = f[0];
  r.error = f[1];
  r.point_group = f[2];
  r.setting = f[3];
  r.bns_number = f[4];
  if (!small_int(f[5], &r.magnetic_type)) return false;
  r.space_group = f[6];
  if (!f[7].empty()) r.cut_groups = split(f[7], '\x1f');
  if (!f[8].empty())
    for (const auto& step : split(f[8], ';')) {
      std::vector<int> counts;
      if (!step.empty())
        for (const auto& c : split(step, ',')) {
          int v = 0;
          if (!small_int(c, &v)) return false;
          counts.push_back(v);
        }
      r.counts.push_back(counts);
    }
  if (r.file.empty() || (r.error.empty() && r.counts.size() != r.cut_groups.size() + 1)) return false;
  *row = std::move(r);
  return true;
}

ScreenJournal::ScreenJournal(const std::string& path, const ScreenRequest& request) : path_(path) {
  const std::string first = std::string(kMagic) + "\t" + screen_signature(request);
  {
    std::ifstream in(path, std::ios::binary);
    std::string line;
    if (in && std::getline(in, line) && line == first) {
      while (std::getline(in, line)) {
        ScreenRow row;
        if (parse_journal_line(line, &row)) resumed_.push_back(std::move(row));
      }
    }
  }
  // Rewritten from what was read: a line cut by a killed run does not stay in the middle.
  file_ = std::fopen(path.c_str(), "wb");
  if (!file_)
    fail(ErrorKind::bad_file, "cannot write the screening journal " + path + ": " + std::strerror(errno), "--output",
         "an output file in a writable directory");
  std::fprintf(file_, "%s\n", first.c_str());
  for (const auto& r : resumed_) std::fprintf(file_, "%s\n", journal_line(r).c_str());
  std::fflush(file_);
}

ScreenJournal::~ScreenJournal() {
  if (file_) std::fclose(file_);
}

void ScreenJournal::append(const ScreenRow& row) {
  if (!file_) return;
  const std::string line = journal_line(row) + "\n";
  if (std::fwrite(line.data(), 1, line.size(), file_) != line.size() || std::fflush(file_) != 0)
    fail(ErrorKind::bad_file, "cannot write the screening journal " + path_ + ": " + std::strerror(errno), "--output",
         "an output file in a writable directory with room for it");
}

void ScreenJournal::remove() {
  if (file_) std::fclose(file_);
  file_ = nullptr;
  std::remove(path_.c_str());
}

} // namespace ts
