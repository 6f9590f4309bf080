#!/usr/bin/env bash
# Regenerates the numpy/scipy reference fixtures into a temp folder and fails when they differ
# from the committed ones, so fixtures can neither drift nor be edited by hand.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
committed="$here/../test/fixtures/scipy"
fresh="$(mktemp -d)"
trap 'rm -rf "$fresh"' EXIT
python3 -c 'import numpy, scipy; print(f"numpy {numpy.__version__}, scipy {scipy.__version__}")'
python3 "$here/scipy_reference.py" --out "$fresh"
python3 "$here/condition_stats_reference.py" --out "$fresh"
if diff -r -q "$committed" "$fresh"; then
  echo "scipy fixtures: regenerated files are identical to the committed ones"
else
  echo "scipy fixtures differ from a fresh run of backend/scripts/scipy_reference.py or condition_stats_reference.py" >&2
  echo "(regenerate with: python3 backend/scripts/scipy_reference.py --out backend/test/fixtures/scipy" >&2
  echo " and python3 backend/scripts/condition_stats_reference.py --out backend/test/fixtures/scipy)" >&2
  exit 1
fi
