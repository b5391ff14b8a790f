#!/usr/bin/env bash
# Benchmark (not a test): `larder check`'s estimated run time against the measured wall time of
# `larder run`, per scenario and thread count. Usage:
#   tests/bench/check_estimate.sh build/larder [SCENARIO...]
# Prints one line per (scenario, threads): estimate, measured, measured / estimate. The README
# ("Speed") quotes its output; the goal is a ratio within 1/1.5 .. 1.5.
set -euo pipefail
larder=${1:?path to the larder binary}
shift
scenarios=("$@")
if [ ${#scenarios[@]} -eq 0 ]; then
  here=$(cd "$(dirname "$0")" && pwd)
  scenarios=("$here/../../scenarios/grouping.yaml" "$here/network-estimate.yaml")
fi
out=$(mktemp -d)
trap 'rm -rf "$out"' EXIT
printf '%-28s %7s %12s %12s %8s\n' scenario threads estimate_s measured_s ratio
for s in "${scenarios[@]}"; do
  for t in 1 2; do
    est=$("$larder" check "$s" -t "$t" --format json | python3 -c 'import json,sys; print(json.load(sys.stdin)["estimated_seconds"])')
    start=$(date +%s.%N)
    "$larder" run "$s" -t "$t" --out "$out/run" --force --quiet > /dev/null
    end=$(date +%s.%N)
    python3 -c "import sys; e,m=float('$est'),float('$end')-float('$start'); print(f'{\"$(basename "$s")\":<28} {$t:>7} {e:>12.2f} {m:>12.2f} {m/e:>8.2f}')"
    rm -rf "$out/run"
  done
done
