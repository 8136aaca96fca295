#!/usr/bin/env bash
# Install into a scratch prefix and run the installed binary from a copy of that
# prefix somewhere else, so neither the build tree nor the configured prefix can
# supply the data: the binary must use its own share/tensorsieve. With a third
# and fourth argument (a Python interpreter and the package directory relative
# to the prefix) the installed Python module is imported too.
set -euo pipefail
build="$1"
prefix="$2"
rm -rf "$prefix" "$prefix-moved"
cmake --install "$build" --prefix "$prefix" >/dev/null
test -x "$prefix/bin/tensorsieve"
test -f "$prefix/share/tensorsieve/groups/cubic.toml"
test -f "$prefix/share/tensorsieve/responses/catalogue.toml"
test -f "$prefix/share/doc/tensorsieve/conventions.md"
cp -r "$prefix" "$prefix-moved"
out="$("$prefix-moved/bin/tensorsieve" form 4mm 'V[V2]' --format json)"
echo "$out" | grep -q '"independent" : 3' || echo "$out" | grep -q '"independent": 3'
"$prefix-moved/bin/tensorsieve" response anomalous-hall "4m'm'" >/dev/null
# The Python package, when built: PYTHON and its directory under the prefix.
if [ -n "${3:-}" ]; then
  test -f "$prefix-moved/$4/tensorsieve/__init__.py"
  PYTHONPATH="$prefix-moved/$4" TENSORSIEVE_DATA="$prefix-moved/share/tensorsieve" "$3" -c \
    "import tensorsieve as ts; assert ts.form('4mm', 'V[V2]')['independent'] == 3"
fi
rm -rf "$prefix" "$prefix-moved"
echo "install check passed"
