// The catalogue every command uses, read from the group table built into the
// library when the data files are the ones it was derived from. Kept apart from
// group_catalogue.cpp because the program that writes the table links the
// derivation without a table.
#include "core/data_dir.hpp"
#include "group/group_catalogue.hpp"
#include "group/group_table.hpp"

#include <mutex>

namespace ts {

std::unique_ptr<GroupCatalogue> GroupCatalogue::load_with_table(const std::string& data_dir) {
  const std::uint64_t data = group_data_fingerprint(data_dir);
  if (data != 0 && data == group_table_fingerprint(built_group_table()))
    return from_table(built_group_table(), data_dir);
  // Edited or user-supplied group files: derive them (and report their errors).
  return load(data_dir);
}

const GroupCatalogue& GroupCatalogue::builtin() {
  // Never destroyed: it lives as long as the process, and tearing it down at exit
  // is work for nothing.
  static const GroupCatalogue* cat;
  static std::once_flag once;
  std::call_once(once, [] {
    std::unique_ptr<GroupCatalogue> loaded = load_with_table(data_directory());
    // PointGroup fills its generator cache on first use; the catalogue's groups
    // are shared by every thread (screening runs in a pool), so fill the caches
    // here, before the catalogue is published, and they are only read after.
    // (Groups from the table decode themselves under a once flag.)
    for (const auto& c : loaded->classes_) c.group.fill_caches();
    for (const auto& g : loaded->groups_) g.group.fill_caches();
    cat = loaded.release();
  });
  return *cat;
}

} // namespace ts
