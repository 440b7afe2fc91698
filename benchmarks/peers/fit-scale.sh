#!/usr/bin/env bash
# Fitting at scale: seeded Zipf-like spectra (rank exponent 1.07) for 10^8 … 10^11 tokens and a flat spectrum of
# 10^5 distinct values, then `rankfreq fit` on each: point fits (--reps 0 --ci-reps 0) and default fits (2,500
# goodness-of-fit + 1,000 interval replicates, 2 threads). Wall and CPU time from /usr/bin/time (the machine is shared:
# the load average is printed beside each figure). Usage: benchmarks/peers/fit-scale.sh [BIN_DIR]
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
bin=${1:-$work/bin}
[ -n "${1:-}" ] || dotnet publish src/RankFreq.Cli -c Release -o "$bin" >/dev/null
gen=(dotnet run -c Release --project benchmarks/RankFreq.Benchmarks --)
for n in 1e8 1e9 1e10 1e11; do [ -f "$work/zipf-$n.txt" ] || "${gen[@]}" zipf-spectrum "$n" "$work/zipf-$n.txt"; done
[ -f "$work/flat-1e5.txt" ] || "${gen[@]}" flat-spectrum 1e5 "$work/flat-1e5.txt"
t() { /usr/bin/time -f "$1: %e s wall, %U s user, %M KiB peak; load $(cut -d' ' -f1 /proc/loadavg)" "${@:2}" >/dev/null; }
for f in zipf-1e8 zipf-1e9 zipf-1e10 zipf-1e11 flat-1e5; do t "point $f" "$bin/rankfreq" fit "$work/$f.txt" --reps 0 --ci-reps 0 -q; done
for f in zipf-1e9 zipf-1e10; do t "default $f" "$bin/rankfreq" fit "$work/$f.txt" --threads 2 -q; done
