#!/usr/bin/env bash
# Fit speed before and after a change, side by side in one run: two rankfreq builds (BEFORE_BIN, AFTER_BIN folders
# holding a `dotnet publish src/RankFreq.Cli -c Release` output) fit the same spectra with the same seed, alternating;
# wall and CPU time from /usr/bin/time with the load average beside each, and the --json summaries compared field by
# field (xmin, α, KS, p-values, intervals must agree). Spectra as in fit-scale.sh (benchmarks/work).
# Usage: benchmarks/peers/fit-speed.sh BEFORE_BIN AFTER_BIN [default|point|all]
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work
before=$1; after=$2; which=${3:-all}
# steal: CPU time the hypervisor gave to other guests while this VM wanted it (/proc/stat, all CPUs, in seconds); on
# a shared host it is the part of a wall time that no change here can remove
steal() { awk '/^cpu /{print $9}' /proc/stat; }
t() {
  local label=$1 out=$2; shift 2
  local s0; s0=$(steal)
  /usr/bin/time -f "$label: %e s wall, %U s user, %S s sys, %M KiB peak; load $(cut -d' ' -f1 /proc/loadavg)" -o "$out.time" "$@" --json >"$out"
  echo "$(cat "$out.time"); steal $(awk -v a="$s0" -v b="$(steal)" -v hz="$(getconf CLK_TCK)" 'BEGIN{printf "%.2f s", (b-a)/hz}')"
  rm -f "$out.time"
}
run() {
  local name=$1 file=$2; shift 2
  t "before $name" "$work/before-$name.json" "$before/rankfreq" fit "$work/$file.txt" "$@" -q
  t "after  $name" "$work/after-$name.json" "$after/rankfreq" fit "$work/$file.txt" "$@" -q
  python3 - "$work/before-$name.json" "$work/after-$name.json" <<'PY'
import json, math, sys
a, b = (json.load(open(p)) for p in sys.argv[1:3])
worst, where = 0.0, ""
def walk(x, y, path):
    global worst, where
    if isinstance(x, dict):
        for k in x:
            if k in ("seconds", "elapsed_seconds", "threads"): continue
            walk(x[k], y.get(k) if isinstance(y, dict) else None, f"{path}.{k}")
    elif isinstance(x, list):
        for i, (u, v) in enumerate(zip(x, y or [])): walk(u, v, f"{path}[{i}]")
    elif isinstance(x, (int, float)) and isinstance(y, (int, float)) and math.isfinite(x) and math.isfinite(y):
        r = abs(x - y) / max(abs(x), 1e-300) if x != y else 0.0
        if r > worst: worst, where = r, path
    elif x != y: print(f"  differs at {path}: {x!r} vs {y!r}")
walk(a, b, "")
print(f"  largest relative difference {worst:.3g} {where}")
PY
}
if [ "$which" != default ]; then
  for f in zipf-1e9 zipf-1e10 zipf-1e11 flat-1e5; do run "point-$f" "$f" --reps 0 --ci-reps 0; done
fi
if [ "$which" != point ]; then
  run default-zipf-1e9 zipf-1e9 --threads 2
  run reduced-zipf-1e10 zipf-1e10 --threads 2 --reps 250 --ci-reps 100
fi
