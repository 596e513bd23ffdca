#!/usr/bin/env bash
# The installed layout (a test of the build's install rules, run by ctest): `cmake --install`
# puts the programs in PREFIX/bin and the shipped data and demo cases in PREFIX/share/counterpoise,
# and an installed program reads its rule file from there, not from the source tree.
set -euo pipefail
build_dir="$1"
prefix="$(mktemp -d)"
trap 'rm -rf "$prefix"' EXIT
cmake --install "$build_dir" --prefix "$prefix" >/dev/null
data="$prefix/share/counterpoise"
test -x "$prefix/bin/counterpoise-cli"
test -f "$data/guard/wording-rules.json"
test -f "$data/verbal_scales/enfsi-2015.json"
test -f "$data/casefiles_demo/harwick-vale-breakin.json"
test -f "$data/casefiles_demo/dna/vale-str-frequencies.csv"
# The installed program checks an installed demo case with the installed rules ...
env -u COUNTERPOISE_DATA_DIR "$prefix/bin/counterpoise-cli" validate "$data/casefiles_demo/harwick-vale-dna.json" >/dev/null
# ... and it is the installed rule file it reads: a broken copy there is reported by its path.
echo '{' >"$data/guard/wording-rules.json"
if out="$(env -u COUNTERPOISE_DATA_DIR "$prefix/bin/counterpoise-cli" check-wording - <<<"A sentence." 2>&1)"; then
  echo "the broken installed rule file was not read"
  exit 1
fi
grep -qF "$data/guard/wording-rules.json" <<<"$out" || { echo "unexpected message: $out"; exit 1; }
# COUNTERPOISE_DATA_DIR points a program at another copy of the data.
COUNTERPOISE_DATA_DIR="$(cd "$(dirname "$0")/../../core/data" && pwd)" "$prefix/bin/counterpoise-cli" check-wording - <<<"A sentence." >/dev/null
echo "install layout: ok"
