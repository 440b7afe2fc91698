#!/usr/bin/env bash
# One part of the bootstrap replicates (RankFreq.Benchmarks -- replicate-loop: gof-draw, gof-search, gof-level,
# ci-draw, ci-search) with two benchmark builds alternating N times; each run does 20 rounds of REPS replicates and
# the smallest round's CPU ms per replicate is kept, which filters some of the other tenants' interference. Each run
# holds /work/bench.lock when that file exists, so that timed runs of several people do not overlap.
# Usage: F=SPECTRUM REPS=60 benchmarks/peers/replicate-parts.sh N PART BEFORE_EXE AFTER_EXE
set -euo pipefail
n=$1; part=$2; b0=$3; b1=$4; F=${F:-benchmarks/work/zipf-1e9.txt}; reps=${REPS:-60}
lock() { if [ -e /work/bench.lock ]; then flock /work/bench.lock "$@"; else "$@"; fi; }
for _ in $(seq "$n"); do
  for b in "$b0" "$b1"; do
    x=$(lock "$b" replicate-loop "$F" "$reps" "$part" 20 | awk '$2 != "0:" {print $4}' | sort -g | head -1)
    echo "$b $part $x ms; load $(cut -d' ' -f1 /proc/loadavg)"
  done
done
