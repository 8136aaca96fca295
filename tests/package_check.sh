#!/usr/bin/env bash
# The C++ package as another program sees it: install into a scratch prefix, then build
# tests/consumer/main.cpp against that prefix twice, with find_package(tensorsieve)
# and with pkg-config, and run both copies. The source tree's src/ is never on the
# include path: only <tensorsieve/...> from the prefix.
# Usage: package_check.sh BUILD_DIR SCRATCH_DIR SOURCE_DIR VERSION
# CONSUMER_CXXFLAGS: the flags the library was compiled with (sanitizers), for the consumers.
set -euo pipefail
build="$1"
scratch="$2"
source="$3"
prefix="$scratch/prefix"
rm -rf "$scratch"
mkdir -p "$scratch"
cmake --install "$build" --prefix "$prefix" >/dev/null
test -f "$prefix/include/tensorsieve/tensor/allowed_form.hpp"
test ! -e "$prefix/include/tensorsieve/cli"
if grep -rq '#include "' "$prefix/include/tensorsieve"; then
  echo "an installed header still includes by a short project path:" >&2
  grep -rn '#include "' "$prefix/include/tensorsieve" >&2
  exit 1
fi
ls "$prefix"/lib*/libtensorsieve.a >/dev/null
export TENSORSIEVE_DATA="$prefix/share/tensorsieve"
want="4mm V[V2]: 3 independent
error: unknown point group '4mn'"

# 1. CMake: find_package(tensorsieve)
cmake -S "$source/tests/consumer" -B "$scratch/cmake-build" -DCMAKE_PREFIX_PATH="$prefix" \
      -DCMAKE_BUILD_TYPE=Release -DCMAKE_CXX_FLAGS="${CONSUMER_CXXFLAGS:-}" ${CMAKE_CXX_COMPILER_LAUNCHER:+-DCMAKE_CXX_COMPILER_LAUNCHER=$CMAKE_CXX_COMPILER_LAUNCHER} >/dev/null
cmake --build "$scratch/cmake-build" >/dev/null
got="$("$scratch/cmake-build/consumer")"
[ "$got" = "$want" ] || { echo "find_package consumer printed: $got" >&2; exit 1; }

# 2. pkg-config
export PKG_CONFIG_PATH="$(dirname "$(ls "$prefix"/lib*/pkgconfig/tensorsieve.pc)")"
[ "$(pkg-config --modversion tensorsieve)" = "$4" ]
# shellcheck disable=SC2046
${CXX:-c++} ${CONSUMER_CXXFLAGS:-} -O1 -o "$scratch/pc-consumer" "$source/tests/consumer/main.cpp" $(pkg-config --cflags --libs tensorsieve)
got="$("$scratch/pc-consumer")"
[ "$got" = "$want" ] || { echo "pkg-config consumer printed: $got" >&2; exit 1; }
rm -rf "$scratch"
echo "package check passed: find_package and pkg-config consumers built and ran"
