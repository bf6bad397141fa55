#!/usr/bin/env bash
# Regenerate the psychrometric reference tables into a temporary folder and
# fail if they differ from the committed ones (tests/reference/psychro/*.csv).
# Installs the pinned reference libraries itself (PyPI: PsychroLib, CoolProp).
# Usage: bash tests/reference/psychro/check.sh   (PYTHON=python3 by default)
set -euo pipefail

here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
python="${PYTHON:-python3}"

"$python" -m pip install --quiet --disable-pip-version-check --root-user-action=ignore \
    "PsychroLib==2.5.0" "CoolProp==8.0.0"

tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT

"$python" "$here/generate.py" --out "$tmp"

status=0
count=0
for committed in "$here"/*.csv; do
    name="$(basename "$committed")"
    count=$((count + 1))
    if [[ ! -f "$tmp/$name" ]]; then
        echo "psychro reference: $name is committed but no longer generated" >&2
        status=1
    elif ! diff -u "$committed" "$tmp/$name" > "$tmp/$name.diff"; then
        echo "psychro reference: $name differs from a fresh generation:" >&2
        head -n 40 "$tmp/$name.diff" >&2
        status=1
    fi
done
for fresh in "$tmp"/*.csv; do
    name="$(basename "$fresh")"
    if [[ ! -f "$here/$name" ]]; then
        echo "psychro reference: $name is generated but not committed" >&2
        status=1
    fi
done
if [[ $status -eq 0 ]]; then
    echo "psychro reference: $count tables regenerate byte-identical"
fi
exit $status
