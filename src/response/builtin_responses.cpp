// The catalogue every command uses, read from the response table built into the
// library when the catalogue files are the ones it was made from. Kept apart from
// response_catalogue.cpp because the program that writes the table links the
// loader without a table.
#include "core/data_dir.hpp"
#include "response/response_catalogue.hpp"
#include "response/response_table.hpp"

#include <mutex>

namespace ts {

std::unique_ptr<ResponseCatalogue> ResponseCatalogue::load_with_table(const std::string& path) {
  const std::uint64_t data = response_data_fingerprint(path);
  if (data != 0 && data == response_table_fingerprint(built_response_table()))
    return from_table(built_response_table(), path);
  // Edited or user-supplied catalogue files: load them (and report their errors).
  return load(path);
}

const ResponseCatalogue& ResponseCatalogue::builtin() {
  // Never destroyed: it lives as long as the process, and tearing it down at exit
  // is work for nothing.
  static const ResponseCatalogue* cat;
  static std::once_flag once;
  std::call_once(once, [] { cat = load_with_table(response_catalogue_path()).release(); });
  return *cat;
}

} // namespace ts
