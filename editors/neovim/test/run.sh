#!/usr/bin/env bash
# End-to-end editor test: headless Neovim, the Plenum language server and an
# example design. Needs `nvim` (Debian: apt-get install -y neovim) and cargo.
#
#   bash editors/neovim/test/run.sh
#
# PLENUM_LSP_CMD overrides the server command (default: `plenum lsp` of the
# CLI, built here);
# PLENUM_EXAMPLE overrides the design opened (default: examples/library.plenum).
# Prints `neovim: N passed, N failed` and exits non-zero on a failure.
set -euo pipefail

here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
repo="$(cd "$here/../../.." && pwd)"

if ! command -v nvim >/dev/null 2>&1; then
  echo "error: nvim is not installed (apt-get install -y neovim)" >&2
  exit 2
fi

if [ -z "${PLENUM_LSP_CMD:-}" ]; then
  (cd "$repo" && cargo build --quiet -p plenum-cli --bin plenum)
  target="${CARGO_TARGET_DIR:-$repo/target}"
  PLENUM_LSP_CMD="$target/debug/plenum lsp"
fi
export PLENUM_LSP_CMD
export PLENUM_EXAMPLE="${PLENUM_EXAMPLE:-$repo/examples/library.plenum}"
export PLENUM_NVIM_PLUGIN="$repo/editors/neovim/plenum.lua"

nvim --version | head -n 1
# --clean: no user config or plugins; the test loads editors/neovim/plenum.lua
# itself. `-c luafile` rather than `-l`, which Neovim 0.7 (Debian's) lacks.
# `timeout` bounds a hung editor; the spec's own waits are 20 s each.
exec timeout 180 nvim --headless --clean -c "luafile $here/hover_spec.lua"
