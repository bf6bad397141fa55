#!/usr/bin/env bash
# Fill fuzz/corpus/<target>/ with the seed inputs: the examples, the coil
# reference designs, the parser, model and formatter fixtures, and the saved
# regressions. The corpus folders are git-ignored; run this before the first
# `cargo fuzz run` (it only adds files, so a grown corpus is kept).
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
repo="$(dirname "$here")"
cd "$repo"

designs=(examples/*.plenum examples/shared/*.plenum tests/reference/coil/designs/*.plenum)
fixtures=(crates/plenum-syntax/tests/fixtures/*/*.plenum
          crates/plenum-model/tests/fixtures/*.plenum
          crates/plenum-fmt/tests/fixtures/*.in)

seed() { # target file...
    local target="$1"; shift
    mkdir -p "$here/corpus/$target"
    for f in "$@"; do
        [ -f "$f" ] || continue
        local name
        name="$(echo "$f" | tr '/' '_')"
        cp "$f" "$here/corpus/$target/$name"
    done
}

seed parse "${designs[@]}" "${fixtures[@]}" "$here"/seeds/*.plenum
seed format "${designs[@]}" "${fixtures[@]}" "$here"/seeds/*.plenum

# The analysis target reads two files from one input: the root design, a NUL
# byte, then the file the root may `use "shared/site.plenum"`.
mkdir -p "$here/corpus/analysis"
site=examples/shared/harrow-site.plenum
for f in "${designs[@]}" "${fixtures[@]}" "$here"/seeds/*.plenum; do
    [ -f "$f" ] || continue
    name="$(echo "$f" | tr '/' '_')"
    cp "$f" "$here/corpus/analysis/$name"
    { sed 's#^use "shared/harrow-site.plenum"#use "shared/site.plenum"#' "$f"; printf '\0'; cat "$site"; } \
        > "$here/corpus/analysis/with-site_$name"
done

# Saved crashers stay in every corpus, so the fuzzer starts from them.
for target in parse analysis format; do
    if compgen -G "$here/regressions/$target/*" > /dev/null; then
        cp "$here"/regressions/"$target"/* "$here/corpus/$target/"
    fi
done
echo "seeded: $(ls "$here/corpus/parse" | wc -l) parse, $(ls "$here/corpus/analysis" | wc -l) analysis, $(ls "$here/corpus/format" | wc -l) format"
