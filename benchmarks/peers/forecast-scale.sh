#!/usr/bin/env bash
# The vocabulary forecast on the spectrum of a 10^9-token sample (the seeded Zipf-like spectrum of fit-scale.sh,
# rank exponent 1.07): `rankfreq forecast zipf-1e9.txt --to 10x --threads 2` (all three models fitted, 100 points,
# 200 bootstrap replicates with intervals for types, hapaxes and coverage), and a profile of the KJV when
# RANKFREQ_CORPORA is set. With a second build folder, the two builds alternate, three rounds each, so their ratio is
# read from one run on the shared machine. Wall and CPU from /usr/bin/time, load average beside each figure.
# Usage: benchmarks/peers/forecast-scale.sh [BIN_DIR [BASE_BIN_DIR]]
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
bin=${1:-$work/bin}
[ -n "${1:-}" ] || dotnet publish src/RankFreq.Cli -c Release -o "$bin" >/dev/null
builds=("$bin"); [ -n "${2:-}" ] && builds+=("$2")
[ -f "$work/zipf-1e9.txt" ] || dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- zipf-spectrum 1e9 "$work/zipf-1e9.txt"
t() { /usr/bin/time -f "$1: %e s wall, %U+%S s CPU, %M KiB peak; load $(cut -d' ' -f1 /proc/loadavg)" "${@:2}" >/dev/null; }
for round in 1 2 3; do
  for b in "${builds[@]}"; do t "forecast zipf-1e9 ($b, round $round)" "$b/rankfreq" forecast "$work/zipf-1e9.txt" --to 10x --threads 2 -q; done
done
if [ -n "${RANKFREQ_CORPORA:-}" ]; then
  for round in 1 2; do
    for b in "${builds[@]}"; do
      rm -rf "$work/profile-kjv"
      t "profile kjv ($b, round $round)" "$b/rankfreq" profile "$RANKFREQ_CORPORA/kjv-bible.txt" -o "$work/profile-kjv" -q
    done
  done
fi
