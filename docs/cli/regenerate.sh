#!/usr/bin/env bash
# Rewrite docs/cli/*-help.txt from the binary, so the option lists in
# docs/cli.md can be checked against what the program really accepts.
#   docs/cli/regenerate.sh [PATH/TO/tensorsieve]     (default: build/tensorsieve)
# The program is run under the name "tensorsieve" so the usage lines do not
# depend on where it was built.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
root="$(cd "$here/../.." && pwd)"
bin="${1:-${TENSORSIEVE_BIN:-$root/build/tensorsieve}}"
if [[ ! -x "$bin" ]]; then
  echo "regenerate.sh: no executable tensorsieve at '$bin'" >&2
  echo "  give the path of a built binary: docs/cli/regenerate.sh /path/to/tensorsieve" >&2
  exit 2
fi
run() { (exec -a tensorsieve "$bin" "$@"); }

# Subcommands as the binary lists them, so a new one is picked up unasked.
mapfile -t commands < <(run --help | awk '/^Subcommands:/ {on = 1; next} on && NF {print $1}')
if [[ ${#commands[@]} -eq 0 ]]; then
  echo "regenerate.sh: '$bin --help' lists no subcommands" >&2
  exit 1
fi

write() { # file, command...
  local out="$1" tmp
  shift
  tmp="$(mktemp "$here/.help.XXXXXX")"
  if ! run "$@" >"$tmp"; then
    rm -f "$tmp"
    echo "regenerate.sh: 'tensorsieve $*' failed" >&2
    exit 1
  fi
  mv "$tmp" "$out"
  echo "wrote ${out#"$root/"}"
}

write "$here/tensorsieve-help.txt" --help
for c in "${commands[@]}"; do
  write "$here/$c-help.txt" "$c" --help
done
run --version >"$here/version.txt"
echo "wrote docs/cli/version.txt"
