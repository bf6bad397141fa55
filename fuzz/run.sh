#!/usr/bin/env bash
# Run one fuzz target on the stable toolchain, without a sanitizer (the code
# forbids `unsafe`, so a panic is what we look for), one process, niced.
# Usage: fuzz/run.sh TARGET SECONDS [more libFuzzer flags]
# libFuzzer's own log (with -jobs=1 it runs the fuzzer as a child) is
# fuzz/logs/TARGET/fuzz-0.log; crashers land in fuzz/artifacts/TARGET/.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
target="$1"; seconds="$2"; shift 2
[ -d "$here/corpus/$target" ] || "$here/seed.sh"
mkdir -p "$here/logs/$target"
cd "$here/logs/$target"
exec nice -n 10 cargo fuzz run --fuzz-dir "$here" -s none -O "$target" "$here/corpus/$target" -- \
    -jobs=1 -workers=1 -dict="$here/plenum.dict" -max_len=8192 -timeout=10 \
    -rss_limit_mb=2048 -print_final_stats=1 -max_total_time="$seconds" "$@"
