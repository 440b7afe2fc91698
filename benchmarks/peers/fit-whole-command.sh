#!/usr/bin/env bash
# Times the whole `rankfreq fit --reps 2500 --threads 2` command (process start included) on a synthetic
# spectrum of 10^6 types (α = 2, xmin = 1), then one spectrum-level vs one per-type replicate (BenchmarkDotNet).
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
dotnet publish src/RankFreq.Cli -c Release -o "$work/bin" >/dev/null
dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- tools make-spectrum "$work/spectrum-1e6.txt"
for r in 1 2 3; do
  /usr/bin/time -f "fit --reps 2500 --threads 2: %e s wall, %M KiB peak" \
    "$work/bin/rankfreq" fit "$work/spectrum-1e6.txt" --reps 2500 --threads 2 -q
done
/usr/bin/time -f "fit --reps 2500 --ci-reps 0 --threads 2: %e s wall" "$work/bin/rankfreq" fit "$work/spectrum-1e6.txt" --reps 2500 --ci-reps 0 --threads 2 -q
dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- --filter '*ReplicateCost*' > "$work/replicate.log"
grep -m1 '^// data' "$work/replicate.log"; grep '^|' "$work/replicate.log"
