// Where tensorsieve finds its data (groups/, the response catalogue): the
// directory named by $TENSORSIEVE_DATA, else the source tree it was built
// from, else the installed share/tensorsieve, else share/tensorsieve beside the
// running executable's prefix.
#pragma once

#include <string>

namespace ts {

// The directory that holds groups/ (throws Error(bad_file) listing what was tried).
std::string data_directory();
// Path of the response catalogue file.
std::string response_catalogue_path();

} // namespace ts
