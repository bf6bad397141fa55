#!/usr/bin/env bash
# Tests of the tree-sitter grammar, for CI and for people:
#   1. the committed generated parser is what `tree-sitter generate` makes of grammar.js;
#   2. the corpus (test/corpus) and the highlight assertions (test/highlight) pass,
#      and every query compiles;
#   3. every design in the repository parses with no ERROR or MISSING node: the
#      examples, the coil reference designs, the syntax crate's valid fixtures, the
#      TextMate test fixture and every `plenum` code block of grammar/README.md.
#
# Needs cargo (to install the CLI when it is missing), a C compiler and, optionally,
# Node.js (without it, generation uses the CLI's built-in QuickJS; the output is the
# same). The CLI is looked for as $TREE_SITTER, on PATH and in $CARGO_HOME/bin, and
# installed from crates.io into $CARGO_HOME/bin when no copy of the pinned version is
# found (5 to 12 minutes on 2 cores, depending on what else is building).
set -euo pipefail

TREE_SITTER_VERSION=0.27.1

here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
root="$(cd "$here/../.." && pwd)"
cargo_bin="${CARGO_HOME:-$HOME/.cargo}/bin"

step() { printf -- '--- %s\n' "$*"; }

find_cli() {
  local candidate
  for candidate in "${TREE_SITTER:-}" "$(command -v tree-sitter || true)" "$cargo_bin/tree-sitter"; do
    [ -n "$candidate" ] && [ -x "$candidate" ] || continue
    if [ "$("$candidate" --version 2>/dev/null | awk '{print $2}')" = "$TREE_SITTER_VERSION" ]; then
      printf '%s\n' "$candidate"
      return 0
    fi
  done
  return 1
}

if ! ts="$(find_cli)"; then
  step "installing tree-sitter-cli $TREE_SITTER_VERSION from crates.io"
  start=$SECONDS
  cargo install tree-sitter-cli --locked --version "$TREE_SITTER_VERSION"
  echo "installed in $((SECONDS - start)) s"
  ts="$(find_cli)" || { echo "error: tree-sitter $TREE_SITTER_VERSION not found after installing it" >&2; exit 1; }
fi
step "using $ts ($("$ts" --version))"

work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
# A configuration with an empty parser directory (so no warning about none), and the
# compiled parser kept out of the user's cache.
mkdir -p "$work/parsers"
printf '{ "parser-directories": ["%s"] }\n' "$work/parsers" >"$work/config.json"
export TREE_SITTER_LIBDIR="$work/lib"
mkdir -p "$TREE_SITTER_LIBDIR"
runtime=node
command -v node >/dev/null 2>&1 || runtime=native

cd "$here"

step "the committed parser is up to date with grammar.js"
"$ts" generate --js-runtime "$runtime" -o "$work/generated"
stale=0
for file in parser.c grammar.json node-types.json tree_sitter/parser.h tree_sitter/alloc.h tree_sitter/array.h; do
  if ! cmp -s "$work/generated/$file" "src/$file"; then
    echo "error: src/$file differs from what tree-sitter generate makes of grammar.js" >&2
    stale=1
  fi
done
extra="$(cd "$work/generated" && find . -type f | sort | sed 's|^\./||' | grep -v -x -e parser.c -e grammar.json -e node-types.json -e tree_sitter/parser.h -e tree_sitter/alloc.h -e tree_sitter/array.h || true)"
if [ -n "$extra" ]; then
  echo "error: tree-sitter generate made files this script does not check: $extra" >&2
  stale=1
fi
if [ "$stale" -ne 0 ]; then
  echo "run 'tree-sitter generate' in grammar/tree-sitter-plenum and commit src/" >&2
  exit 1
fi

step "corpus and highlight tests"
"$ts" test --config-path "$work/config.json"

step "the queries compile (highlights, folds, locals)"
for query in queries/*.scm; do
  "$ts" query -p "$here" --config-path "$work/config.json" --quiet "$query" "$root/examples/library.plenum" >/dev/null \
    || { echo "error: $query does not compile against the grammar" >&2; exit 1; }
done

step "every design in the repository parses without ERROR or MISSING nodes"
designs="$work/designs"
mkdir -p "$designs"
{
  find "$root/examples" "$root/tests/reference/coil/designs" "$root/crates/plenum-syntax/tests/fixtures/valid" \
    "$root/grammar/textmate/test/fixtures" -name '*.plenum' -type f 2>/dev/null | sort
  # The grammar documentation's code blocks, one file each.
  awk -v dir="$designs" '
    /^[ \t]*```plenum[ \t]*$/ { n++; file = sprintf("%s/grammar-readme-block-%02d.plenum", dir, n); inside = 1; next }
    /^[ \t]*```/ { if (inside) { close(file) } inside = 0; next }
    inside { print > file }
  ' "$root/grammar/README.md"
  find "$designs" -name '*.plenum' -type f | sort
} >"$work/paths"
count="$(wc -l <"$work/paths")"
[ "$(grep -c '/examples/' "$work/paths")" -ge 2 ] || { echo "error: expected the example designs" >&2; exit 1; }
[ "$(grep -c 'grammar-readme-block' "$work/paths")" -ge 4 ] || { echo "error: expected grammar/README.md's code blocks" >&2; exit 1; }
status=0
"$ts" parse -p "$here" --config-path "$work/config.json" --quiet --paths "$work/paths" >"$work/parse.out" 2>&1 || status=$?
if [ "$status" -ne 0 ] || grep -q -e 'ERROR' -e 'MISSING' "$work/parse.out"; then
  cat "$work/parse.out" >&2
  echo "error: some designs do not parse cleanly (exit status $status)" >&2
  exit 1
fi
echo "$count designs parse cleanly"

echo "tree-sitter grammar: all checks passed"
