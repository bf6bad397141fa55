#!/usr/bin/env bash
# Regenerate the coil reference into a temporary folder and fail (exit 1, with
# a diff) when the committed designs/ or expected/ differ from a fresh run.
#
#   tests/reference/coil/check.sh            # from anywhere in the checkout
#   PYTHON=python3.11 tests/reference/coil/check.sh
#
# It pip-installs the pinned PsychroLib first; generate.py refuses to run with
# any other version, so the committed numbers always come from the same library.
set -euo pipefail

PSYCHROLIB_VERSION="2.5.0"
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
python="${PYTHON:-python3}"

export PIP_ROOT_USER_ACTION="${PIP_ROOT_USER_ACTION:-ignore}"
"$python" -m pip install --quiet --disable-pip-version-check "PsychroLib==${PSYCHROLIB_VERSION}"

tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT

"$python" "$here/generate.py" --out "$tmp"

status=0
for dir in designs expected; do
  if ! diff -ru "$here/$dir" "$tmp/$dir"; then
    status=1
  fi
done

if [ "$status" -ne 0 ]; then
  echo "check.sh: committed tests/reference/coil/{designs,expected} differ from a fresh run (diff above)." >&2
  echo "check.sh: if the change is intended, rerun: python3 tests/reference/coil/generate.py" >&2
  exit 1
fi
echo "check.sh: tests/reference/coil reference output is up to date."
