// The point groups tensorsieve knows: the 32 crystallographic classes and
// their common settings, read from groups/*.toml, and the 122 magnetic point
// groups derived from them (colourless G, grey G1', black-white H + (G-H)1' for
// every index-2 subgroup H), each named in Hermann-Mauguin notation with primes
// in the setting it was derived in.
#pragma once

#include "group/point_group.hpp"

#include <array>
#include <cstdint>
#include <map>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

namespace ts {

struct SymbolToken {
  std::string text; // as written in the short symbol: "4", "/m", "m", "1"
  Operation op;     // the operation the position stands for
};

// One [[group]] entry of groups/*.toml: a crystallographic point group in one setting.
struct CrystalClass {
  std::string name, full, schoenflies, system, laue, type, setting;
  std::vector<std::string> aliases;
  std::vector<std::string> magnetic_names; // preferred standard symbols of ambiguous magnetic types
  bool standard = false, centrosymmetric = false, polar = false;
  LatticeKind lattice = LatticeKind::orthogonal;
  std::vector<Operation> generators;
  std::vector<SymbolToken> symbol;
  PointGroup group;
  std::string source; // file:line of the entry
};

enum class MagneticKind { colourless, grey, black_white };

// How a symbol without primes and without 1' is read. A physicist writing `4mm`
// means a non-magnetic crystal, the grey group 4mm1' (the default everywhere); the
// colourless group 4mm (magnetic order with no primed operation) must be asked for.
enum class PlainSymbol { nonmagnetic, colourless };
const char* magnetic_kind_name(MagneticKind k); // "ordinary (colourless)", "grey", "black-white"

// One magnetic point group in a definite setting.
struct NamedGroup {
  std::string symbol;        // HM with primes in this setting: "m'm2'", "mm'2'", "4mm1'", "2mm"
  std::string type_symbol;   // the standard symbol of its type among the 122: "m'm2'"
  std::string family;        // crystallographic type of the group without primes: "mm2"
  std::string unitary_type;  // crystallographic type of the unprimed subgroup H
  std::string schoenflies;   // "C2v", "C2v1'", "C2v(Cs)"
  MagneticKind kind = MagneticKind::colourless;
  const CrystalClass* crystal = nullptr; // the setting it was derived in
  PointGroup group;
  bool is_type_standard = false; // the standard representative of its type
  int type_index = -1;           // 0..121 in the catalogue's order of types
};

class GroupCatalogue {
public:
  // Loads every *.toml under dir/groups. Throws Error(bad_file) with file:line:column.
  static std::unique_ptr<GroupCatalogue> load(const std::string& data_dir);
  // As load(), but read from the table built into the library (group_table.hpp)
  // when dir/groups holds exactly the files the table was derived from.
  static std::unique_ptr<GroupCatalogue> load_with_table(const std::string& data_dir);
  // The catalogue from data_directory(), loaded once.
  static const GroupCatalogue& builtin();

  // The whole derived catalogue as the text of a group table, and back; the
  // table names its files relative to groups/, so from_table places them in data_dir.
  std::string table_text(std::uint64_t fingerprint) const;
  static std::unique_ptr<GroupCatalogue> from_table(std::string_view table, const std::string& data_dir);

  const std::vector<CrystalClass>& crystal_classes() const { return classes_; } // every setting
  std::vector<const CrystalClass*> standard_classes() const;                   // the 32
  const std::vector<NamedGroup>& groups() const { return groups_; }              // every setting, every magnetic kind
  std::vector<const NamedGroup*> types() const;                                  // the 122 standard representatives
  std::vector<const NamedGroup*> crystallographic_types() const;                 // the 32 colourless standards

  // Lookup by HM symbol (primes, spaces, aliases, unicode minus and primes accepted)
  // or Schoenflies symbol ("C4v", "C4v1'", "C4v(C2v)"); a plain spelling that lost its
  // overbars ("m3m", "43m") when exactly one group reads that way.
  const NamedGroup* find(const std::string& symbol) const;
  const NamedGroup& get(const std::string& symbol) const; // throws Error(unknown_name) with suggestions
  // As get(), with a symbol without primes read as `reading` says.
  const NamedGroup& get(const std::string& symbol, PlainSymbol reading) const;
  // The grey group G1' of a colourless group G, in the same setting.
  const NamedGroup& grey_of(const NamedGroup& colourless) const;
  std::vector<std::string> closest_symbols(const std::string& symbol, std::size_t how_many = 5) const;

  // Type of the group without primes, from the counts of each kind of operation.
  const CrystalClass* crystallographic_type_of(const PointGroup& g) const;

private:
  void derive_magnetic_groups();
  const NamedGroup* find_without_overbars(const std::string& normalised) const;
  std::vector<CrystalClass> classes_;
  std::vector<std::pair<std::array<int, 10>, const CrystalClass*>> standard_counts_;
  std::vector<NamedGroup> groups_;
  std::map<std::string, std::size_t> by_symbol_;
};

std::string normalise_group_symbol(const std::string& s);

// Counts of the ten kinds of point operation (1, 2, 3, 4, 6, -1, m, -3, -4, -6)
// of the group with primes dropped; equal for groups of the same type.
std::array<int, 10> operation_kind_counts(const PointGroup& g);

} // namespace ts
