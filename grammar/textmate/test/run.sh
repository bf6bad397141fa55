#!/usr/bin/env bash
# Installs the pinned test dependencies (vscode-textmate, vscode-oniguruma) from
# the npm registry as package-lock.json has them, then tokenizes the designs.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")"
npm ci --no-audit --no-fund --loglevel=error
node --test tokenize.test.js
