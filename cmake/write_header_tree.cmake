# cmake -DSOURCE=src -DDEST=build/include/tensorsieve -DSTAMP=FILE -P write_header_tree.cmake
#
# The installed headers live under a project-named folder, <tensorsieve/core/error.hpp>,
# while the sources include each other by module path ("core/error.hpp") so that src/
# needs no rename. This script copies every library header (src/*/*.hpp except the
# CLI's) into DEST with each project include rewritten to the installed path; a file
# is written only when its text changed, so an unchanged header never triggers a rebuild.
file(GLOB headers RELATIVE ${SOURCE} ${SOURCE}/*/*.hpp)
list(FILTER headers EXCLUDE REGEX "^cli/")
foreach(rel IN LISTS headers)
  file(READ ${SOURCE}/${rel} text)
  string(REGEX REPLACE "#include \"([a-z_]+/[A-Za-z0-9_]+\\.hpp)\"" "#include <tensorsieve/\\1>" text "${text}")
  set(out ${DEST}/${rel})
  set(old "")
  if(EXISTS ${out})
    file(READ ${out} old)
  endif()
  if(NOT old STREQUAL text)
    file(WRITE ${out} "${text}")
  endif()
endforeach()
file(TOUCH ${STAMP})
