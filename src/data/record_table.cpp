#include "data/record_table.hpp"

#include "core/error.hpp"

#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <algorithm>
#include <cstring>

namespace ts {

RecordWriter& RecordWriter::field(const std::string& s) {
  if (!first_) out_ += '\t';
  first_ = false;
  if (s.find_first_of("\t\n\\") == std::string::npos) {
    out_ += s;
    return *this;
  }
  for (char c : s) {
    if (c == '\t') out_ += "\\t";
    else if (c == '\n') out_ += "\\n";
    else if (c == '\\') out_ += "\\\\";
    else out_ += c;
  }
  return *this;
}

void RecordWriter::end() {
  out_ += '\n';
  first_ = true;
}

void RecordWriter::list(const char* tag, const std::vector<std::string>& items) {
  field(tag);
  for (const auto& s : items) field(s);
  end();
}

std::vector<std::string> RecordReader::list(const char* tag) {
  std::vector<std::string> out;
  for (auto f : record(tag)) out.push_back(unescaped(f));
  return out;
}

std::vector<std::string_view> RecordReader::record(const char* tag, int fields) {
  std::vector<std::string_view> f;
  std::size_t eol = text_.find('\n', pos_);
  if (eol != std::string_view::npos) {
    std::string_view line = text_.substr(pos_, eol - pos_);
    pos_ = eol + 1;
    f.reserve(static_cast<std::size_t>(std::count(line.begin(), line.end(), '\t')) + 1);
    for (std::size_t start = 0;;) {
      std::size_t tab = line.find('\t', start);
      f.push_back(line.substr(start, tab == std::string_view::npos ? std::string_view::npos : tab - start));
      if (tab == std::string_view::npos) break;
      start = tab + 1;
    }
  }
  if (f.empty() || f[0] != tag) fail(ErrorKind::internal, name_ + ": expected a '" + tag + "' record");
  f.erase(f.begin());
  if (fields >= 0 && f.size() != static_cast<std::size_t>(fields))
    fail(ErrorKind::internal, name_ + ": malformed '" + tag + "' record");
  return f;
}

bool RecordReader::next_is(const char* tag) const {
  std::string_view rest = text_.substr(pos_);
  std::string_view t(tag);
  return rest.size() > t.size() && rest.compare(0, t.size(), t) == 0 &&
         (rest[t.size()] == '\t' || rest[t.size()] == '\n');
}

long long RecordReader::number(std::string_view s) const {
  long long v = 0;
  bool negative = !s.empty() && s[0] == '-';
  std::size_t i = negative ? 1 : 0;
  if (i == s.size() || s.size() > 18) fail(ErrorKind::internal, name_ + ": '" + std::string(s) + "' is not a number");
  for (; i < s.size(); ++i) {
    if (s[i] < '0' || s[i] > '9') fail(ErrorKind::internal, name_ + ": '" + std::string(s) + "' is not a number");
    v = v * 10 + (s[i] - '0');
  }
  return negative ? -v : v;
}

bool RecordReader::flag(std::string_view s) const {
  if (s == "1") return true;
  if (s == "0") return false;
  fail(ErrorKind::internal, name_ + ": '" + std::string(s) + "' is not a flag");
}

std::string unescaped(std::string_view s) {
  if (s.find('\\') == std::string_view::npos) return std::string(s);
  std::string out;
  out.reserve(s.size());
  for (std::size_t i = 0; i < s.size(); ++i) {
    if (s[i] != '\\' || i + 1 == s.size()) {
      out += s[i];
      continue;
    }
    char c = s[++i];
    out += c == 't' ? '\t' : c == 'n' ? '\n' : c;
  }
  return out;
}

namespace {

bool read_whole(const std::string& path, std::string& bytes) {
  std::FILE* f = std::fopen(path.c_str(), "rb");
  if (!f) return false;
  bytes.clear();
  char buffer[1 << 16];
  for (std::size_t n; (n = std::fread(buffer, 1, sizeof buffer, f)) > 0;) bytes.append(buffer, n);
  const bool ok = !std::ferror(f);
  std::fclose(f);
  return ok;
}

} // namespace

std::uint64_t files_fingerprint(const std::vector<std::string>& files) {
  // FNV-1a's multiply-xor step taken over 8-byte words (the tail byte by byte):
  // the files are read on every start, so a byte-at-a-time hash would show.
  std::uint64_t h = 14695981039346656037ull;
  const std::uint64_t prime = 1099511628211ull;
  auto mix = [&](const std::string& bytes) {
    std::size_t i = 0;
    for (; i + 8 <= bytes.size(); i += 8) {
      std::uint64_t word;
      std::memcpy(&word, bytes.data() + i, 8);
      h = (h ^ word) * prime;
      h ^= h >> 29;
    }
    for (; i < bytes.size(); ++i) h = (h ^ static_cast<unsigned char>(bytes[i])) * prime;
    h = (h ^ 0xff) * prime; // separates the name from the content and one file from the next
  };
  std::string bytes;
  for (const auto& f : files) {
    if (!read_whole(f, bytes)) return 0;
    mix(std::filesystem::path(f).filename().string());
    mix(bytes);
  }
  return h;
}

std::string fingerprint_hex(std::uint64_t fingerprint) {
  char hex[17];
  std::snprintf(hex, sizeof hex, "%016llx", static_cast<unsigned long long>(fingerprint));
  return hex;
}

std::uint64_t fingerprint_from_hex(std::string_view hex) {
  if (hex.size() != 16) return 0;
  std::uint64_t v = 0;
  for (char ch : hex) {
    int d = ch >= '0' && ch <= '9' ? ch - '0' : ch >= 'a' && ch <= 'f' ? ch - 'a' + 10 : -1;
    if (d < 0) return 0;
    v = v * 16 + static_cast<std::uint64_t>(d);
  }
  return v;
}

} // namespace ts
