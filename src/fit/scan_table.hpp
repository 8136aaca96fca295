// A measured scan read from a text table: comma-, semicolon-, tab- or
// whitespace-separated columns under a header row, `#` comments, one point per
// row. A header name says which quantity a column holds and, after the last
// underscore, its unit (phi_deg, B_T, I_mA, V_uV); values are converted to SI
// (angles to radians). The file says only what varies; the geometry of the
// measurement (bar, probe, harmonic, optical setup) comes from a scenario.
//
// Nothing is fitted from a file that did not fully parse: every problem stops
// the reader with file:line:column, the column's name and what would be valid.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

namespace ts {

// The quantities a column may hold.
enum class ScanQuantity {
  phi,       // current (bar) azimuth, or the sample azimuth of an optical scan
  phi_b,     // field azimuth
  theta_b,   // field polar angle from the film normal
  field,     // field magnitude (T), signed: a negative value is the reversed field
  current,   // current amplitude (A, rms)
  x,         // lock-in in-phase reading
  y,         // lock-in quadrature reading
  value,     // a single reading (voltage, resistance or arbitrary units)
  sigma,     // the one-standard-deviation uncertainty of the reading, same unit
  intensity, // optical intensity (arbitrary units)
  channel,   // optical channel, text: PP, PS, SP, SS, 45-S ...
};
constexpr int scan_quantity_count = 11;
const char* scan_quantity_name(ScanQuantity q); // "phi", "B", ...

struct ScanColumn {
  ScanQuantity quantity = ScanQuantity::value;
  std::string header;  // as written in the file
  std::string unit;    // as written ("deg", "uV"), empty for none
  double to_si = 1.0;  // factor to SI (radians for angles)
  int index = 0;       // position in the row
};

struct ScanTable {
  std::string path;                 // as given, for messages
  std::vector<ScanColumn> columns;  // in file order
  // One vector per quantity present (empty otherwise), every one with one entry per point.
  std::array<std::vector<double>, scan_quantity_count> values;
  std::vector<std::string> channels; // the channel column, when present
  std::vector<int> lines;            // the file line of each point, for messages

  std::size_t points() const { return lines.size(); }
  bool has(ScanQuantity q) const;
  const std::vector<double>& column(ScanQuantity q) const { return values[static_cast<int>(q)]; }
  // The header of the column of q ("phi_deg"), or the quantity's name.
  std::string header_of(ScanQuantity q) const;
};

// Reads a file; a missing or unreadable file is Error(bad_file).
ScanTable read_scan_table(const std::string& path);
// The same from text in memory; `path` names it in messages.
ScanTable parse_scan_table(const std::string& text, const std::string& path);
// A table built from arrays (Python): `columns` pairs a header (with its unit)
// with its values; every array must have the same length and finite values.
ScanTable scan_table_from_arrays(const std::vector<std::pair<std::string, std::vector<double>>>& columns,
                                 const std::vector<std::string>& channels, const std::string& name);

// The header names a column may have, for messages.
std::string valid_scan_headers();

} // namespace ts
