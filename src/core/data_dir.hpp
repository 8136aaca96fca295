// Where tensorsieve finds its data (groups/, the response catalogue): the
// directory named by $TENSORSIEVE_DATA, else share/tensorsieve of the running
// executable's prefix (an installed copy), else the source tree it was built
// from, else the configured install directory.
#pragma once

#include <string>

namespace ts {

// The directory that holds groups/ (throws Error(bad_file) listing what was tried).
std::string data_directory();
// Path of the response catalogue file.
std::string response_catalogue_path();
// A root to try right after $TENSORSIEVE_DATA: the Python package installed by pip
// carries its own copy of the data, beside the module, and the interpreter's
// prefix says nothing about where that is.
void prefer_data_directory(const std::string& root);

} // namespace ts
