#!/usr/bin/env bash
# Benchmark (not a test): `larder check`'s estimated run time against what `larder run` takes,
# per scenario, on one thread. Usage:
#   tests/bench/check_estimate.sh build/larder [SCENARIO...]
# The run is measured in CPU time (user + sys of the process, from /usr/bin/time), which on one
# thread is its wall time on a free core and does not grow when other programs share the
# machine; the pilots of the estimate are timed in CPU time too. Wall time is printed beside.
# The README ("Speed") quotes the output; the goal is a ratio within 1/1.5 .. 1.5.
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
printf '%-26s %11s %11s %9s %8s\n' scenario estimate_s run_cpu_s run_wall_s ratio
for s in "${scenarios[@]}"; do
  est=$("$larder" check "$s" -t 1 --format json |
        python3 -c 'import json,sys; print(json.load(sys.stdin)["estimated_seconds"])')
  /usr/bin/time -f '%e %U %S' -o "$out/time" "$larder" run "$s" -t 1 --out "$out/run" --quiet \
    > /dev/null
  read -r wall user sys < "$out/time"
  python3 -c "e=$est; c=$user+$sys; print(f'{\"$(basename "$s")\":<26} {e:>11.2f} {c:>11.2f} {$wall:>9.2f} {c/e:>8.2f}')"
  rm -rf "$out/run"
done
