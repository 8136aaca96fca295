// Tables derived at build time and compiled into the library (the group catalogue,
// the response catalogue) are written in one plain text format: one record a line,
// its fields separated by tabs, the first field a tag saying what the record holds.
// A tab, line break or backslash inside a field is written as \t, \n or \\, so any
// text survives; the reader hands out fields as views, and `unescaped` turns a
// text field back into its string. The format is internal: a table is read only
// by the build that wrote it, so a malformed record is an internal error.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <type_traits>
#include <vector>

namespace ts {

class RecordWriter {
public:
  explicit RecordWriter(std::string table_name) : name_(std::move(table_name)) {}
  RecordWriter& field(const std::string& s);
  RecordWriter& field(const char* s) { return field(std::string(s)); }
  RecordWriter& field(bool v) { return field(v ? "1" : "0"); }
  template <class Integer, std::enable_if_t<std::is_integral_v<Integer> && !std::is_same_v<Integer, bool>, int> = 0>
  RecordWriter& field(Integer v) {
    return field(std::to_string(v));
  }
  void end();
  // A whole record: the tag, then one field per item.
  void list(const char* tag, const std::vector<std::string>& items);
  const std::string& text() const { return out_; }

private:
  std::string name_, out_;
  bool first_ = true;
};

class RecordReader {
public:
  // `table_name` ("group table") only words the internal errors.
  RecordReader(std::string_view text, std::string table_name) : text_(text), name_(std::move(table_name)) {}
  // The next record, which must carry `tag` (its first field); the tag is dropped.
  // With `fields` >= 0, the record must have that many fields after the tag.
  std::vector<std::string_view> record(const char* tag, int fields = -1);
  bool next_is(const char* tag) const;
  // A record written by RecordWriter::list, its fields unescaped.
  std::vector<std::string> list(const char* tag);
  bool at_end() const { return pos_ >= text_.size(); }
  long long number(std::string_view field) const;
  bool flag(std::string_view field) const;

private:
  std::string_view text_;
  std::string name_;
  std::size_t pos_ = 0;
};

// A text field as written: undoes the escapes of RecordWriter::field.
std::string unescaped(std::string_view field);

// A 64-bit hash (FNV-1a's step, word-wise) over the names and bytes of `files` in
// the order given; 0 when one cannot be read. A change of any file, or a file added or removed, changes it.
std::uint64_t files_fingerprint(const std::vector<std::string>& files);
std::string fingerprint_hex(std::uint64_t fingerprint);
// 0 when `hex` is not 16 lowercase hex digits.
std::uint64_t fingerprint_from_hex(std::string_view hex);

} // namespace ts
